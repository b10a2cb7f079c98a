import { describe, it, expect, afterEach } from 'vitest';
import { render, screen, cleanup, fireEvent } from '@testing-library/react';
import type { UseQueryResult } from '@tanstack/react-query';
import { QueryState } from '@/components/ui/states';
import { ApiRequestError } from '@/lib/api-client';

afterEach(cleanup);

const q = (over: Partial<UseQueryResult<string[]>>) => ({ isPending: false, isError: false, data: undefined, error: null, refetch: () => {}, ...over }) as unknown as UseQueryResult<string[]>;

describe('QueryState', () => {
  it('shows a loading status while pending', () => {
    render(<QueryState query={q({ isPending: true })} loadingLabel="Loading probes…">{() => 'data'}</QueryState>);
    expect(screen.getByRole('status').textContent).toContain('Loading probes…');
  });

  it('shows the server message and a retry button on error, and retries on click', () => {
    let retried = 0;
    render(<QueryState query={q({ isError: true, error: new ApiRequestError(500, 'internal', 'The database is busy'), refetch: (() => { retried++; }) as never })}>{() => 'data'}</QueryState>);
    expect(screen.getByRole('alert').textContent).toContain('The database is busy');
    fireEvent.click(screen.getByRole('button', { name: /Try again/ }));
    expect(retried).toBe(1);
  });

  it('offers no retry for a 404, and titles it "Not found"', () => {
    render(<QueryState query={q({ isError: true, error: new ApiRequestError(404, 'not_found', 'Survey was not found') })}>{() => 'data'}</QueryState>);
    expect(screen.getByRole('alert').textContent).toContain('Not found');
    expect(screen.queryByRole('button')).toBeNull();
  });

  it('shows the empty state when the data is empty, else the children', () => {
    const { rerender } = render(<QueryState query={q({ data: [] })} isEmpty={(d) => d.length === 0} empty={<p>No probes yet</p>}>{(d) => d.join(',')}</QueryState>);
    expect(screen.getByText('No probes yet')).toBeTruthy();
    rerender(<QueryState query={q({ data: ['LX-1', 'LX-2'] })} isEmpty={(d) => d.length === 0}>{(d) => d.join(',')}</QueryState>);
    expect(screen.getByText('LX-1,LX-2')).toBeTruthy();
  });
});

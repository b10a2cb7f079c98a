import { describe, it, expect, beforeEach } from 'vitest';
import { render, screen, fireEvent, cleanup } from '@testing-library/react';
import { afterEach } from 'vitest';
import { UnitsProvider, useUnits, formatNumber } from '@/lib/units';
import { UnitsToggle } from '@/components/ui/units-toggle';

function Reading({ lux, bound }: { lux: number; bound?: 'exact' | 'lower' | 'upper' }) {
  const { format } = useUnits();
  return <output data-testid="value">{format(lux, { bound })}</output>;
}

beforeEach(() => localStorage.clear());
afterEach(cleanup);

describe('lux / foot-candle switch', () => {
  it('shows lux by default and foot-candles after switching, converting at 1 fc = 10.7639104167 lx', () => {
    // 1 fc = 1/0.3048^2 lx exactly (definition of the international foot).
    render(<UnitsProvider><UnitsToggle /><Reading lux={538.195520835} /></UnitsProvider>);
    expect(screen.getByTestId('value').textContent).toBe('538 lx');
    fireEvent.click(screen.getByRole('radio', { name: 'foot-candles' }));
    expect(screen.getByTestId('value').textContent).toBe('50.0 fc');
    expect(screen.getByRole('radio', { name: 'foot-candles' }).getAttribute('aria-checked')).toBe('true');
  });

  it('remembers the chosen unit for the next visit', () => {
    const first = render(<UnitsProvider><UnitsToggle /><Reading lux={100} /></UnitsProvider>);
    fireEvent.click(screen.getByRole('radio', { name: 'foot-candles' }));
    first.unmount();
    render(<UnitsProvider><Reading lux={107.639104167} /></UnitsProvider>);
    expect(screen.getByTestId('value').textContent).toBe('10.0 fc');
  });

  it('marks bounded readings with ≥ and ≤', () => {
    render(<UnitsProvider><Reading lux={130000} bound="lower" /><Reading lux={0.5} bound="upper" /></UnitsProvider>);
    const values = screen.getAllByTestId('value').map((e) => e.textContent);
    expect(values).toEqual(['≥ 130,000 lx', '≤ 0.500 lx']);
  });

  it('formats with about three significant figures and never NaN', () => {
    expect(formatNumber(1234.5)).toBe('1,235');
    expect(formatNumber(12.345)).toBe('12.3');
    expect(formatNumber(1.2345)).toBe('1.23');
    expect(formatNumber(Number.NaN)).toBe('–');
  });
});

import { describe, it, expect, afterEach } from 'vitest';
import { render, screen, cleanup, within } from '@testing-library/react';
import type { ZoneDetailResponse, ZonePoint } from '@shared/schemas/compliance';
import { UnitsProvider } from '@/lib/units';
import { ZonePointsTable } from '@/features/compliance/components/zone-detail';

afterEach(cleanup);

const point = (id: number, extra: Partial<ZonePoint> = {}): ZonePoint => ({
  readingId: id, point: `R-${id}`, xM: 1.5, yM: 2.25, timestamp: '2026-11-20T09:00:00.000Z', lux: 320, uLux: 18, luxBound: 'exact', flag: 'ok', inWallBand: false, ...extra,
});
const detail = (points: ZonePoint[]) => ({ points } as unknown as ZoneDetailResponse);

describe('zone points table', () => {
  it('shows each paired point\'s daylight factor, and a dash where a point could not be paired', () => {
    render(<UnitsProvider><ZonePointsTable detail={detail([point(1, { dfPercent: 2.3456 }), point(2, { inWallBand: true })])} /></UnitsProvider>);
    expect(screen.getByRole('columnheader', { name: 'DF' })).toBeTruthy();
    const rows = screen.getAllByRole('row').slice(1);
    expect(within(rows[0]).getByText('2.3 %')).toBeTruthy();
    expect(within(rows[1]).getAllByText('–').length).toBeGreaterThan(0);
    expect(within(rows[1]).getByText('wall band')).toBeTruthy();
  });

  it('has no daylight factor column when no point has one (no outdoor reference, or daylight excluded)', () => {
    render(<UnitsProvider><ZonePointsTable detail={detail([point(1), point(2)])} /></UnitsProvider>);
    expect(screen.queryByRole('columnheader', { name: 'DF' })).toBeNull();
    expect(screen.getAllByRole('columnheader').map((h) => h.textContent)).toEqual(['Point', 'x, y (m)', 'E ± U', 'Flag', 'Used']);
  });
});

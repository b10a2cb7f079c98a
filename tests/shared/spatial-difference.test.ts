import { describe, it, expect } from 'vitest';
import { diffByLabel, type DiffInput } from '@shared/spatial/difference';

const r = (point: string, lux: number | null, o: Partial<DiffInput> = {}): DiffInput => ({ point, xM: 1, yM: 1, role: 'task', lux, luxBound: 'exact', ...o });

describe('diffByLabel', () => {
  it('diffByLabel, for points measured in both surveys, gives the lux change and its ratio to the earlier value', () => {
    const d = diffByLabel([r('A1', 500), r('A2', 400)], [r('A1', 450), r('A2', 500)]);
    expect(d.points.map((p) => [p.point, p.deltaLux, p.deltaRel])).toEqual([['A1', -50, -0.1], ['A2', 100, 0.25]]);
  });

  it('diffByLabel, for labels measured in only one survey, lists them apart', () => {
    const d = diffByLabel([r('A1', 500), r('OLD', 1)], [r('A1', 500), r('NEW', 2)]);
    expect(d.onlyBefore).toEqual(['OLD']);
    expect(d.onlyAfter).toEqual(['NEW']);
    expect(d.points).toHaveLength(1);
  });

  it('diffByLabel, when either side is over range or a fault, gives no difference for that point', () => {
    const d = diffByLabel([r('A1', 60000, { luxBound: 'lower' }), r('A2', null)], [r('A1', 500), r('A2', 500)]);
    expect(d.points.map((p) => p.deltaLux)).toEqual([null, null]);
  });

  it('diffByLabel, for reference points, leaves them out', () => {
    expect(diffByLabel([r('REF', 9000, { role: 'reference' })], [r('REF', 12000, { role: 'reference' })]).points).toEqual([]);
  });

  it('diffByLabel, when a label stands 2 m from where it stood before, marks it moved', () => {
    expect(diffByLabel([r('A1', 300)], [r('A1', 300, { xM: 3 })]).points[0].moved).toBe(true);
  });
});

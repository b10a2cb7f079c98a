/** What the difference map needs of a reading (a subset of the survey map's reading). */
export type DiffInput = { point: string; xM: number; yM: number; role: 'task' | 'reference'; lux: number | null; luxBound: 'exact' | 'lower' | 'upper' };

export type PointDifference = {
  point: string;
  /** Position in the later survey. */
  xM: number;
  yM: number;
  beforeLux: number | null;
  afterLux: number | null;
  /** after - before, lux; null when either side is a fault or only a bound. */
  deltaLux: number | null;
  /** delta / before; null when delta is null or before is 0. */
  deltaRel: number | null;
  /** The same label stands more than 0.5 m from where it stood before. */
  moved: boolean;
};

export type SurveyDifference = {
  points: PointDifference[];
  /** Labels measured only in the earlier / later survey. */
  onlyBefore: string[];
  onlyAfter: string[];
};

const MOVED_M = 0.5;

/**
 * Lux change per point between two surveys of the same plan, matched by point label.
 * Task points only; a label measured twice in one survey enters with its last reading.
 * A bound (over/under range) or a fault on either side gives no difference: the point is
 * listed with its values and deltaLux null, so the map can show it as not comparable.
 */
export function diffByLabel(before: readonly DiffInput[], after: readonly DiffInput[]): SurveyDifference {
  const index = (rs: readonly DiffInput[]) => new Map(rs.filter((r) => r.role === 'task').map((r) => [r.point, r]));
  const b = index(before);
  const a = index(after);
  const points: PointDifference[] = [];
  for (const [label, ra] of a) {
    const rb = b.get(label);
    if (!rb) continue;
    const comparable = ra.lux !== null && rb.lux !== null && ra.luxBound === 'exact' && rb.luxBound === 'exact';
    const deltaLux = comparable ? (ra.lux as number) - (rb.lux as number) : null;
    points.push({
      point: label, xM: ra.xM, yM: ra.yM, beforeLux: rb.lux, afterLux: ra.lux, deltaLux,
      deltaRel: deltaLux !== null && rb.lux ? deltaLux / rb.lux : null,
      moved: Math.hypot(ra.xM - rb.xM, ra.yM - rb.yM) > MOVED_M,
    });
  }
  return {
    points,
    onlyBefore: [...b.keys()].filter((k) => !a.has(k)),
    onlyAfter: [...a.keys()].filter((k) => !b.has(k)),
  };
}

/**
 * Readings on planes other than the horizontal working plane, and the relations EN 12464-1:2021
 * sets between a task area and the areas around it. Values are from secondary sources or memory,
 * marked where they are defined.
 */

/** Where a reading's sensor faced: today's horizontal working plane, a vertical plane with an azimuth, a wall or a ceiling. */
export const READING_PLANES = ['horizontal', 'vertical', 'wall', 'ceiling'] as const;
export type ReadingPlane = (typeof READING_PLANES)[number];

/**
 * Cylindrical illuminance Ez at a point: the mean illuminance over the curved surface of a small
 * vertical cylinder. Approximated by the mean of vertical illuminances in four directions 90° apart
 * (EN 12464-1:2021 and SLL/CIBSE practice as summarised in secondary sources; DOMAIN.md section 10).
 * It is exact in a uniformly diffuse field; for a single point source it lies between 0.785 and 1.11
 * times the true value (pi/4 and pi/(2*sqrt 2)), depending on the source's azimuth (derived in tests).
 */
export const CYLINDRICAL_METHOD = 'Ez taken as the mean of four vertical illuminances 90° apart (EN 12464-1:2021 practice, secondary sources)';

export type VerticalReading = { azimuthDeg: number; lux: number };

export type CylindricalResult =
  | { ok: true; ezLux: number; azimuthsDeg: number[] }
  | { ok: false; reason: string };

/** Tolerance on the 90° spacing of the four directions, degrees (our own choice: a hand-turned meter). */
export const AZIMUTH_TOLERANCE_DEG = 10;

const norm360 = (d: number) => ((d % 360) + 360) % 360;

/**
 * Ez from four vertical readings at one point, their azimuths about 90° apart (any starting direction).
 * Refuses (with the reason) a set that is not four readings or not spread evenly.
 */
export function cylindricalFromVertical(readings: readonly VerticalReading[], toleranceDeg = AZIMUTH_TOLERANCE_DEG): CylindricalResult {
  if (readings.length !== 4) return { ok: false, reason: `Cylindrical illuminance needs four vertical readings 90° apart; this point has ${readings.length}.` };
  const az = readings.map((r) => norm360(r.azimuthDeg)).sort((a, b) => a - b);
  for (let i = 0; i < 4; i++) {
    const gap = i < 3 ? az[i + 1] - az[i] : az[0] + 360 - az[3];
    if (Math.abs(gap - 90) > toleranceDeg) {
      return { ok: false, reason: `The four vertical readings must face directions 90° apart (±${toleranceDeg}°); azimuths ${az.map((a) => a.toFixed(0)).join(', ')}°.` };
    }
  }
  if (readings.some((r) => !(r.lux >= 0))) return { ok: false, reason: 'A vertical reading has no value.' };
  return { ok: true, ezLux: readings.reduce((s, r) => s + r.lux, 0) / 4, azimuthsDeg: az };
}

/** Modelling: Ez / Eh. 0.30 to 0.60 was the 2011 edition's recommendation (secondary source). */
export const MODELLING_RANGE = { min: 0.3, max: 0.6, source: 'EN 12464-1:2011, 4.6.2 modelling (secondary source)' } as const;

export function modellingRatio(ezLux: number, ehLux: number): number | null {
  return ehLux > 0 ? ezLux / ehLux : null;
}

/** U0 asked of wall and ceiling illuminances and of the background area (EN 12464-1:2021, secondary). */
export const SURFACE_U0_MIN = 0.1;

/** Widths of the derived bands (EN 12464-1:2021, secondary): immediate surrounding at least 0.5 m, background at least 3 m. */
export const SURROUNDING_BAND_M = 0.5;
export const BACKGROUND_BAND_M = 3;

/**
 * Immediate surrounding area's maintained illuminance from the task's (EN 12464-1:2011 Table 1 as
 * quoted in secondary sources; the 2021 edition keeps the relation, from memory): task ≥ 750 lx → 500 lx,
 * 500 → 300, 300 → 200, ≤ 200 → the task's value. Values between rows take the row below.
 */
export const SURROUNDING_RELATION_SOURCE = 'EN 12464-1:2011 Table 1 (secondary source; kept in 2021 from memory)';
export const SURROUNDING_U0_MIN = 0.4;

export function surroundingEmFor(taskEmLux: number): number {
  if (taskEmLux >= 750) return 500;
  if (taskEmLux >= 500) return 300;
  if (taskEmLux >= 300) return 200;
  return taskEmLux;
}

/** Background area: at least a third of the immediate surrounding's value, U0 ≥ 0.10 (EN 12464-1:2021, secondary). */
export const BACKGROUND_RELATION_SOURCE = 'EN 12464-1:2021, background area (secondary source)';

export function backgroundEmFor(surroundingEmLux: number): number {
  return surroundingEmLux / 3;
}

import { luxToFootcandles } from './core/units';

/**
 * The one vocabulary of Luxtrail's CSV exports: every readings file (the survey's and the
 * verdicts') and the zone table name the same thing the same way. Numbers are written at full
 * precision (JavaScript's shortest text that reads back as the same double), every value that is
 * only a bound says so in its own column, and every illuminance column names its unit.
 */
export type ExportUnit = 'lx' | 'fc';

/** A reading as exported: the value, its bound and uncertainty, and the raw evidence behind it. */
export type ExportReading = {
  id: number;
  timeMs: number;
  point: string;
  planName: string | null;
  xM: number | null;
  yM: number | null;
  role: 'task' | 'reference';
  probe: string;
  probeKind: 'counts' | 'current_4_20' | 'voltage_0_10' | 'manual';
  lux: number | null;
  uLux: number | null;
  luxBound: 'exact' | 'lower' | 'upper';
  flag: string;
  gainCode: number | null;
  rawCounts: number | null;
  rawSignal: number | null;
  intMs: number | null;
  tempC: number | null;
  coefficientSetId: number | null;
  coefficientSetVersion: number | null;
  samples: number;
  chosenSample: number | null;
  note: string | null;
  /** Where the sensor faced (horizontal, vertical, wall, ceiling); azimuth in degrees for vertical and wall readings. */
  plane: string;
  azimuthDeg: number | null;
};

/** Where the verdicts placed a reading (the verdicts' readings file only). */
export type ExportPlacement = { zone: string | null; inWallBand: boolean | null };

const illuminance = (unit: ExportUnit, lux: number | null) => (lux === null ? null : unit === 'fc' ? luxToFootcandles(lux) : lux);

/** The readings columns; `withZone` adds the zone and wall-band mark the verdicts used. */
export function readingColumns(unit: ExportUnit, withZone = false): string[] {
  return [
    'reading_id', 'timestamp_utc', 'point', 'plan', 'x_m', 'y_m', ...(withZone ? ['zone', 'in_wall_band'] : []), 'role', 'probe',
    `illuminance_${unit}`, 'illuminance_bound', `expanded_uncertainty_${unit}_k2`, 'flag',
    'gain_code', 'counts', 'current_ma', 'voltage_v', 'int_ms', 'temp_c', 'coefficient_set_id', 'coefficient_set_version', 'samples', 'chosen_sample', 'note', 'plane', 'azimuth_deg',
  ];
}

/** One reading's cells in readingColumns' order (text is neutralised by the CSV writer). */
export function readingCells(r: ExportReading, unit: ExportUnit, placement?: ExportPlacement): unknown[] {
  return [
    r.id, new Date(r.timeMs).toISOString(), r.point, r.planName, r.xM, r.yM,
    ...(placement ? [placement.zone, placement.inWallBand === null ? null : placement.inWallBand ? 'yes' : 'no'] : []), r.role, r.probe,
    illuminance(unit, r.lux), r.lux === null ? null : r.luxBound, illuminance(unit, r.uLux), r.flag,
    r.gainCode, r.rawCounts, r.probeKind === 'current_4_20' ? r.rawSignal : null, r.probeKind === 'voltage_0_10' ? r.rawSignal : null, r.intMs, r.tempC, r.coefficientSetId, r.coefficientSetVersion, r.samples, r.chosenSample, r.note, r.plane, r.azimuthDeg,
  ];
}

/** A zone statistic's bound as exported: 'exact' for a value, else lower / upper / indeterminate. */
export const statBoundCell = (value: number | null, bound: 'lower' | 'upper' | 'indeterminate' | null) => (bound ?? (value === null ? null : 'exact'));

/** The zone table's columns (illuminances in lux, as the targets are stored): one row per zone's task plane, then one per further check. */
export const ZONE_COLUMNS = [
  'zone', 'check', 'plan', 'kind', 'use_type', 'use', 'target', 'target_source', 'target_confidence', 'required_em_lx', 'modified_em_lx', 'em_lx', 'design_basis',
  'installation', 'maintenance_factor', 'limit_lx', 'u0_min', 'points', 'required_points', 'grid_rule', 'wall_band_points',
  'eavg_lx', 'eavg_bound', 'u_eavg_lx_k2', 'emin_lx', 'emin_bound', 'emax_lx', 'u0', 'u0_bound', 'modelling_ez_over_eh', 'df_avg_percent',
  'verdict', 'delta_eavg_lx', 'previous_verdict', 'decision_rule', 'reasons',
] as const;

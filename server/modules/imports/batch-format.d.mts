import type { LogSample, DecodedReading } from './log-decoder';

export const SAMPLE_SLOTS: readonly string[];
export const PLANE_SAMPLE_SLOTS: readonly string[];
export const SAMPLE_ENCODING: 'f64p';
export const READING_SLOTS: readonly string[];
export const SAMPLE_WIDTH: 15;
export const PLANE_SAMPLE_WIDTH: 17;
export const READING_WIDTH: 27;
export const PLANES: readonly ['horizontal', 'vertical', 'wall', 'ceiling'];
export const ROLES: readonly ['task', 'reference'];
export const LUX_BOUNDS: readonly ['exact', 'lower', 'upper'];
export const FLAGS: readonly ['ok', 'over_range', 'under_range', 'fault', 'calibration_lapsed', 'low_confidence'];

/** One batch of accepted rows as it travels between threads (see batch-format.mjs). */
export type Batch = {
  sampleRows: number;
  readingRows: number;
  samples: Float64Array;
  readings: Float64Array;
  strings: string[];
};

export type BatchBuilder = {
  readonly sampleRows: number;
  readonly readingRows: number;
  addSample(s: LogSample, probeId: number): void;
  addReading(r: DecodedReading): void;
  take(): Batch;
  clear(): void;
};

/** A kept sample as stored: the probe by id, nulls where the log gave nothing. */
export type StoredSample = {
  line: number; timeMs: number; probeId: number; point: string;
  gainCode: number | null; counts: number | null; ma: number | null; volts: number | null;
  intMs: number | null; tempC: number | null; xM: number | null; yM: number | null;
  planId: number | null; role: 'task' | 'reference'; note: string | null;
  plane: 'horizontal' | 'vertical' | 'wall' | 'ceiling'; azimuthDeg: number | null;
};

export function createBatchBuilder(capacityRows?: number): BatchBuilder;
export function transferOf(batch: Batch): ArrayBuffer[];
export function fillReadingValues(batch: Batch, from: number, to: number, out: unknown[]): number;
export function unpackF64Block(data: Uint8Array, strings: readonly string[], rowCount: number, encoding?: 'f64' | 'f64p'): StoredSample[];

// How an import's accepted rows travel from the parse worker to the writer and how its samples are
// kept: numbers in Float64Arrays, one row after another (NaN for "none"; the parser never accepts
// NaN), text as indices into the batch's table of distinct strings. The arrays are transferred,
// not copied, between threads, and a batch's sample array is stored as it is (a sample block),
// so neither thread spends time cloning or re-encoding millions of values.
// Bundled into the writer thread with what it imports (import-runner.ts), as the parse worker is.
import { LUX_BOUNDS, READING_FLAGS, READING_ROLES } from '@shared/core/types';
import { READING_PLANES } from '@shared/core/planes';
import type { SampleEncoding } from '@shared/schemas/imports';
import { BUDGET_PARTS, encodeBudgetSlots } from '../readings/stored-budget';
import type { LogSample, DecodedReading } from './log-decoder';

/** A sample's slots in a stored block of encoding 'f64' (and 'json'): blocks written before readings had planes. */
export const SAMPLE_SLOTS = ['line', 'timeMs', 'probeId', 'point', 'gainCode', 'counts', 'ma', 'volts', 'intMs', 'tempC', 'xM', 'yM', 'planId', 'role', 'note'];
/** A sample's slots in a batch's samples array and in a stored block of encoding 'f64p' (what imports write now): plane and azimuth added. */
export const PLANE_SAMPLE_SLOTS = [...SAMPLE_SLOTS, 'plane', 'azimuthDeg'];
/** The encoding a builder's sample arrays are stored under. */
export const SAMPLE_ENCODING: SampleEncoding = 'f64p';
/** A reading's slots in a batch's readings array: its budget, one uRel per BUDGET_PARTS entry, then plane and azimuth, then the raw evidence behind it. */
export const READING_SLOTS = ['point', 'xM', 'yM', 'planId', 'role', 'timeMs', 'probeId', 'lux', 'uLux', 'luxBound', 'flag', 'gainCode', 'samples', 'chosenSample', 'coefficientSetId', 'note',
  ...BUDGET_PARTS.map((name) => `budget.${name}`), 'plane', 'azimuthDeg', 'rawCounts', 'rawSignal', 'intMs', 'tempC'];
const BUDGET_SLOT = READING_SLOTS.indexOf(`budget.${BUDGET_PARTS[0]}`);
const READING_PLANE_SLOT = READING_SLOTS.indexOf('plane');
const READING_RAW_SLOT = READING_SLOTS.indexOf('rawCounts');
export const SAMPLE_WIDTH = SAMPLE_SLOTS.length;
export const PLANE_SAMPLE_WIDTH = PLANE_SAMPLE_SLOTS.length;
export const READING_WIDTH = READING_SLOTS.length;

/**
 * The enumerations travel and are stored as their index in the shared lists (READING_ROLES,
 * LUX_BOUNDS, READING_FLAGS, READING_PLANES): those lists are append only, stored blocks keep them.
 */
const ROLES = READING_ROLES;
const FLAGS = READING_FLAGS;
const PLANES = READING_PLANES;

const codeOf = <T extends string>(list: readonly T[], value: T, what: string): number => {
  const i = list.indexOf(value);
  if (i < 0) throw new Error(`batch: unknown ${what} "${value}"`);
  return i;
};

const orNaN = (v: number | null | undefined): number => (v === null || v === undefined ? NaN : v);

/** One batch of accepted rows as it travels between threads. */
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
  planId: number | null; role: (typeof READING_ROLES)[number]; note: string | null;
  plane: (typeof READING_PLANES)[number]; azimuthDeg: number | null;
};

/** Collects one batch; take() hands it over (its arrays are then the receiver's) and starts the next. */
export function createBatchBuilder(capacityRows = 2048): BatchBuilder {
  let samples = new Float64Array(capacityRows * PLANE_SAMPLE_WIDTH);
  let readings = new Float64Array(capacityRows * READING_WIDTH);
  let sampleRows = 0;
  let readingRows = 0;
  let strings: string[] = [];
  let indexOfString = new Map<string, number>();

  const stringIndex = (s: string | null | undefined): number => {
    if (s === null || s === undefined) return NaN;
    let i = indexOfString.get(s);
    if (i === undefined) {
      i = strings.length;
      strings.push(s);
      indexOfString.set(s, i);
    }
    return i;
  };
  const grow = (arr: Float64Array<ArrayBuffer>, needed: number): Float64Array<ArrayBuffer> => {
    if (needed <= arr.length) return arr;
    const next = new Float64Array(Math.max(needed, arr.length * 2));
    next.set(arr);
    return next;
  };

  return {
    get sampleRows() { return sampleRows; },
    get readingRows() { return readingRows; },
    /** s: the sample as LogSample, with the probe by id. */
    addSample(s: LogSample, probeId: number) {
      samples = grow(samples, (sampleRows + 1) * PLANE_SAMPLE_WIDTH);
      let o = sampleRows * PLANE_SAMPLE_WIDTH;
      samples[o++] = s.line;
      samples[o++] = s.timeMs;
      samples[o++] = probeId;
      samples[o++] = stringIndex(s.point);
      samples[o++] = orNaN(s.gainCode);
      samples[o++] = orNaN(s.counts);
      samples[o++] = orNaN(s.ma);
      samples[o++] = orNaN(s.volts);
      samples[o++] = orNaN(s.intMs);
      samples[o++] = orNaN(s.tempC);
      samples[o++] = orNaN(s.xM);
      samples[o++] = orNaN(s.yM);
      samples[o++] = orNaN(s.planId);
      samples[o++] = codeOf(ROLES, s.role, 'role');
      samples[o++] = stringIndex(s.note);
      samples[o++] = codeOf(PLANES, s.plane ?? 'horizontal', 'plane');
      samples[o] = orNaN(s.azimuthDeg);
      sampleRows++;
    },
    /** r: a DecodedReading. */
    addReading(r: DecodedReading) {
      readings = grow(readings, (readingRows + 1) * READING_WIDTH);
      let o = readingRows * READING_WIDTH;
      readings[o++] = stringIndex(r.point);
      readings[o++] = orNaN(r.xM);
      readings[o++] = orNaN(r.yM);
      readings[o++] = orNaN(r.planId);
      readings[o++] = codeOf(ROLES, r.role, 'role');
      readings[o++] = r.timeMs;
      readings[o++] = r.probeId;
      readings[o++] = orNaN(r.lux);
      readings[o++] = orNaN(r.uLux);
      readings[o++] = codeOf(LUX_BOUNDS, r.luxBound, 'bound');
      readings[o++] = codeOf(FLAGS, r.flag, 'flag');
      readings[o++] = orNaN(r.gainCode);
      readings[o++] = r.samples;
      readings[o++] = orNaN(r.chosenSample);
      readings[o++] = orNaN(r.coefficientSetId);
      readings[o] = stringIndex(r.note);
      readings.fill(NaN, o + 1, o + 1 + BUDGET_PARTS.length);
      for (const part of r.budget) readings[o + 1 + codeOf(BUDGET_PARTS, part.name, 'budget part')] = part.uRel;
      const base = readingRows * READING_WIDTH;
      readings[base + READING_PLANE_SLOT] = codeOf(PLANES, r.plane ?? 'horizontal', 'plane');
      readings[base + READING_PLANE_SLOT + 1] = orNaN(r.azimuthDeg);
      readings[base + READING_RAW_SLOT] = orNaN(r.rawCounts);
      readings[base + READING_RAW_SLOT + 1] = orNaN(r.rawSignal);
      readings[base + READING_RAW_SLOT + 2] = orNaN(r.intMs);
      readings[base + READING_RAW_SLOT + 3] = orNaN(r.tempC);
      readingRows++;
    },
    /** The batch so far, its arrays trimmed to length (transferOf gives the transfer list); the builder starts empty. */
    take() {
      const batch: Batch = {
        sampleRows, readingRows,
        samples: samples.slice(0, sampleRows * PLANE_SAMPLE_WIDTH),
        readings: readings.slice(0, readingRows * READING_WIDTH),
        strings,
      };
      sampleRows = 0;
      readingRows = 0;
      strings = [];
      indexOfString = new Map();
      return batch;
    },
    /** Drops what was collected (a file with errors is not written). */
    clear() {
      sampleRows = 0;
      readingRows = 0;
      strings = [];
      indexOfString = new Map();
    },
  };
}

/** The ArrayBuffers of a batch, for postMessage's transfer list. */
export const transferOf = (batch: Batch): ArrayBuffer[] => [batch.samples.buffer as ArrayBuffer, batch.readings.buffer as ArrayBuffer];

const valueOrNull = (x: number): number | null => (x === x ? x : null);

/**
 * Writes readings from..to-1 of a batch into out as SQL values in the readings insert's order
 * (READING_SLOTS, the budget slots made its stored text, before the note); returns the number of values written.
 */
export function fillReadingValues(batch: Batch, from: number, to: number, out: unknown[]): number {
  const { readings, strings } = batch;
  let k = 0;
  for (let r = from; r < to; r++) {
    const o = r * READING_WIDTH;
    out[k++] = strings[readings[o]];
    out[k++] = valueOrNull(readings[o + 1]);
    out[k++] = valueOrNull(readings[o + 2]);
    out[k++] = valueOrNull(readings[o + 3]);
    out[k++] = ROLES[readings[o + 4]];
    out[k++] = readings[o + 5];
    out[k++] = readings[o + 6];
    out[k++] = valueOrNull(readings[o + 7]);
    out[k++] = valueOrNull(readings[o + 8]);
    out[k++] = LUX_BOUNDS[readings[o + 9]];
    out[k++] = FLAGS[readings[o + 10]];
    out[k++] = valueOrNull(readings[o + 11]);
    out[k++] = readings[o + 12];
    out[k++] = valueOrNull(readings[o + 13]);
    out[k++] = valueOrNull(readings[o + 14]);
    out[k++] = encodeBudgetSlots(readings, o + BUDGET_SLOT);
    const note = readings[o + 15];
    out[k++] = note === note ? strings[note] : null;
    out[k++] = PLANES[readings[o + READING_PLANE_SLOT]];
    out[k++] = valueOrNull(readings[o + READING_PLANE_SLOT + 1]);
    out[k++] = valueOrNull(readings[o + READING_RAW_SLOT]);
    out[k++] = valueOrNull(readings[o + READING_RAW_SLOT + 1]);
    out[k++] = valueOrNull(readings[o + READING_RAW_SLOT + 2]);
    out[k++] = valueOrNull(readings[o + READING_RAW_SLOT + 3]);
  }
  return k;
}

/**
 * A stored block's samples (the batch's samples array as bytes, and its strings) back as values.
 * encoding 'f64p' holds plane and azimuth; 'f64' blocks (written before) are horizontal readings.
 */
export function unpackF64Block(data: Uint8Array, strings: readonly string[], rowCount: number, encoding: Exclude<SampleEncoding, 'json'> = 'f64'): StoredSample[] {
  const width = encoding === 'f64p' ? PLANE_SAMPLE_WIDTH : SAMPLE_WIDTH;
  if (data.byteLength !== rowCount * width * 8) throw new Error(`holds ${data.byteLength} bytes, not ${rowCount} samples of ${width} numbers`);
  // A copy: a Buffer from SQLite need not be 8-byte aligned.
  const f = new Float64Array(new Uint8Array(data).buffer);
  const out = new Array<StoredSample>(rowCount);
  for (let r = 0, o = 0; r < rowCount; r++, o += width) {
    const note = f[o + 14];
    out[r] = {
      line: f[o], timeMs: f[o + 1], probeId: f[o + 2], point: strings[f[o + 3]],
      gainCode: valueOrNull(f[o + 4]), counts: valueOrNull(f[o + 5]), ma: valueOrNull(f[o + 6]), volts: valueOrNull(f[o + 7]),
      intMs: valueOrNull(f[o + 8]), tempC: valueOrNull(f[o + 9]), xM: valueOrNull(f[o + 10]), yM: valueOrNull(f[o + 11]),
      planId: valueOrNull(f[o + 12]), role: ROLES[f[o + 13]], note: note === note ? strings[note] : null,
      plane: width === PLANE_SAMPLE_WIDTH ? PLANES[f[o + 15]] : 'horizontal', azimuthDeg: width === PLANE_SAMPLE_WIDTH ? valueOrNull(f[o + 16]) : null,
    };
    if (out[r].point === undefined || out[r].role === undefined || out[r].plane === undefined) throw new Error(`gives sample ${r} a text, role or plane it does not hold`);
  }
  return out;
}

// How an import's accepted rows travel from the parse worker to the writer and how its samples are
// kept: numbers in Float64Arrays, one row after another (NaN for "none"; the parser never accepts
// NaN), text as indices into the batch's table of distinct strings. The arrays are transferred,
// not copied, between threads, and a batch's sample array is stored as it is (a sample block),
// so neither thread spends time cloning or re-encoding millions of values.
// Plain JavaScript for the writer thread (no TypeScript loader there); types in batch-format.d.mts.
import { BUDGET_PARTS, encodeBudgetSlots } from '../readings/stored-budget.mjs';

/** A sample's slots in a stored block of encoding 'f64' (and 'json'): blocks written before readings had planes. */
export const SAMPLE_SLOTS = ['line', 'timeMs', 'probeId', 'point', 'gainCode', 'counts', 'ma', 'volts', 'intMs', 'tempC', 'xM', 'yM', 'planId', 'role', 'note'];
/** A sample's slots in a batch's samples array and in a stored block of encoding 'f64p' (what imports write now): plane and azimuth added. */
export const PLANE_SAMPLE_SLOTS = [...SAMPLE_SLOTS, 'plane', 'azimuthDeg'];
/** The encoding a builder's sample arrays are stored under. */
export const SAMPLE_ENCODING = 'f64p';
/** A reading's slots in a batch's readings array: its budget, one uRel per BUDGET_PARTS entry, then plane and azimuth, then the raw evidence behind it. */
export const READING_SLOTS = ['point', 'xM', 'yM', 'planId', 'role', 'timeMs', 'probeId', 'lux', 'uLux', 'luxBound', 'flag', 'gainCode', 'samples', 'chosenSample', 'coefficientSetId', 'note',
  ...BUDGET_PARTS.map((name) => `budget.${name}`), 'plane', 'azimuthDeg', 'rawCounts', 'rawSignal', 'intMs', 'tempC'];
const BUDGET_SLOT = READING_SLOTS.indexOf(`budget.${BUDGET_PARTS[0]}`);
const READING_PLANE_SLOT = READING_SLOTS.indexOf('plane');
const READING_RAW_SLOT = READING_SLOTS.indexOf('rawCounts');
export const SAMPLE_WIDTH = SAMPLE_SLOTS.length;
export const PLANE_SAMPLE_WIDTH = PLANE_SAMPLE_SLOTS.length;
export const READING_WIDTH = READING_SLOTS.length;

/** Stored codes of the enumerations (their index); append only, stored blocks keep them. */
export const ROLES = ['task', 'reference'];
export const LUX_BOUNDS = ['exact', 'lower', 'upper'];
export const FLAGS = ['ok', 'over_range', 'under_range', 'fault', 'calibration_lapsed', 'low_confidence'];
export const PLANES = ['horizontal', 'vertical', 'wall', 'ceiling'];

const codeOf = (list, value, what) => {
  const i = list.indexOf(value);
  if (i < 0) throw new Error(`batch: unknown ${what} "${value}"`);
  return i;
};

const orNaN = (v) => (v === null || v === undefined ? NaN : v);

/** Collects one batch; take() hands it over (its arrays are then the receiver's) and starts the next. */
export function createBatchBuilder(capacityRows = 2048) {
  let samples = new Float64Array(capacityRows * PLANE_SAMPLE_WIDTH);
  let readings = new Float64Array(capacityRows * READING_WIDTH);
  let sampleRows = 0;
  let readingRows = 0;
  let strings = [];
  let indexOfString = new Map();

  const stringIndex = (s) => {
    if (s === null || s === undefined) return NaN;
    let i = indexOfString.get(s);
    if (i === undefined) {
      i = strings.length;
      strings.push(s);
      indexOfString.set(s, i);
    }
    return i;
  };
  const grow = (arr, needed) => {
    if (needed <= arr.length) return arr;
    const next = new Float64Array(Math.max(needed, arr.length * 2));
    next.set(arr);
    return next;
  };

  return {
    get sampleRows() { return sampleRows; },
    get readingRows() { return readingRows; },
    /** s: the sample as LogSample, with the probe by id. */
    addSample(s, probeId) {
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
    addReading(r) {
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
      const batch = {
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
export const transferOf = (batch) => [batch.samples.buffer, batch.readings.buffer];

const valueOrNull = (x) => (x === x ? x : null);

/**
 * Writes readings from..to-1 of a batch into out as SQL values in the readings insert's order
 * (READING_SLOTS, the budget slots made its stored text, before the note); returns the number of values written.
 */
export function fillReadingValues(batch, from, to, out) {
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
export function unpackF64Block(data, strings, rowCount, encoding = 'f64') {
  const width = encoding === 'f64p' ? PLANE_SAMPLE_WIDTH : SAMPLE_WIDTH;
  if (data.byteLength !== rowCount * width * 8) throw new Error(`holds ${data.byteLength} bytes, not ${rowCount} samples of ${width} numbers`);
  // A copy: a Buffer from SQLite need not be 8-byte aligned.
  const f = new Float64Array(new Uint8Array(data).buffer);
  const out = new Array(rowCount);
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

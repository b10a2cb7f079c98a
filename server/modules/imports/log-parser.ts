import fs from 'node:fs';
import Papa from 'papaparse';
import { decodeText, decodingStream, TEXT_ENCODING_NAMES, TEXT_HEAD_BYTES, textEncodingOf, type TextEncoding } from '../../lib/text-encoding';
import { READING_PLANES, type ReadingPlane } from '../../../shared/core/planes';
import type { DecodingCalibration } from '../probes/probe-calibration';
import { createLogDecoder, type DecodedReading, type LogSample } from './log-decoder';
import { createTimestampParser } from './log-time';
import { createBatchBuilder, type Batch } from './batch-format';
import { createProblemCollector, type ImportProblem, type ImportWarning } from './import-record';

/** The log format's columns (README, "Survey logs and the log format"). */
export const LOG_COLUMNS = ['timestamp', 'probe', 'point', 'gain', 'counts', 'ma', 'volts', 'x_m', 'y_m', 'plan', 'int_ms', 'temp_c', 'role', 'note', 'plane', 'azimuth_deg'] as const;
export const REQUIRED_COLUMNS = ['timestamp', 'probe', 'point'] as const;
type Column = (typeof LOG_COLUMNS)[number];

export const MAX_POINT_LENGTH = 120;
export const MAX_NOTE_LENGTH = 1000;

export type { ImportProblem, ImportWarning };
/** How the import's readings got their place: the row's own x_m, y_m; a planned point named by the row's point label; none. */
export type PlacementSummary = { byCoordinates: number; byLabel: number; none: number };
/** A planned point of the survey, for the label join (label compared trimmed and case-insensitively). */
export type PlannedPosition = { label: string; planId: number; xM: number; yM: number; plane?: ReadingPlane; azimuthDeg?: number | null };

/** Lines listed per unknown label, and unknown labels named, before the warning just counts the rest. */
const MAX_LINES_PER_LABEL = 20;
const MAX_UNKNOWN_LABELS = 50;


export type WorkerToMain =
  | { type: 'batch'; batch: Batch }
  | { type: 'progress'; bytesRead: number; rowsRead: number }
  | { type: 'end'; rowsRead: number; readingCount: number; placement: PlacementSummary; warnings: ImportWarning[]; warningCount: number; errors: ImportProblem[]; errorCount: number }
  | { type: 'crash'; message: string };

export type ParseLogInput = {
  filePath: string;
  timeZone: string;
  calibration: ReadonlyMap<string, DecodingCalibration>;
  /** The plans of the survey's site, which a row's `plan` column names (case-insensitive). */
  plans: readonly { id: number; name: string }[];
  /** The plan for rows with an empty `plan` (the upload's planId field), or null. */
  defaultPlanId: number | null;
  /** The survey's planned points: a row without x_m, y_m whose point names one takes its plan and position. */
  plannedPoints?: readonly PlannedPosition[];
  /** Samples per batch sent for writing. */
  batchRows?: number;
};

export type ParseLogSink = { post(m: WorkerToMain): void; drain(): Promise<void> };

/**
 * Small stream chunks and batches keep the rows in flight short-lived, so they die in the young
 * generation: with 1 MB chunks and 4,096-row batches a quarter to a third of the parse was
 * garbage collection; with these about a tenth of that (tests/bench/ingest.bench.ts).
 */
const STREAM_CHUNK_BYTES = 64 * 1024;
const BATCH_ROWS = 1024;

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

const POWERS_OF_TEN = Array.from({ length: 16 }, (_, k) => 10 ** k);

/**
 * A plain decimal ("-12.25", "163", ".5") read without the general string-to-number conversion, or
 * NaN for anything else (exponent, "+", more than 15 digits: the caller's strict path). With at
 * most 15 digits the digits form an exact integer and 10^k is exact, so one IEEE division is
 * correctly rounded: the same double as Number(text) (Clinger's fast path, common practice).
 */
export function plainDecimal(text: string): number {
  let i = 0;
  const negative = text.charCodeAt(0) === 45;
  if (negative) i = 1;
  let mantissa = 0;
  let digits = 0;
  let fraction = -1;
  for (; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (fraction >= 0) fraction++;
    } else if (c === 46 && fraction < 0) fraction = 0;
    else return NaN;
  }
  if (digits === 0 || digits > 15) return NaN;
  const value = fraction > 0 ? mantissa / POWERS_OF_TEN[fraction] : mantissa;
  return negative ? -value : value;
}

/** Comma, semicolon or tab: whichever occurs most in the header line outside quotes (comma on a tie). */
export function detectDelimiter(headerLine: string): ',' | ';' | '\t' {
  const n = { ',': 0, ';': 0, '\t': 0 };
  let quoted = false;
  for (const ch of headerLine) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === ',' || ch === ';' || ch === '\t')) n[ch]++;
  }
  if (n[';'] > n[','] && n[';'] >= n['\t']) return ';';
  if (n['\t'] > n[',']) return '\t';
  return ',';
}

/** The file's encoding and its header line, from one read of its first TEXT_HEAD_BYTES. */
function readHead(filePath: string): { encoding: TextEncoding; header: string } {
  const fd = fs.openSync(filePath, 'r');
  try {
    const buf = Buffer.alloc(TEXT_HEAD_BYTES);
    const head = buf.subarray(0, fs.readSync(fd, buf, 0, buf.length, 0));
    // The upload was refused unless it is text (sniffFile); a file handed over otherwise is read as UTF-8.
    const encoding = textEncodingOf(head) ?? 'utf-8';
    const text = decodeText(head, encoding); // without a byte-order mark
    const end = text.search(/\r?\n/);
    return { encoding, header: end < 0 ? text : text.slice(0, end) };
  } finally {
    fs.closeSync(fd);
  }
}

/**
 * Streams one log file through papaparse, validates each row, decodes with the measurement
 * core and posts accepted rows in batches. After the first error no batch is posted (the
 * file will be rejected), but reading goes on to report up to 200 problems.
 */
export async function parseLogFile(input: ParseLogInput, sink: ParseLogSink): Promise<void> {
  // At most 200 of each kind kept, each cut to the record's lengths (import-record.ts).
  const problems = createProblemCollector();
  let rowsRead = 0;
  let readingCount = 0;
  const placement: PlacementSummary = { byCoordinates: 0, byLabel: 0, none: 0 };
  const planned = new Map<string, PlannedPosition>();
  for (const p of input.plannedPoints ?? []) planned.set(p.label.trim().toLowerCase(), p);
  /** Label keys some row was placed by, to tell a reading placed by label from one with its own coordinates. */
  const placedByLabel = new Set<string>();
  /** Unknown labels of rows without coordinates → their lines (only when the survey has planned points). */
  const unknownLabels = new Map<string, { label: string; lines: number[]; count: number }>();
  const addError = problems.error;
  const end = () => {
    let named = 0;
    for (const u of unknownLabels.values()) {
      if (named++ >= MAX_UNKNOWN_LABELS) {
        problems.warning({ line: null, column: 'point', message: `${unknownLabels.size - MAX_UNKNOWN_LABELS} more point label(s) match no planned point either` });
        break;
      }
      const more = u.count > u.lines.length ? ` and ${u.count - u.lines.length} more` : '';
      problems.warning({ line: u.lines[0], column: 'point', message: `Point "${u.label}" has no x_m, y_m and matches no planned point of this survey (line${u.count > 1 ? 's' : ''} ${u.lines.join(', ')}${more}): its readings are kept without a position` });
    }
    sink.post({ type: 'end', rowsRead, readingCount, placement, warnings: problems.warnings, warningCount: problems.warningCount, errors: problems.errors, errorCount: problems.errorCount });
  };

  const size = fs.statSync(input.filePath).size;
  const { encoding, header } = readHead(input.filePath);
  if (size === 0 || header.trim() === '') {
    addError({ line: 1, column: '', value: '', message: 'The file is empty: it needs a header row and one sample per row' });
    return end();
  }
  const delimiter = detectDelimiter(header);
  const decimalComma = delimiter === ';';
  const parseTime = createTimestampParser(input.timeZone);
  const batchRows = input.batchRows ?? BATCH_ROWS;

  const batch = createBatchBuilder(batchRows * 2);
  const decoder = createLogDecoder(input.calibration, (r: DecodedReading) => {
    readingCount++;
    if (r.xM === null) placement.none++;
    else {
      // One key per reading (this runs for every reading of a million-row log).
      const key = placedByLabel.size > 0 ? r.point.toLowerCase() : '';
      const p = key !== '' && placedByLabel.has(key) ? planned.get(key) : undefined;
      if (p && p.xM === r.xM && p.yM === r.yM) placement.byLabel++;
      else placement.byCoordinates++;
    }
    if (problems.errorCount > 0) return;
    batch.addReading(r);
  }, addError);

  const col: Record<Column, number> = Object.fromEntries(LOG_COLUMNS.map((c) => [c, -1])) as Record<Column, number>;
  let headerWidth = 0;
  let nextLine = 1;
  let headerDone = false;
  const warnedProbes = new Set<string>();
  const planByName = new Map<string, number | 'ambiguous'>();
  for (const p of input.plans) {
    const key = p.name.trim().toLowerCase();
    planByName.set(key, planByName.has(key) ? 'ambiguous' : p.id);
  }
  const planNames = input.plans.map((p) => p.name).join(', ');
  // Rows naming no plan: the upload's choice, else the site's only plan (for positioned rows).
  const onlyPlanId = input.plans.length === 1 ? input.plans[0].id : null;

  /** Column positions fixed once the header is read; row code reads them by name (a fixed-shape object, not a keyed lookup per field). */
  let at = { ...col };
  const num = (row: string[], i: number, c: Column, line: number): number | undefined | null => {
    if (i < 0 || i >= row.length) return undefined;
    let v = row[i].trim();
    if (v === '') return undefined;
    if (decimalComma) v = v.replace(',', '.');
    const n = plainDecimal(v);
    if (n === n) return n;
    if (!NUMBER.test(v)) {
      addError({ line, column: c, value: row[i], message: `${c} "${row[i]}" is not a number${decimalComma ? ' (with semicolons, write decimals as 12,5 or 12.5)' : ''}` });
      return null;
    }
    return Number(v);
  };
  const text = (row: string[], i: number) => (i >= 0 && i < row.length ? row[i].trim() : '');

  function readHeader(row: string[]): boolean {
    headerWidth = row.length;
    const seen = new Set<string>();
    row.forEach((raw, i) => {
      const name = raw.replace(/^\uFEFF/, '').trim().toLowerCase();
      if (name === '') return;
      if (seen.has(name)) addError({ line: 1, column: name, value: raw, message: `Column "${name}" appears twice in the header` });
      seen.add(name);
      if ((LOG_COLUMNS as readonly string[]).includes(name)) col[name as Column] = i;
      else problems.warning({ line: 1, column: name, message: `Unknown column "${raw.trim()}" was kept in the file but not imported` });
    });
    for (const c of REQUIRED_COLUMNS) {
      if (col[c] < 0) addError({ line: 1, column: c, value: '', message: `The header has no "${c}" column (required: ${REQUIRED_COLUMNS.join(', ')}); found: ${row.map((r) => r.trim()).join(', ')}` });
    }
    if ((col.x_m < 0) !== (col.y_m < 0)) {
      const missing = col.x_m < 0 ? 'x_m' : 'y_m';
      addError({ line: 1, column: missing, value: '', message: `The header has ${missing === 'x_m' ? 'y_m' : 'x_m'} but no ${missing}: give both plan coordinates or neither` });
    }
    at = { ...col };
    return problems.errorCount === 0;
  }

  function readRow(row: string[], line: number) {
    rowsRead++;
    if (row.length > headerWidth && row.slice(headerWidth).some((f) => f.trim() !== '')) {
      return addError({ line, column: '', value: row.slice(headerWidth).join(delimiter), message: `The row has ${row.length} fields but the header has ${headerWidth}` });
    }
    if (row.length < headerWidth) {
      return addError({ line, column: '', value: row.join(delimiter), message: `The row has ${row.length} fields but the header has ${headerWidth}` });
    }
    const before = problems.errorCount;
    const ts = text(row, at.timestamp);
    const probe = text(row, at.probe);
    const point = text(row, at.point);
    const timeMs = ts === '' ? null : parseTime(ts);
    if (ts === '') addError({ line, column: 'timestamp', value: '', message: 'timestamp is empty' });
    else if (timeMs === null) addError({ line, column: 'timestamp', value: ts, message: `timestamp "${ts}" is not an ISO 8601 time such as 2026-11-20T09:15:00 or 2026-11-20T09:15:00+01:00` });
    if (probe === '') addError({ line, column: 'probe', value: '', message: 'probe is empty: give the probe\'s serial' });
    if (point === '') addError({ line, column: 'point', value: '', message: 'point is empty: give the point\'s label' });
    else if (point.length > MAX_POINT_LENGTH) addError({ line, column: 'point', value: point.slice(0, 40), message: `point label is longer than ${MAX_POINT_LENGTH} characters` });
    const gainCode = num(row, at.gain, 'gain', line);
    const counts = num(row, at.counts, 'counts', line);
    const ma = num(row, at.ma, 'ma', line);
    const volts = num(row, at.volts, 'volts', line);
    const intMs = num(row, at.int_ms, 'int_ms', line);
    const tempC = num(row, at.temp_c, 'temp_c', line);
    const xM = num(row, at.x_m, 'x_m', line);
    const yM = num(row, at.y_m, 'y_m', line);
    if ((xM === undefined) !== (yM === undefined) && xM !== null && yM !== null) {
      const missing = xM === undefined ? 'x_m' : 'y_m';
      addError({ line, column: missing, value: '', message: `${missing === 'x_m' ? 'y_m' : 'x_m'} is given but ${missing} is empty: give both plan coordinates or neither` });
    }
    const planText = text(row, at.plan);
    let planId: number | null = null;
    if (planText !== '') {
      const found = planByName.get(planText.toLowerCase());
      if (found === undefined) {
        addError({ line, column: 'plan', value: planText, message: input.plans.length === 0 ? `plan "${planText}" is not known: this site has no plans yet` : `plan "${planText}" is not a plan of this site (its plans: ${planNames})` });
      } else if (found === 'ambiguous') {
        addError({ line, column: 'plan', value: planText, message: `plan "${planText}" names more than one plan of this site: rename one of them` });
      } else planId = found;
    } else planId = input.defaultPlanId ?? (xM !== undefined && xM !== null ? onlyPlanId : null);
    const roleText = text(row, at.role).toLowerCase();
    if (roleText !== '' && roleText !== 'task' && roleText !== 'reference') addError({ line, column: 'role', value: text(row, at.role), message: 'role must be task or reference' });
    const planeText = text(row, at.plane).toLowerCase();
    let plane = (planeText === '' ? 'horizontal' : planeText) as ReadingPlane;
    if (!(READING_PLANES as readonly string[]).includes(plane)) addError({ line, column: 'plane', value: text(row, at.plane), message: `plane must be one of ${READING_PLANES.join(', ')} (empty: horizontal)` });
    let azimuthDeg = num(row, at.azimuth_deg, 'azimuth_deg', line);
    if (azimuthDeg !== undefined && azimuthDeg !== null && !(azimuthDeg >= 0 && azimuthDeg < 360)) {
      addError({ line, column: 'azimuth_deg', value: text(row, at.azimuth_deg), message: 'azimuth_deg is a direction from 0 up to (not including) 360 degrees, clockwise from the plan\'s up (+y)' });
    } else if (plane === 'vertical' && azimuthDeg === undefined) {
      addError({ line, column: 'azimuth_deg', value: '', message: 'a vertical reading needs azimuth_deg, the direction its sensor faced' });
    } else if ((plane === 'horizontal' || plane === 'ceiling') && azimuthDeg !== undefined && azimuthDeg !== null) {
      addError({ line, column: 'azimuth_deg', value: text(row, at.azimuth_deg), message: `azimuth_deg applies to vertical and wall readings, not to a ${plane} one` });
    }
    if (problems.errorCount > before) return;
    // Precedence: the row's own coordinates, then a planned point its label names, then none.
    let placedX = xM ?? null;
    let placedY = yM ?? null;
    if (placedX === null && planned.size > 0 && roleText !== 'reference') {
      const key = point.toLowerCase();
      const p = planned.get(key);
      if (p) {
        placedX = p.xM;
        placedY = p.yM;
        planId = p.planId;
        // A wall or ceiling point gives its plane (and a wall's facing) unless the row states its own.
        if (planeText === '' && p.plane && p.plane !== 'horizontal') {
          plane = p.plane;
          if (azimuthDeg === undefined && p.plane === 'wall' && p.azimuthDeg != null) azimuthDeg = p.azimuthDeg;
        }
        placedByLabel.add(key);
      } else {
        const u = unknownLabels.get(key);
        if (u) {
          u.count++;
          if (u.lines.length < MAX_LINES_PER_LABEL) u.lines.push(line);
        } else unknownLabels.set(key, { label: point, lines: [line], count: 1 });
      }
    }
    const note = text(row, at.note);
    const sample: LogSample = {
      line, timeMs: timeMs!, probe, point,
      gainCode: gainCode ?? undefined, counts: counts ?? undefined, ma: ma ?? undefined, volts: volts ?? undefined,
      intMs: intMs ?? undefined, tempC: tempC ?? undefined, xM: placedX, yM: placedY, planId,
      role: roleText === 'reference' ? 'reference' : 'task', note: note === '' ? null : note.slice(0, MAX_NOTE_LENGTH),
      plane, azimuthDeg: azimuthDeg ?? null,
    };
    const cal = input.calibration.get(probe);
    if (cal && cal.status !== 'in_service' && !warnedProbes.has(probe)) {
      warnedProbes.add(probe);
      problems.warning({ line, column: 'probe', message: `Probe ${probe} is marked ${cal.status.replace(/_/g, ' ')}; its samples were decoded all the same` });
    }
    decoder.push(sample);
    if (problems.errorCount > before || problems.errorCount > 0) return;
    batch.addSample(sample, cal!.probeId);
  }

  const flush = () => {
    if (problems.errorCount > 0) return batch.clear();
    if (batch.sampleRows === 0 && batch.readingRows === 0) return;
    sink.post({ type: 'batch', batch: batch.take() });
  };

  if (encoding === 'windows-1252') {
    problems.warning({ line: null, column: '', message: `The file is not UTF-8: it was read as ${TEXT_ENCODING_NAMES[encoding]}, as Windows programs write "ANSI" CSV. If a letter in a label or note looks wrong, save the log as "CSV UTF-8" and upload it again` });
  }
  const bytes = fs.createReadStream(input.filePath, { highWaterMark: STREAM_CHUNK_BYTES });
  const stream = encoding === 'utf-8' ? bytes.setEncoding('utf8') : bytes.pipe(decodingStream(encoding));
  // A field spans lines only inside quotes: until the file shows a quote, no row needs the per-field scan.
  let quoteSeen = false;
  stream.on('data', (d: string) => { if (!quoteSeen && d.includes('"')) quoteSeen = true; });
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(stream as unknown as File, {
      delimiter,
      header: false,
      skipEmptyLines: false,
      chunk(results, parser) {
        for (const row of results.data) {
          const line = nextLine;
          nextLine++;
          if (quoteSeen) for (const f of row) if (f.length > 0 && f.includes('\n')) nextLine += f.split('\n').length - 1;
          if (!headerDone) {
            headerDone = true;
            if (!readHeader(row)) {
              parser.abort();
              return;
            }
            continue;
          }
          if (row.length === 1 && row[0].trim() === '') continue; // blank line
          readRow(row, line);
        }
        for (const e of results.errors) {
          if (e.type === 'Quotes') addError({ line: nextLine, column: '', value: '', message: `A quoted field is not closed (${e.message})` });
        }
        if (batch.sampleRows >= batchRows || problems.errorCount > 0) flush();
        sink.post({ type: 'progress', bytesRead: bytes.bytesRead, rowsRead });
        // Hold both the parser and the file stream until the writer has caught up.
        parser.pause();
        stream.pause();
        sink.drain().then(() => {
          stream.resume();
          parser.resume();
        }, reject);
      },
      complete: () => resolve(),
      error: (err: Error) => reject(err),
    });
  });
  stream.destroy();
  bytes.destroy();
  if (headerDone && problems.errorCount === 0 && rowsRead === 0) {
    addError({ line: 2, column: '', value: '', message: 'The file has a header but no samples' });
  }
  if (problems.errorCount === 0) {
    decoder.finish();
    flush();
  }
  end();
}

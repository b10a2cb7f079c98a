// Writes one batch of an import's accepted rows in one transaction: its samples as one
// sample_blocks row (the batch's Float64Array stored as it is) and its readings through prepared
// multi-row INSERTs. Bundled into the writer thread (import-runner.ts); the main thread uses it
// too, for an in-memory database, and re-decoding writes through it.
import type Database from 'better-sqlite3';
import type { readings } from '../../db/schema/surveys';
import { fillReadingValues, SAMPLE_ENCODING, type Batch } from './batch-format';

export type BatchTarget = { importId: number; surveyId: number; decodeId: number };
/** Import progress to record with a batch (the writer thread keeps log_imports current). */
export type BatchProgress = { progress: number; rowsRead: number };

type ReadingColumns = typeof readings._.columns;
/**
 * The readings columns a batch fills, in fillReadingValues' order, by schema key with their SQL
 * names: the compiler holds each name to the drizzle schema (server/db/schema/surveys.ts).
 */
const READING_COLUMNS = {
  point: 'point', xM: 'x_m', yM: 'y_m', planId: 'plan_id', role: 'role', timeMs: 'time_ms', probeId: 'probe_id',
  lux: 'lux', uLux: 'u_lux', luxBound: 'lux_bound', flag: 'flag', gainCode: 'gain_code', sampleCount: 'sample_count',
  chosenSample: 'chosen_sample', coefficientSetId: 'coefficient_set_id', budget: 'budget', note: 'note',
  plane: 'plane', azimuthDeg: 'azimuth_deg', rawCounts: 'raw_counts', rawSignal: 'raw_signal', intMs: 'int_ms', tempC: 'temp_c',
} as const satisfies { [K in keyof ReadingColumns]?: ReadingColumns[K]['_']['name'] };

/** Values per reading in the readings insert (the columns above, after the inlined ids). */
export const READING_VALUES = Object.keys(READING_COLUMNS).length;
const MULTI_ROWS = 64;

export function createBatchWriter(client: Database.Database, target: BatchTarget): (batch: Batch, progress?: BatchProgress) => void {
  const { importId, surveyId, decodeId } = target;
  if (![importId, surveyId, decodeId].every((n) => Number.isSafeInteger(n))) throw new Error('createBatchWriter: ids must be integers');
  // Ids are integers from the database, inlined so each row binds only its own values.
  const readingRow = `(${surveyId},${decodeId},${importId},${Array(READING_VALUES).fill('?').join(',')})`;
  const readingSql = `insert into readings (survey_id, decode_id, import_id, ${Object.values(READING_COLUMNS).join(', ')}) values `;
  const blockStmt = client.prepare(`insert into sample_blocks (import_id, survey_id, first_line, row_count, encoding, strings, data) values (${importId}, ${surveyId}, ?, ?, '${SAMPLE_ENCODING}', ?, ?)`);
  const readingMany = client.prepare(readingSql + Array(MULTI_ROWS).fill(readingRow).join(','));
  const readingOne = client.prepare(readingSql + readingRow);
  const progressStmt = client.prepare(`update log_imports set progress = ?, rows_read = ? where id = ${importId}`);
  const many = new Array<unknown>(READING_VALUES * MULTI_ROWS);
  const one = new Array<unknown>(READING_VALUES);
  return client.transaction((batch: Batch, progress?: BatchProgress) => {
    if (batch.sampleRows > 0) {
      const { samples } = batch;
      blockStmt.run(samples[0], batch.sampleRows, JSON.stringify(batch.strings), Buffer.from(samples.buffer, samples.byteOffset, samples.byteLength));
    }
    let r = 0;
    for (; r + MULTI_ROWS <= batch.readingRows; r += MULTI_ROWS) {
      fillReadingValues(batch, r, r + MULTI_ROWS, many);
      readingMany.run(many);
    }
    for (; r < batch.readingRows; r++) {
      fillReadingValues(batch, r, r + 1, one);
      readingOne.run(one);
    }
    if (progress) progressStmt.run(progress.progress, progress.rowsRead);
  });
}

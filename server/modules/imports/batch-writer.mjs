// Writes one batch of an import's accepted rows in one transaction: its samples as one
// sample_blocks row (the batch's Float64Array stored as it is) and its readings through prepared
// multi-row INSERTs. Plain JavaScript so the writer thread runs without the TypeScript loader;
// types in batch-writer.d.mts. The main thread uses it too, for an in-memory database.
import { fillReadingValues, SAMPLE_ENCODING } from './batch-format.mjs';

/** Values per reading in the readings insert (the column list below, after the inlined ids). */
const READING_VALUES = 23;
const MULTI_ROWS = 64;

export function createBatchWriter(client, target) {
  const { importId, surveyId, decodeId } = target;
  if (![importId, surveyId, decodeId].every((n) => Number.isSafeInteger(n))) throw new Error('createBatchWriter: ids must be integers');
  // Ids are integers from the database, inlined so each row binds only its own values.
  const readingRow = `(${surveyId},${decodeId},${importId},${Array(READING_VALUES).fill('?').join(',')})`;
  const readingSql = 'insert into readings (survey_id, decode_id, import_id, point, x_m, y_m, plan_id, role, time_ms, probe_id, lux, u_lux, lux_bound, flag, gain_code, sample_count, chosen_sample, coefficient_set_id, budget, note, plane, azimuth_deg, raw_counts, raw_signal, int_ms, temp_c) values ';
  const blockStmt = client.prepare(`insert into sample_blocks (import_id, survey_id, first_line, row_count, encoding, strings, data) values (${importId}, ${surveyId}, ?, ?, '${SAMPLE_ENCODING}', ?, ?)`);
  const readingMany = client.prepare(readingSql + Array(MULTI_ROWS).fill(readingRow).join(','));
  const readingOne = client.prepare(readingSql + readingRow);
  const progressStmt = client.prepare(`update log_imports set progress = ?, rows_read = ? where id = ${importId}`);
  const many = new Array(READING_VALUES * MULTI_ROWS);
  const one = new Array(READING_VALUES);
  return client.transaction((batch, progress) => {
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

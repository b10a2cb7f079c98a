// Writes an import's accepted rows: prepared multi-row INSERTs, one transaction per batch. Plain
// JavaScript so the writer thread runs without the TypeScript loader (about 40 MB less per thread);
// types in batch-writer.d.mts. The main thread uses it too, for an in-memory database.

/** Values per row of the flat arrays a batch carries (the column lists below, after the inlined ids). */
export const SAMPLE_WIDTH = 15;
export const READING_WIDTH = 17;

const MULTI_ROWS = 64;

export function createBatchWriter(client, target) {
  const { importId, surveyId, decodeId } = target;
  if (![importId, surveyId, decodeId].every((n) => Number.isSafeInteger(n))) throw new Error('createBatchWriter: ids must be integers');
  // Ids are integers from the database, inlined so each row binds only its own values.
  const sampleRow = `(${importId},${surveyId},${Array(SAMPLE_WIDTH).fill('?').join(',')})`;
  const readingRow = `(${surveyId},${decodeId},${importId},${Array(READING_WIDTH).fill('?').join(',')})`;
  const sampleSql = 'insert into samples (import_id, survey_id, line, time_ms, probe_id, point, gain_code, counts, ma, volts, int_ms, temp_c, x_m, y_m, plan_id, role, note) values ';
  const readingSql = 'insert into readings (survey_id, decode_id, import_id, point, x_m, y_m, plan_id, role, time_ms, probe_id, lux, u_lux, lux_bound, flag, gain_code, sample_count, chosen_sample, coefficient_set_id, budget, note) values ';
  const sampleMany = client.prepare(sampleSql + Array(MULTI_ROWS).fill(sampleRow).join(','));
  const sampleOne = client.prepare(sampleSql + sampleRow);
  const readingMany = client.prepare(readingSql + Array(MULTI_ROWS).fill(readingRow).join(','));
  const readingOne = client.prepare(readingSql + readingRow);
  const progressStmt = client.prepare(`update log_imports set progress = ?, rows_read = ? where id = ${importId}`);
  const insert = (values, width, many, one) => {
    const step = width * MULTI_ROWS;
    let i = 0;
    for (; i + step <= values.length; i += step) many.run(values.slice(i, i + step));
    for (; i < values.length; i += width) one.run(values.slice(i, i + width));
  };
  return client.transaction((samplesFlat, readingsFlat, progress) => {
    insert(samplesFlat, SAMPLE_WIDTH, sampleMany, sampleOne);
    insert(readingsFlat, READING_WIDTH, readingMany, readingOne);
    if (progress) progressStmt.run(progress.progress, progress.rowsRead);
  });
}

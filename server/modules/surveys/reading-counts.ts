import { eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { readingCounts } from '../../db/schema/aggregates';
import { logImports, readings, surveys } from '../../db/schema/surveys';

/** Records how many readings an accepted import holds under a decode (in the transaction that accepts them). */
export function keepReadingCount(tx: Pick<Db, 'insert'>, decodeId: number, importId: number, readings: number): void {
  tx.insert(readingCounts).values({ decodeId, importId, readings })
    .onConflictDoUpdate({ target: [readingCounts.decodeId, readingCounts.importId], set: { readings } }).run();
}

/**
 * A survey's current readings (its active decode: accepted imports from the kept counts, plus the
 * few typed in the field view, through their own index), as a correlated subquery for a list's
 * select: no logged reading is scanned.
 */
export const currentReadingCount = sql<number>`(coalesce((select sum(${readingCounts.readings}) from ${readingCounts}
  join ${logImports} on ${logImports.id} = ${readingCounts.importId} and ${logImports.status} = 'done'
  where ${readingCounts.decodeId} = ${surveys.activeDecodeId}), 0)
  + (select count(*) from ${readings} where ${readings.fieldRecordId} is not null and ${readings.decodeId} = ${surveys.activeDecodeId}))`;

/** A survey's current readings (currentReadingCount for one survey). */
export function keptReadingTotal(db: Db, surveyId: number): number {
  return db.select({ n: currentReadingCount }).from(surveys).where(eq(surveys.id, surveyId)).get()?.n ?? 0;
}

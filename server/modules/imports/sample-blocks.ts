import { and, asc, eq, gt } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { sampleBlocks } from '../../db/schema/surveys';
import { READING_ROLES } from '@shared/core/types';
import type { SampleEncoding } from '@shared/schemas/imports';
import { SAMPLE_SLOTS, SAMPLE_WIDTH, unpackF64Block, type StoredSample } from './batch-format';

export type { StoredSample };

type Block = { id: number; rowCount: number; encoding: SampleEncoding; strings: string | null; data: Buffer };

/** A 'json' block (made by migration 0003): one flat array of SAMPLE_SLOTS values per sample. */
function unpackJsonBlock(data: Buffer, rowCount: number): StoredSample[] {
  const flat: unknown = JSON.parse(data.toString('utf8'));
  if (!Array.isArray(flat) || flat.length !== rowCount * SAMPLE_WIDTH) throw new Error(`does not hold ${rowCount} samples of ${SAMPLE_WIDTH} values`);
  const out: StoredSample[] = new Array(rowCount);
  for (let r = 0; r < rowCount; r++) {
    const s = { ...Object.fromEntries(SAMPLE_SLOTS.map((slot, i) => [slot, flat[r * SAMPLE_WIDTH + i]])), plane: 'horizontal', azimuthDeg: null } as StoredSample;
    if (!(READING_ROLES as readonly string[]).includes(s.role)) throw new Error(`gives sample ${r} the role "${String(s.role)}"`);
    out[r] = s;
  }
  return out;
}

/** One block's samples, in file order; a block that does not hold what it says fails naming it. */
export function unpackSampleBlock(block: Block): StoredSample[] {
  try {
    if (block.encoding === 'json') return unpackJsonBlock(block.data, block.rowCount);
    const strings: unknown = JSON.parse(block.strings ?? 'null');
    if (!Array.isArray(strings)) throw new Error('has no string table');
    return unpackF64Block(block.data, strings as string[], block.rowCount, block.encoding);
  } catch (err) {
    throw new Error(`Sample block ${block.id} is damaged: it ${err instanceof Error ? err.message : String(err)}`);
  }
}

/** An import's kept samples in file order, a few blocks at a time (some 5,000 samples a page). */
export function* pagesOfSamples(db: Db, importId: number, blocksPerPage = 4): Generator<StoredSample[]> {
  let lastId = 0;
  for (;;) {
    const blocks = db.select({ id: sampleBlocks.id, rowCount: sampleBlocks.rowCount, encoding: sampleBlocks.encoding, strings: sampleBlocks.strings, data: sampleBlocks.data })
      .from(sampleBlocks).where(and(eq(sampleBlocks.importId, importId), gt(sampleBlocks.id, lastId))).orderBy(asc(sampleBlocks.id)).limit(blocksPerPage).all();
    if (blocks.length === 0) return;
    lastId = blocks[blocks.length - 1].id;
    yield blocks.flatMap(unpackSampleBlock);
  }
}

import type { Db } from '../../db/client';

/**
 * What the verdict routes keep per verdict aggregate between requests in the process (its parsed
 * summary, and the packed parts most recently read from the database, answer-parts.ts), least
 * recently used first out once the kept bytes pass ANSWER_CACHE_BYTES: enough for a
 * 500,000-reading survey's 40 zone parts and map (about 9 MB) and a few dozen summaries. Every
 * entry is named by the aggregate's id (and a key: the summary's inputs key, or a fixed one for
 * parts): an aggregate never changes once written (a change of any input makes a new one, whose id
 * is new: ids are AUTOINCREMENT, never reused), so an entry stays right for as long as its
 * aggregate is the answer. One cache per database connection (tests open many in one process).
 */
export const ANSWER_CACHE_BYTES = 24 * 1024 * 1024;

type Entry = { value: unknown; bytes: number; aggregateId: number };

export class AnswerCache {
  private readonly entries = new Map<string, Entry>();
  private bytes = 0;
  constructor(readonly maxBytes: number) {}

  get<V>(aggregateId: number, inputsKey: string, part: string): V | undefined {
    const key = `${aggregateId}\u0000${inputsKey}\u0000${part}`;
    const entry = this.entries.get(key);
    if (!entry) return undefined;
    // Most recently used last (a Map keeps insertion order).
    this.entries.delete(key);
    this.entries.set(key, entry);
    return entry.value as V;
  }

  set(aggregateId: number, inputsKey: string, part: string, value: unknown, bytes: number): void {
    const key = `${aggregateId}\u0000${inputsKey}\u0000${part}`;
    this.remove(key);
    if (bytes > this.maxBytes) return;
    this.entries.set(key, { value, bytes, aggregateId });
    this.bytes += bytes;
    for (const [oldest] of this.entries) {
      if (this.bytes <= this.maxBytes) break;
      this.remove(oldest);
    }
  }

  /** Drops what was kept for an aggregate another one replaced (its entries would only wait to be evicted). */
  forgetAggregate(aggregateId: number): void {
    for (const [key, entry] of this.entries) if (entry.aggregateId === aggregateId) this.remove(key);
  }

  /** Drops everything (tests compare a kept answer with one built afresh). */
  clear(): void {
    this.entries.clear();
    this.bytes = 0;
  }

  stats(): { entries: number; bytes: number } {
    return { entries: this.entries.size, bytes: this.bytes };
  }

  private remove(key: string) {
    const entry = this.entries.get(key);
    if (!entry) return;
    this.entries.delete(key);
    this.bytes -= entry.bytes;
  }
}

const caches = new WeakMap<object, AnswerCache>();
/** The cache of this database connection. */
export function answerCache(db: Db): AnswerCache {
  let cache = caches.get(db.$client);
  if (!cache) caches.set(db.$client, (cache = new AnswerCache(ANSWER_CACHE_BYTES)));
  return cache;
}

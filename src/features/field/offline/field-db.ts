// The phone's own store (IndexedDB through idb): surveys taken offline, and the records waiting
// to be synced. Nothing here is dropped silently: a refused record stays with its reason.
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { FieldRecordBody, FieldSessionBody, FieldState } from '@shared/schemas/field';

export type OutboxState = 'waiting' | 'refused';

export type OutboxItem =
  | { key: string; surveyId: number; kind: 'session'; body: FieldSessionBody; state: OutboxState; reason: string | null; createdAt: number }
  | { key: string; surveyId: number; kind: 'record'; body: FieldRecordBody; state: OutboxState; reason: string | null; createdAt: number }
  | {
    key: string; surveyId: number; kind: 'photo'; state: OutboxState; reason: string | null; createdAt: number;
    body: { idempotencyKey: string; takenAt: string; point?: string; plannedPointId?: number; zoneId?: number; note?: string; keepLocation: boolean; filename: string };
    blob: Blob;
  };

export type OfflineSnapshot = {
  surveyId: number;
  state: FieldState;
  /** Plan images by plan id, kept so the plan shows with the network off. */
  images: Record<number, Blob>;
  savedAt: number;
};

interface FieldDb extends DBSchema {
  snapshots: { key: number; value: OfflineSnapshot };
  outbox: { key: string; value: OutboxItem; indexes: { bySurvey: number } };
}

let dbPromise: Promise<IDBPDatabase<FieldDb>> | null = null;

export function fieldDb(): Promise<IDBPDatabase<FieldDb>> {
  dbPromise ??= openDB<FieldDb>('luxtrail-field', 1, {
    upgrade(db) {
      db.createObjectStore('snapshots', { keyPath: 'surveyId' });
      db.createObjectStore('outbox', { keyPath: 'key' }).createIndex('bySurvey', 'surveyId');
    },
  });
  return dbPromise;
}

export async function saveSnapshot(s: OfflineSnapshot) {
  await (await fieldDb()).put('snapshots', s);
}

export async function loadSnapshot(surveyId: number): Promise<OfflineSnapshot | undefined> {
  return (await fieldDb()).get('snapshots', surveyId);
}

export async function listSnapshots(): Promise<OfflineSnapshot[]> {
  return (await fieldDb()).getAll('snapshots');
}

export async function enqueue(item: OutboxItem) {
  await (await fieldDb()).put('outbox', item);
}

/** Every waiting or refused item, oldest first (sessions before the records that name them). */
export async function outboxItems(surveyId?: number): Promise<OutboxItem[]> {
  const db = await fieldDb();
  const items = surveyId === undefined ? await db.getAll('outbox') : await db.getAllFromIndex('outbox', 'bySurvey', surveyId);
  return items.sort((a, b) => a.createdAt - b.createdAt);
}

export async function removeItem(key: string) {
  await (await fieldDb()).delete('outbox', key);
}

export async function markRefused(key: string, reason: string) {
  const db = await fieldDb();
  const item = await db.get('outbox', key);
  if (item) await db.put('outbox', { ...item, state: 'refused', reason });
}

/** A record made on this phone, waiting in the outbox under its own idempotency key. */
type WithoutKey<T> = T extends unknown ? Omit<T, 'idempotencyKey'> : never;
export function outboxRecord(surveyId: number, body: WithoutKey<FieldRecordBody>): OutboxItem {
  const key = newKey();
  return { key, surveyId, kind: 'record', state: 'waiting', reason: null, createdAt: Date.now(), body: { ...body, idempotencyKey: key } as FieldRecordBody };
}

/** A new idempotency key for a record made on this phone. */
export function newKey(): string {
  return crypto.randomUUID();
}

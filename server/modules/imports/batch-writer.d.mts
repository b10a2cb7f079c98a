import type Database from 'better-sqlite3';
import type { Batch } from './batch-format.mjs';

export type BatchTarget = { importId: number; surveyId: number; decodeId: number };
/** Import progress to record with a batch (the writer thread keeps log_imports current). */
export type BatchProgress = { progress: number; rowsRead: number };

export function createBatchWriter(client: Database.Database, target: BatchTarget): (batch: Batch, progress?: BatchProgress) => void;

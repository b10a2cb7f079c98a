import type Database from 'better-sqlite3';

export const SAMPLE_WIDTH: 15;
export const READING_WIDTH: 17;

export type BatchTarget = { importId: number; surveyId: number; decodeId: number };
/** Import progress to record with a batch (the writer thread keeps log_imports current). */
export type BatchProgress = { progress: number; rowsRead: number };

export function createBatchWriter(client: Database.Database, target: BatchTarget): (samplesFlat: unknown[], readingsFlat: unknown[], progress?: BatchProgress) => void;

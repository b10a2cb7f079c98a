import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as organizations from './schema/organizations';
import * as calibration from './schema/calibration';
import * as surveys from './schema/surveys';
import * as plans from './schema/plans';
import * as targets from './schema/targets';
import * as emergency from './schema/emergency';
import * as grids from './schema/grids';
import * as jobs from './schema/jobs';
import * as field from './schema/field';
import * as aggregates from './schema/aggregates';

export const schema = { ...organizations, ...calibration, ...surveys, ...plans, ...targets, ...emergency, ...grids, ...jobs, ...field, ...aggregates };
export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

const migrationsFolder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../drizzle');

/** Opens (or creates) the SQLite database with WAL, foreign keys and a busy timeout, and migrates it. */
export function openDatabase(url: string): Db {
  if (url !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(url)), { recursive: true });
  const db = connectDatabase(url);
  migrate(db, { migrationsFolder });
  return db;
}

/** A connection to an existing, migrated database (worker threads open their own). */
export function connectDatabase(url: string): Db {
  const sqlite = new Database(url);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL');
  return drizzle(sqlite, { schema }) as Db;
}

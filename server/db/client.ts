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
  keepPreparedStatements(sqlite);
  return drizzle(sqlite, { schema }) as Db;
}

/** A value built once per connection, e.g. its prepared drizzle queries (building a query costs more than running it). */
export function oncePerConnection<T>(build: (db: Db) => T): (db: Db) => T {
  const built = new WeakMap<Db, T>();
  return (db) => {
    let value = built.get(db);
    if (value === undefined) built.set(db, (value = build(db)));
    return value;
  };
}

/** How many prepared statements a connection keeps (the app runs a few hundred distinct queries). */
export const KEPT_STATEMENTS = 500;

/**
 * Keeps each connection's prepared statements by their SQL text, least recently used first out.
 * Drizzle prepares its statement again on every call, and SQLite's prepare costs about as much as
 * running a small query (a session lookup: 106 µs prepared each time, 60 µs kept), on the event
 * loop of every request. A kept statement is handed out with its row modes back to plain objects
 * (a caller may have set raw or pluck on it); one still mid-iteration is not shared (a fresh one is
 * prepared for the second caller).
 */
function keepPreparedStatements(sqlite: Database.Database) {
  const prepare = sqlite.prepare.bind(sqlite);
  const kept = new Map<string, Database.Statement>();
  sqlite.prepare = ((source: string) => {
    const statement = kept.get(source);
    if (statement && !statement.busy) {
      kept.delete(source);
      kept.set(source, statement);
      return statement.reader ? statement.raw(false).pluck(false).expand(false) : statement;
    }
    const fresh = prepare(source);
    if (!statement) {
      kept.set(source, fresh);
      if (kept.size > KEPT_STATEMENTS) kept.delete(kept.keys().next().value!);
    }
    return fresh;
  }) as typeof sqlite.prepare;
}

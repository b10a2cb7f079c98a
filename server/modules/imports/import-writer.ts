// The import's writes, in their own thread with their own SQLite connection (file databases only),
// so neither the inserts nor the WAL checkpoints they trigger ever hold up the server's event loop.
// Batches arrive straight from the parse worker over a MessagePort as
// { type: 'batch', batch, progress? } (batch-format.ts); each is answered { type: 'ack', error? } once
// committed (the parse worker keeps at most two in flight and waits for all before it ends).
// Bundled with esbuild like the parse worker (import-runner.ts) and run without a TypeScript loader.
import { createRequire } from 'node:module';
import { parentPort, workerData, type MessagePort } from 'node:worker_threads';
import type BetterSqlite3 from 'better-sqlite3';
import { createBatchWriter, type BatchProgress, type BatchTarget } from './batch-writer';
import type { Batch } from './batch-format';
import { lowerThreadPriority } from '../../lib/thread-priority';

/** What the runner hands the thread: the database file, and where to resolve the native driver from (the bundle has no location). */
export type WriterData = { databasePath: string; resolveFrom: string };
export type WriterMessage = { type: 'batch'; batch: Batch; progress?: BatchProgress } | { type: 'close' };

if (!parentPort) throw new Error('import-writer must run in a worker thread');
const data = workerData as WriterData;
// Writing yields the CPU to the event loop answering requests (server/lib/thread-priority.ts).
lowerThreadPriority();
const Database = createRequire(data.resolveFrom)('better-sqlite3') as typeof BetterSqlite3;

// The same settings as server/db/client.ts.
const db = new Database(data.databasePath);
db.pragma('journal_mode = WAL');
db.pragma('foreign_keys = ON');
db.pragma('busy_timeout = 5000');
db.pragma('synchronous = NORMAL');

/** From the runner: an import's target and the port its batches come on, or the end of an idle thread (import-runner.ts). */
export type WriterControl = { type: 'start'; target: BatchTarget; port: MessagePort } | { type: 'end' };

parentPort.on('message', (msg: WriterControl) => {
  if (msg.type === 'end') {
    db.close();
    process.exit(0);
  }
  const write = createBatchWriter(db, msg.target);
  const port = msg.port;
  port.on('message', (m: WriterMessage) => {
    if (m.type === 'close') {
      port.close();
      return;
    }
    try {
      write(m.batch, m.progress);
      port.postMessage({ type: 'ack' });
    } catch (err) {
      port.postMessage({ type: 'ack', error: err instanceof Error ? err.message : String(err) });
    }
  });
});

// The import's writes, in their own thread with their own SQLite connection (file databases only),
// so neither the inserts nor the WAL checkpoints they trigger ever hold up the server's event loop.
// Batches arrive straight from the parse worker over a MessagePort as
// { type: 'batch', batch, progress? } (batch-format.mjs); each is answered { type: 'ack', error? } once
// committed (the parse worker keeps at most two in flight and waits for all before it ends).
// Plain JavaScript, started without the TypeScript loader.
import { parentPort, workerData } from 'node:worker_threads';
import Database from 'better-sqlite3';
import { createBatchWriter } from './batch-writer.mjs';

if (!parentPort) throw new Error('import-writer.mjs must run in a worker thread');

// The same settings as server/db/client.ts.
const db = new Database(workerData.databasePath);
db.pragma('journal_mode = WAL');
db.pragma('foreign_keys = ON');
db.pragma('busy_timeout = 5000');
db.pragma('synchronous = NORMAL');

parentPort.on('message', (msg) => {
  const write = createBatchWriter(db, msg.target);
  const port = msg.port;
  port.on('message', (m) => {
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

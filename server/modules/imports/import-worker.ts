// The import's parse-validate-decode loop, in a worker thread so the server keeps answering.
// It never opens the database: accepted rows go in batches either straight to the import writer
// thread (file databases, over a MessagePort) or to the main thread (in-memory databases), which
// write them; each batch is acknowledged once committed, so at most two are in flight
// (back-pressure), and the end is reported only after every batch is committed.
import { parentPort, type MessagePort } from 'node:worker_threads';
import { parseLogFile, type ParseLogInput, type WorkerToMain } from './log-parser';
import type { WriterMessage } from './import-writer';
import { transferOf } from './batch-format';
import { lowerThreadPriority } from '../../lib/thread-priority';

/** The messages of import-writer.ts's port. */
type WriterBatch = Extract<WriterMessage, { type: 'batch' }>;
type WriterAck = { type: 'ack'; error?: string };

if (!parentPort) throw new Error('import-worker.ts must run in a worker thread');
const port = parentPort;
// Parsing yields the CPU to the event loop answering requests (server/lib/thread-priority.ts).
lowerThreadPriority();

type Start = { type: 'start'; input: ParseLogInput; fileSize: number; writerPort?: MessagePort };

let ackWaiters: (() => void)[] = [];
let acked = 0;
let sent = 0;
let writeError: string | null = null;

function onAck(error?: string) {
  acked++;
  if (error && writeError === null) writeError = error;
  const w = ackWaiters;
  ackWaiters = [];
  for (const f of w) f();
}

/** Resolves once no more than `inFlight` batches are unacknowledged; rejects after a failed write. */
const waitForAcks = (inFlight: number) => new Promise<void>((resolve, reject) => {
  const check = () => (writeError !== null ? reject(new Error(`writing the batch failed: ${writeError}`)) : sent - acked <= inFlight ? resolve() : ackWaiters.push(check));
  check();
});

port.on('message', (msg: Start | { type: 'ack' }) => {
  if (msg.type === 'ack') return onAck();
  acked = 0;
  sent = 0;
  writeError = null;
  const writer = msg.writerPort;
  writer?.on('message', (m: WriterAck) => onAck(m.error));
  let progress: WriterBatch['progress'];
  const finish = (m: WorkerToMain) => {
    writer?.postMessage({ type: 'close' });
    writer?.close();
    port.postMessage(m);
  };
  parseLogFile(msg.input, {
    post: (m: WorkerToMain) => {
      if (m.type === 'batch') {
        sent++;
        // Transferred, not copied: the arrays belong to the receiver from here on.
        if (writer) writer.postMessage({ type: 'batch', batch: m.batch, progress } satisfies WriterBatch, transferOf(m.batch));
        else port.postMessage(m, transferOf(m.batch));
      } else if (m.type === 'progress') {
        // The writer records progress with the next batch; without one the main thread does.
        if (writer) progress = { progress: msg.fileSize > 0 ? Math.min(0.99, m.bytesRead / msg.fileSize) : 0, rowsRead: m.rowsRead };
        else port.postMessage(m);
      } else if (m.type === 'end') {
        waitForAcks(0).then(() => finish(m), (err: Error) => finish({ type: 'crash', message: err.message }));
      } else finish(m);
    },
    drain: () => waitForAcks(1),
  }).catch((err: unknown) => {
    finish({ type: 'crash', message: err instanceof Error ? err.message : String(err) });
  });
});

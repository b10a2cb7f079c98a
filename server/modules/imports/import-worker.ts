// The import's parse-validate-decode loop, in a worker thread so the server keeps answering.
// It never touches the database: accepted rows go to the main thread in batches, which writes
// them; the main thread acknowledges each batch, so at most two are in flight (back-pressure).
import { parentPort } from 'node:worker_threads';
import { parseLogFile, type ParseLogInput, type WorkerToMain } from './log-parser';

if (!parentPort) throw new Error('import-worker.ts must run in a worker thread');
const port = parentPort;

let ackWaiters: (() => void)[] = [];
let acked = 0;
let sent = 0;

port.on('message', (msg: { type: 'start'; input: ParseLogInput } | { type: 'ack' }) => {
  if (msg.type === 'ack') {
    acked++;
    const w = ackWaiters;
    ackWaiters = [];
    for (const f of w) f();
    return;
  }
  acked = 0;
  sent = 0;
  parseLogFile(msg.input, {
    post: (m: WorkerToMain) => {
      if (m.type === 'batch') sent++;
      port.postMessage(m);
    },
    /** Resolves once no more than one batch is unacknowledged. */
    drain: () => new Promise<void>((resolve) => {
      const check = () => (sent - acked <= 1 ? resolve() : ackWaiters.push(check));
      check();
    }),
  }).catch((err: unknown) => {
    port.postMessage({ type: 'crash', message: err instanceof Error ? err.message : String(err) } satisfies WorkerToMain);
  });
});

import fs from 'node:fs';
import os from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import * as esbuild from 'esbuild';
import { describe, expect, it } from 'vitest';
import { BACKGROUND_NICE } from '../../server/lib/thread-priority';

// setpriority() on a thread id is Linux's; elsewhere the helper does nothing (and returns null).
const linux = fs.existsSync('/proc/thread-self');

describe('lowerThreadPriority', () => {
  it.skipIf(!linux)('lowers the nice value of the worker thread that calls it, and not its process\'s main thread', async () => {
    const entry = fileURLToPath(new URL('../../server/lib/thread-priority.ts', import.meta.url));
    const helper = (await esbuild.build({ entryPoints: [entry], bundle: true, platform: 'node', format: 'cjs', write: false, logLevel: 'silent' })).outputFiles[0].text;
    const mainBefore = os.getPriority();
    const code = `const m = {exports: {}}; (function (module, exports) { ${helper} })(m, m.exports);
      const { parentPort } = require('node:worker_threads');
      const answer = m.exports.lowerThreadPriority();
      const tid = Number(/task\\/(\\d+)$/.exec(require('node:fs').readlinkSync('/proc/thread-self'))[1]);
      parentPort.postMessage({ answer, tid, own: require('node:os').getPriority(tid) });`;
    const seen = await new Promise<{ answer: number | null; tid: number; own: number }>((resolve, reject) => {
      const w = new Worker(code, { eval: true });
      w.once('message', (m) => { resolve(m); void w.terminate(); });
      w.once('error', reject);
    });
    expect(seen.tid).not.toBe(process.pid);
    expect(seen.answer).toBe(BACKGROUND_NICE);
    expect(seen.own).toBe(seen.answer);
    // The main thread (its id is the process id) keeps its priority.
    expect(os.getPriority()).toBe(mainBefore);
  });
});

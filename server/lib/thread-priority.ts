import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

/** Linux names the calling thread here, as "PID/task/TID". */
const THREAD_SELF = path.join(path.sep, 'proc', 'thread-self');

/** The nice value background threads take (0 is normal, 19 the lowest): the event loop answering requests gets the CPU first. */
export const BACKGROUND_NICE = 10;

/**
 * Lowers the calling thread's CPU priority, not its process's: on Linux setpriority() on a thread id
 * affects that thread alone, and /proc/thread-self names the caller ("PID/task/TID"). Call it once at
 * the start of each worker thread (import parse and writer, compute pool), so on a machine with as
 * many busy threads as cores the main thread's requests still run first. Elsewhere (no
 * /proc/thread-self, or not permitted) it does nothing and says so by returning null.
 */
export function lowerThreadPriority(nice = BACKGROUND_NICE): number | null {
  try {
    const tid = Number(/\/task\/(\d+)$/.exec(fs.readlinkSync(THREAD_SELF))?.[1]);
    if (!Number.isInteger(tid) || tid <= 0) return null;
    os.setPriority(tid, nice);
    return os.getPriority(tid);
  } catch {
    return null;
  }
}

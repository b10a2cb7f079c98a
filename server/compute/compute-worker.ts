// A compute pool thread (piscina): its own database connection, and the tasks the modules declare.
import v8 from 'node:v8';
import vm from 'node:vm';
import { workerData, type MessagePort } from 'node:worker_threads';
import { connectDatabase } from '../db/client';
import { SERVER_MODULES } from '../modules';
import { runTasksInline, type ComputeTask } from './compute-pool';
import { lowerThreadPriority } from '../lib/thread-priority';

runTasksInline();
// Heavy tasks yield the CPU to the event loop answering requests (server/lib/thread-priority.ts).
lowerThreadPriority();
const db = connectDatabase((workerData as { databasePath: string }).databasePath);
/**
 * A full collection right after a task that left a large heap: a large survey's readings are garbage
 * once its task has answered, and collecting them at once gives their pages back to the system
 * instead of keeping hundreds of MB until V8 next needs the space (the thread may stay for more tasks;
 * V8 unmaps the freed pages within a fraction of a second).
 * Worker threads cannot take --expose-gc, so the flag is set here and gc taken from a new context.
 */
const COLLECT_ABOVE_BYTES = 64 * 1024 * 1024;
v8.setFlagsFromString('--expose-gc');
const collectGarbage = vm.runInNewContext('gc') as () => void;

const tasks = new Map<string, ComputeTask<unknown>>(SERVER_MODULES.flatMap((m) => m.computeTasks ?? []).map((t) => [t.name, t as ComputeTask<unknown>]));

export default async function run(task: { name: string; input: unknown; port: MessagePort }): Promise<unknown> {
  try {
    const found = tasks.get(task.name);
    if (!found) throw new Error(`No compute task "${task.name}" is declared in server/modules.ts`);
    return await found.run(db, task.input, (f) => task.port.postMessage(f));
  } finally {
    task.port.close();
    // Before answering (tens of ms), so the memory is on its way back when the caller goes on; the task's own objects are unreachable by now.
    if (process.memoryUsage().heapUsed > COLLECT_ABOVE_BYTES) collectGarbage();
  }
}

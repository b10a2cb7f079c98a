// A compute pool thread (piscina): its own database connection, and the tasks the modules declare.
import { workerData, type MessagePort } from 'node:worker_threads';
import { connectDatabase } from '../db/client';
import { SERVER_MODULES } from '../modules';
import { runTasksInline, type ComputeTask } from './compute-pool';
import { lowerThreadPriority } from '../lib/thread-priority';

runTasksInline();
// Heavy tasks yield the CPU to the event loop answering requests (server/lib/thread-priority.ts).
lowerThreadPriority();
const db = connectDatabase((workerData as { databasePath: string }).databasePath);
const tasks = new Map<string, ComputeTask<unknown>>(SERVER_MODULES.flatMap((m) => m.computeTasks ?? []).map((t) => [t.name, t as ComputeTask<unknown>]));

export default async function run(task: { name: string; input: unknown; port: MessagePort }): Promise<unknown> {
  try {
    const found = tasks.get(task.name);
    if (!found) throw new Error(`No compute task "${task.name}" is declared in server/modules.ts`);
    return await found.run(db, task.input, (f) => task.port.postMessage(f));
  } finally {
    task.port.close();
  }
}

import fs from 'node:fs';
import path from 'node:path';
import type { Deps } from './deps';
import { failInterruptedImports } from './modules/imports/import-runner';
import { UPLOADS_DIR } from './http/upload';

/**
 * What a previous process left half-done, settled before the server listens: its imports are
 * failed and their rows removed, its temporary uploads deleted (multer's files of requests that
 * never finished), and its running jobs queued again.
 */
export async function prepareStart(deps: Deps): Promise<{ importsFailed: number; uploadsRemoved: number; jobsRequeued: number }> {
  const importsFailed = await failInterruptedImports(deps);
  const uploadsRemoved = removeTemporaryUploads(deps.config.dataDir);
  const jobsRequeued = deps.jobs.recover();
  return { importsFailed, uploadsRemoved, jobsRequeued };
}

/** Every file in the uploads folder is a temporary upload: kept files live in the file store. */
export function removeTemporaryUploads(dataDir: string): number {
  const dir = path.join(dataDir, UPLOADS_DIR);
  if (!fs.existsSync(dir)) return 0;
  let removed = 0;
  for (const name of fs.readdirSync(dir)) {
    fs.rmSync(path.join(dir, name), { recursive: true, force: true });
    removed++;
  }
  return removed;
}

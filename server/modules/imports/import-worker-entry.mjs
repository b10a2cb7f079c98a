// Plain-JS entry of the import worker: registers tsx in this thread so the TypeScript
// worker loads the same way under `tsx` (server), vitest (tests) and the benchmark.
import { register } from 'tsx/esm/api';

register();
await import('./import-worker.ts');

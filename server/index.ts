import type { Server } from 'node:http';
import { ConfigError, loadConfig } from './config';
import { openDatabase } from './db/client';
import { buildDeps } from './deps';
import { systemClock } from './lib/clock';
import { createApp } from './app';
import { seedIfEmpty } from './db/seed';
import { startJobs } from './jobs';
import { prepareStart } from './start-up';
import { closeComputePools } from './compute/compute-pool';

async function main() {
  const dev = process.argv.includes('--dev');
  const config = loadConfig();
  const db = openDatabase(config.databaseUrl);
  const clock = systemClock;
  const deps = buildDeps({ db, clock, config, onJobError: (name, err) => console.error(`Job ${name} failed:`, err instanceof Error ? err.message : err) });
  // Before listening: nothing a client sees may still belong to the process that died.
  await prepareStart(deps);
  const seeded = await seedIfEmpty(deps);
  let clientMiddleware;
  let closeVite = async () => {};
  if (dev) {
    const { createServer } = await import('vite');
    const vite = await createServer({ server: { middlewareMode: true }, appType: 'spa' });
    clientMiddleware = vite.middlewares;
    closeVite = () => vite.close();
  }
  const { app, sessionStore } = createApp(deps, { serveClient: !dev, clientMiddleware });
  const stopJobs = config.runJobs ? startJobs(deps, sessionStore) : async () => {};
  const server: Server = app.listen(config.port, () => {
    const address = server.address();
    const port = typeof address === 'object' && address ? address.port : config.port;
    console.log(`Luxtrail is serving on http://localhost:${port}${seeded ? ' (demo data seeded; sign in as admin@luxtrail.test / luxtrail-demo)' : ''}`);
  });

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal} received: finishing open requests and closing`);
    server.close(async () => {
      await stopJobs();
      await closeComputePools();
      await closeVite();
      db.$client.close();
      process.exit(0);
    });
    server.closeIdleConnections();
    setTimeout(() => process.exit(1), 10_000).unref();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((err) => {
  console.error(err instanceof ConfigError ? err.message : err);
  process.exit(1);
});

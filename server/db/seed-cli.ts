import { loadConfig } from '../config';
import { openDatabase } from './client';
import { buildDeps } from '../deps';
import { systemClock } from '../lib/clock';
import { seedIfEmpty } from './seed';

/** `npm run seed`: migrate and seed the demo scenario into an empty database, then exit. */
const config = loadConfig();
const db = openDatabase(config.databaseUrl);
const deps = buildDeps({ db, clock: systemClock, config });
const seeded = await seedIfEmpty(deps);
console.log(seeded ? `Seeded the demo scenario into ${config.databaseUrl}` : `${config.databaseUrl} already has data; nothing seeded`);
db.$client.close();

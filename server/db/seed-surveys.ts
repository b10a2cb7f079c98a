import fs from 'node:fs';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import type { Deps } from '../deps';
import type { SeedContext } from './seed-context';
import { surveys } from './schema/surveys';
import { DEMO_SITE } from './demo/library-layout';
import { createSite } from '../modules/sites/sites-service';
import { createSurvey } from '../modules/surveys/surveys-service';
import type { SessionUser } from '@shared/schemas/auth';
import { simulateDemoWalk, toLogCsv } from './demo/simulate-log';
import { DEMO_ANALOG_PROBE, DEMO_COUNTING_PROBES } from './demo/demo-probes';
import { loadDecodingCalibration } from '../modules/probes/probe-calibration';
import { uploadLog } from '../modules/imports/imports-service';

/** The demo surveyor, as the seed's actor. */
function seedActor(ctx: SeedContext, email: string, organizationId: number): SessionUser {
  return { id: ctx.usersByEmail[email], email, name: 'seed', role: 'surveyor', organizationId, organizationName: '' };
}

export const DEMO_WALKTHROUGHS = [
  { name: 'Spring walk-through 2026', startedOn: '2026-04-15', startIso: '2026-04-15T08:30:00Z', seed: 415, levelFactor: 1.04, outdoorLux: 18000 },
  { name: 'Autumn walk-through 2026', startedOn: '2026-10-14', startIso: '2026-10-14T08:30:00Z', seed: 1014, levelFactor: 1, outdoorLux: 11000 },
];

/**
 * Survey-log demo data: the library site with two walk-throughs (their logs are imported by the
 * survey-logs step, once the plans they name exist) and a draft, and a site of the second
 * organisation so isolation can be seen.
 */
export async function seedSurveys(deps: Deps, ctx: SeedContext) {
  const surveyor = seedActor(ctx, 'surveyor@luxtrail.test', ctx.demoOrgId);
  const library = createSite(deps, surveyor, DEMO_SITE);
  const otherAdmin = { ...seedActor(ctx, 'admin@elsewhere.test', ctx.otherOrgId), role: 'admin' as const };
  const works = createSite(deps, otherAdmin, { name: 'Quillbank Works, assembly hall', address: '2 Millrace Yard, Quillbank', timeZone: 'Europe/Berlin' });
  createSurvey(deps, otherAdmin, { siteId: works.id, name: 'Assembly hall check', startedOn: '2026-09-02', conditions: { daylightExcluded: true } });

  for (const w of DEMO_WALKTHROUGHS) {
    createSurvey(deps, surveyor, { siteId: library.id, name: w.name, startedOn: w.startedOn, conditions: { daylightExcluded: false, notes: 'Overcast; blinds open; roof reference probe logging' } });
  }
  createSurvey(deps, surveyor, { siteId: library.id, name: 'Winter evening check 2026', startedOn: '2026-12-10', conditions: { daylightExcluded: true, notes: 'After dark, electric lighting only' } });
}

/**
 * Survey-logs step (after plans: each row names its plan): imports the walk-throughs' logs
 * through the real import path, so the demo's readings are real decodes, and submits them.
 */
export async function seedSurveyLogs(deps: Deps, ctx: SeedContext) {
  const surveyor = seedActor(ctx, 'surveyor@luxtrail.test', ctx.demoOrgId);
  const serials = [DEMO_COUNTING_PROBES[0].serial, DEMO_COUNTING_PROBES[1].serial, DEMO_ANALOG_PROBE.serial];
  const calibration = loadDecodingCalibration(deps.db, ctx.demoOrgId);
  const missing = serials.filter((s) => !calibration.has(s));
  for (const w of DEMO_WALKTHROUGHS) {
    const s = deps.db.select().from(surveys).where(and(eq(surveys.organizationId, ctx.demoOrgId), eq(surveys.name, w.name))).get();
    if (!s) continue;
    if (missing.length === 0) {
      const csv = toLogCsv(simulateDemoWalk({ startMs: Date.parse(w.startIso), seed: w.seed, levelFactor: w.levelFactor, outdoorLux: w.outdoorLux }), DEMO_SITE.timeZone);
      const dir = path.join(deps.config.dataDir, 'uploads');
      fs.mkdirSync(dir, { recursive: true });
      const tmp = path.join(dir, `seed-${s.id}.csv`);
      fs.writeFileSync(tmp, csv);
      const { done } = await uploadLog(deps, surveyor, s.id, { path: tmp, originalname: `${w.startedOn}-library-walk.csv`, size: csv.length });
      const outcome = await done;
      if (outcome.status !== 'done') console.warn(`Demo log of "${w.name}" was rejected: ${outcome.errors.slice(0, 3).map((e) => `line ${e.line} ${e.column}: ${e.message}`).join('; ')}`);
    } else {
      console.warn(`Demo surveys have no logs: probes ${missing.join(', ')} are not seeded (calibration seed step missing?)`);
    }
    deps.db.update(surveys).set({ status: 'submitted', submittedBy: surveyor.id, submittedAt: ctx.now }).where(eq(surveys.id, s.id)).run();
  }
}

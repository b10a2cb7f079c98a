import { eq } from 'drizzle-orm';
import type { Deps } from '../deps';
import { SEED_STEPS, type SeedContext } from './seed';
import { surveys } from './schema/surveys';
import { DEMO_SITE } from './demo/library-layout';
import { createSite } from '../modules/sites/sites-service';
import { createSurvey } from '../modules/surveys/surveys-service';
import type { SessionUser } from '@shared/schemas/auth';

/** The demo surveyor, as the seed's actor. */
function seedActor(ctx: SeedContext, email: string, organizationId: number): SessionUser {
  return { id: ctx.usersByEmail[email], email, name: 'seed', role: 'surveyor', organizationId, organizationName: '' };
}

/**
 * Survey-log demo data: the library site with two submitted walk-throughs and a draft,
 * and a site of the second organisation so isolation can be seen.
 */
export async function seedSurveys(deps: Deps, ctx: SeedContext) {
  const surveyor = seedActor(ctx, 'surveyor@luxtrail.test', ctx.demoOrgId);
  const library = createSite(deps, surveyor, DEMO_SITE);
  const otherAdmin = { ...seedActor(ctx, 'admin@elsewhere.test', ctx.otherOrgId), role: 'admin' as const };
  const works = createSite(deps, otherAdmin, { name: 'Quillbank Works, assembly hall', address: '2 Millrace Yard, Quillbank', timeZone: 'Europe/Berlin' });
  createSurvey(deps, otherAdmin, { siteId: works.id, name: 'Assembly hall check', startedOn: '2026-09-02', conditions: { daylightExcluded: true } });

  const walkthroughs = [
    { name: 'Spring walk-through 2026', startedOn: '2026-04-15' },
    { name: 'Autumn walk-through 2026', startedOn: '2026-10-14' },
  ];
  for (const w of walkthroughs) {
    const s = createSurvey(deps, surveyor, { siteId: library.id, name: w.name, startedOn: w.startedOn, conditions: { daylightExcluded: false, notes: 'Overcast; blinds open; roof reference probe logging' } });
    deps.db.update(surveys).set({ status: 'submitted', submittedBy: surveyor.id, submittedAt: ctx.now }).where(eq(surveys.id, s.id)).run();
  }
  createSurvey(deps, surveyor, { siteId: library.id, name: 'Winter evening check 2026', startedOn: '2026-12-10', conditions: { daylightExcluded: true, notes: 'After dark, electric lighting only' } });
}

SEED_STEPS.push({ name: 'surveys', run: seedSurveys });

import { sql } from 'drizzle-orm';
import type { Deps } from '../deps';
import { organizations, users } from './schema/organizations';
import { hashPassword } from '../modules/auth/passwords';
import type { Role } from '@shared/roles';
import type { SeedContext } from './seed-context';
import { SERVER_MODULES } from '../modules';

export const DEMO_PASSWORD = 'luxtrail-demo';


const DEMO_USERS: { email: string; name: string; role: Role; org: 'demo' | 'other' }[] = [
  { email: 'admin@luxtrail.test', name: 'Imogen Aldercott', role: 'admin', org: 'demo' },
  { email: 'surveyor@luxtrail.test', name: 'Tobias Wrenfield', role: 'surveyor', org: 'demo' },
  { email: 'calibration@luxtrail.test', name: 'Priya Calloway', role: 'calibration', org: 'demo' },
  { email: 'calibration2@luxtrail.test', name: 'Osric Penhallow', role: 'calibration', org: 'demo' },
  { email: 'facilities@luxtrail.test', name: 'Marguerite Oakhurst', role: 'facility_manager', org: 'demo' },
  { email: 'facilities@elsewhere.test', name: 'Dariusz Thornbury', role: 'facility_manager', org: 'other' },
  { email: 'admin@elsewhere.test', name: 'Selma Quarrington', role: 'admin', org: 'other' },
];

/**
 * Seeds the invented demo scenario when the database has no organisation yet:
 * the Fernmoor Civic Trust, which runs a two-storey community library, and a second,
 * unrelated organisation (Quillbank Works) so that isolation can be seen.
 */
export async function seedIfEmpty(deps: Deps): Promise<boolean> {
  const count = deps.db.select({ n: sql<number>`count(*)` }).from(organizations).get()!.n;
  if (count > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const now = deps.clock.now();
  const ctx = deps.db.transaction((tx): SeedContext => {
    const demo = tx.insert(organizations).values({ name: 'Fernmoor Civic Trust', decisionRule: 'guarded', createdAt: now }).returning().get();
    const other = tx.insert(organizations).values({ name: 'Quillbank Works', decisionRule: 'simple', createdAt: now }).returning().get();
    const usersByEmail: Record<string, number> = {};
    for (const u of DEMO_USERS) {
      const row = tx.insert(users).values({ organizationId: u.org === 'demo' ? demo.id : other.id, email: u.email, name: u.name, role: u.role, status: 'active', passwordHash, createdAt: now }).returning().get();
      usersByEmail[u.email] = row.id;
    }
    return { now, demoOrgId: demo.id, otherOrgId: other.id, usersByEmail };
  });
  // Then each module's demo data, in the order of the module list.
  for (const m of SERVER_MODULES) if (m.seed) await m.seed(deps, ctx);
  return true;
}

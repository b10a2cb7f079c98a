import { describe, it, expect, beforeAll } from 'vitest';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { CAPABILITIES } from '@shared/policy';
import { ROLES, type Role } from '@shared/roles';
import type { RouteExamples, ExampleRequest } from './route-examples/types';
import { foundationExamples } from './route-examples/foundation';
import { surveyExamples } from './route-examples/surveys';
import { planExamples } from './route-examples/plans';
import { calibrationExamples } from './route-examples/calibration';
import { complianceExamples } from './route-examples/compliance';
import { emergencyExamples } from './route-examples/emergency';
import { placementExamples, plannedPointExamples, walkSheetExamples } from './route-examples/planned-points';
import { fieldExamples } from './route-examples/field';

// Every feature adds its examples here; a route without one fails the first test.
const EXAMPLES: RouteExamples = { ...foundationExamples, ...surveyExamples, ...planExamples, ...calibrationExamples, ...complianceExamples, ...emergencyExamples, ...plannedPointExamples, ...placementExamples, ...walkSheetExamples, ...fieldExamples };

const ROLE_ACCOUNT: Record<Role, string> = {
  admin: DEMO.admin, surveyor: DEMO.surveyor, calibration: DEMO.calibration, facility_manager: DEMO.facility_manager,
};

let t: TestApp;
beforeAll(async () => { t = await createTestApp({ signInLimits: { perAddress: 100_000, perAccount: 100_000 }, resetLimits: { perAddress: 100_000, perAccount: 100_000 } }); });

async function send(c: TestClient, method: string, ex: ExampleRequest) {
  const m = method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
  const req = c[m](ex.path);
  if (ex.files) {
    for (const [field, f] of Object.entries(ex.files)) req.attach(field, f.content, { filename: f.filename, contentType: f.contentType });
    for (const [k, v] of Object.entries(ex.fields ?? {})) req.field(k, v);
    return req;
  }
  return ex.body !== undefined ? req.send(ex.body as object) : req;
}

describe('route-by-role matrix (README table, shared/policy.ts)', () => {
  it('has an example request for every route in the table', () => {
    const missing = t.routes.map((r) => `${r.method} ${r.path}`).filter((k) => !EXAMPLES[k]);
    expect(missing).toEqual([]);
  });

  it('answers 401 to every non-public route without a session', async () => {
    for (const r of t.routes.filter((r) => r.access !== 'public')) {
      const ex = await EXAMPLES[`${r.method} ${r.path}`](t, 'anonymous');
      const res = await send(t.client(), r.method, ex);
      expect(res.status, `${r.method} ${r.path}`).toBe(401);
    }
  }, 180_000);

  for (const role of ROLES) {
    it(`gives ${role} 2xx where the policy allows and 403 where it does not`, async () => {
      const c = await t.signIn(ROLE_ACCOUNT[role]);
      for (const r of t.routes) {
        const ex = await EXAMPLES[`${r.method} ${r.path}`](t, role);
        // Sign-in routes change the session; use a separate client for them.
        const client = r.path.startsWith('/auth/') && r.path !== '/auth/me' ? t.client() : c;
        const res = await send(client, r.method, ex);
        const allowed = r.access === 'public' || r.access === 'signed_in' || (CAPABILITIES[r.access] as readonly string[]).includes(role);
        const label = `${role} ${r.method} ${r.path} -> ${res.status} ${JSON.stringify(res.body?.error ?? '')}`;
        if (allowed) {
          if (ex.okStatus) expect(res.status, label).toBe(ex.okStatus);
          else expect(res.status >= 200 && res.status < 300, label).toBe(true);
        } else expect(res.status, label).toBe(403);
      }
    }, 180_000); // every route in turn: minutes on a busy shared machine
  }
});

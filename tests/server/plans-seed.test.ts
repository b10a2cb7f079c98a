import { describe, it, expect, beforeAll } from 'vitest';
import { PNG } from 'pngjs';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { DEMO_PLANS, DEMO_SITE } from '@server/db/demo/library-layout';
import type { Plan } from '@shared/schemas/plans';
import type { Zone } from '@shared/schemas/zones';

let t: TestApp;
let fm: TestClient;
let plans: Plan[];

beforeAll(async () => {
  t = await createTestApp();
  fm = await t.signIn(DEMO.facility_manager);
  const site = (await fm.get('/api/sites')).body.items.find((s: { name: string }) => s.name === DEMO_SITE.name);
  plans = (await fm.get(`/api/sites/${site.id}/plans`)).body.items;
});

describe('seed step 3 (plans)', () => {
  it('seed, for the demo library, makes each DEMO_PLANS plan at its width with 20 px per metre', () => {
    expect(plans.map((p) => p.name)).toEqual(DEMO_PLANS.map((p) => p.name));
    for (const [i, p] of plans.entries()) {
      expect(p.widthM).toBeCloseTo(DEMO_PLANS[i].widthM, 9);
      expect(p.heightM).toBeCloseTo(DEMO_PLANS[i].heightM, 9);
      expect(p.widthPx).toBe(DEMO_PLANS[i].widthM * 20);
    }
  });

  it('seed, for each demo plan, creates its zones with the layout\'s kinds, use types and corners', async () => {
    for (const [i, p] of plans.entries()) {
      const zones: Zone[] = (await fm.get(`/api/plans/${p.id}/zones`)).body.items;
      expect(zones.map((z) => [z.name, z.kind, z.useType, z.polygon])).toEqual(DEMO_PLANS[i].zones.map((z) => [z.name, z.kind, z.useType, z.polygon]));
    }
  });

  it('seed, for the ground floor, draws a PNG image with walls and fills (more than 3 distinct colours)', async () => {
    const res = await fm.get(`/api/plans/${plans[0].id}/image`).buffer(true);
    const png = PNG.sync.read(res.body as Buffer);
    expect([png.width, png.height]).toEqual([720, 400]);
    const colours = new Set<number>();
    for (let i = 0; i < png.data.length; i += 4) colours.add((png.data[i] << 16) | (png.data[i + 1] << 8) | png.data[i + 2]);
    expect(colours.size).toBeGreaterThan(3);
  });

  it('seed, for the second organisation, gives its site a plan the demo organisation cannot see', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const site = (await other.get('/api/sites')).body.items[0];
    const theirs: Plan[] = (await other.get(`/api/sites/${site.id}/plans`)).body.items;
    expect(theirs).toHaveLength(1);
    expect((await fm.get(`/api/plans/${theirs[0].id}/image`)).status).toBe(404);
    expect((await fm.get(`/api/sites/${site.id}/plans`)).status).toBe(404);
  });
});

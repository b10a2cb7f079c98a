import { describe, it, expect, beforeAll } from 'vitest';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { LABEL_WALK } from '@server/db/demo/label-walk';

let t: TestApp;
// The demo seed imports four logs: give it time on a busy machine.
beforeAll(async () => { t = await createTestApp(); }, 180_000);

describe('demo label walk (planned-points seed step, through the real import)', () => {
  it('the log names planned points by label only, and every reading lands on the ground floor at its planned point', async () => {
    const surveyor = await t.signIn(DEMO.surveyor);
    const survey = (await surveyor.get('/api/surveys')).body.items.find((s: { name: string }) => s.name === LABEL_WALK.name);
    expect(survey).toBeDefined();
    const detail = (await surveyor.get(`/api/surveys/${survey.id}`)).body;
    expect(detail.imports).toHaveLength(1);
    const imp = (await surveyor.get(`/api/imports/${detail.imports[0].id}`)).body;
    expect(imp.status).toBe('done');
    // No row carries x_m/y_m: every reading is placed by its label, none by coordinates, none left over.
    expect(imp.placement).toEqual({ byCoordinates: 0, byLabel: imp.readings, none: 0 });
    expect(imp.readings).toBeGreaterThan(0);

    const planned = (await surveyor.get(`/api/surveys/${survey.id}/planned-points`)).body;
    expect(planned.grids.map((g: { zoneName: string }) => g.zoneName).sort()).toEqual([...LABEL_WALK.zones].sort());
    const byLabel = new Map<string, { planId: number; xM: number; yM: number; readingCount: number }>(planned.items.map((p: { label: string; planId: number; xM: number; yM: number; readingCount: number }) => [p.label, p]));
    // Every planned point was visited.
    expect(planned.items.filter((p: { readingCount: number }) => p.readingCount === 0)).toEqual([]);

    const readings = (await surveyor.get(`/api/surveys/${survey.id}/readings?limit=5000`)).body;
    expect(readings.total).toBe(imp.readings);
    for (const r of readings.items as { point: string; planId: number | null; xM: number | null; yM: number | null }[]) {
      const p = byLabel.get(r.point);
      expect(p, `reading at ${r.point}`).toBeDefined();
      expect([r.planId, r.xM, r.yM]).toEqual([p!.planId, p!.xM, p!.yM]);
    }
    const unplaced = (await surveyor.get(`/api/surveys/${survey.id}/unplaced`)).body;
    expect(unplaced.total).toBe(0);
  });
});

import { describe, it, expect, beforeAll } from 'vitest';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { DEMO_EMERGENCY_SURVEY } from '@server/db/seed-emergency';

let t: TestApp;
beforeAll(async () => { t = await createTestApp(); });

describe('demo emergency lighting (seed step 5, through the real import)', () => {
  it('the library\'s corridor route falls short at its far end at the end of the rated duration; the stair meets; both passes are measured', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const list = await fm.get('/api/emergency/surveys');
    const item = list.body.items.find((s: { name: string }) => s.name === DEMO_EMERGENCY_SURVEY);
    const s = (await fm.get(`/api/emergency/surveys/${item.surveyId}`)).body;
    expect(s.passes.map((p: { readings: number }) => p.readings)).toEqual([40, 40]);
    expect(s.readingsUnmatched).toBe(0);
    const by = (code: string) => s.elements.find((e: { element: { code: string } }) => e.element.code === code);
    expect(by('R1').verdict).toBe('falls_short');
    expect(by('R1').worstPoint).toMatchObject({ label: 'R1-C05', pass: 'end_of_duration' });
    const failing = by('R1').points.filter((p: { verdict: string }) => p.verdict === 'falls_short').map((p: { label: string; pass: string }) => `${p.label}/${p.pass}`);
    expect(failing).toEqual(['R1-C05/end_of_duration']);
    expect(by('S1').element.stair).toBe(true);
    expect(by('S1').verdict).toBe('meets');
    expect(by('A1').verdict).toBe('meets');
    expect(by('E1').verdict).toBe('meets');
    // Every reading shows its uncertainty; at these levels it is a few per cent.
    const far = by('R1').points.find((p: { label: string; pass: string }) => p.label === 'R1-C05' && p.pass === 'end_of_duration');
    expect(far.lux).toBeGreaterThan(0.3);
    expect(far.lux).toBeLessThan(1);
    expect(far.uLux / far.lux).toBeGreaterThan(0.01);
    expect(far.uLux / far.lux).toBeLessThan(0.1);
  });

  it('the library\'s logbook has one overdue test: the functional test, 10 days late', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const due = (await fm.get('/api/emergency/tests-due')).body;
    const library = due.sites.find((s: { siteName: string }) => s.siteName === 'Fernmoor Community Library');
    expect(library.due.map((d: { kind: string; state: string; daysOverdue: number }) => [d.kind, d.state, d.daysOverdue])).toEqual([['functional', 'overdue', 10], ['full_duration', 'ok', 0]]);
  });
});

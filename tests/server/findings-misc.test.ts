import { describe, it, expect, beforeAll } from 'vitest';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { describeAuditEvent } from '@shared/audit-labels';
import { decideZone } from '@shared/core/decision';
import { formatDisplayNumber } from '@shared/display-number';
import type { ZoneStats } from '@shared/core/zone-stats';

let t: TestApp;
beforeAll(async () => { t = await createTestApp(); });

describe('GET /api/auth/session', () => {
  it('answers 200 with no user when signed out, and the user when signed in', async () => {
    const anon = await t.client().get('/api/auth/session');
    expect(anon.status).toBe(200);
    expect(anon.body).toEqual({ user: null });
    const c = await t.signIn(DEMO.surveyor);
    const me = await c.get('/api/auth/session');
    expect(me.body.user.email).toBe(DEMO.surveyor);
  });
});

describe('the survey list, newest first', () => {
  it('orders by the survey\'s start date, not by when it was created', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const site = (await c.post('/api/sites').send({ name: 'Ordering depot', timeZone: 'Europe/London' })).body;
    // Created first but started last: it comes first.
    await c.post('/api/surveys').send({ siteId: site.id, name: 'Late start', startedOn: '2026-11-20' });
    await c.post('/api/surveys').send({ siteId: site.id, name: 'Early start', startedOn: '2026-03-02' });
    await c.post('/api/surveys').send({ siteId: site.id, name: 'Middle start', startedOn: '2026-07-09' });
    const list = (await c.get(`/api/surveys?siteId=${site.id}`)).body.items.map((s: { name: string }) => s.name);
    expect(list).toEqual(['Late start', 'Middle start', 'Early start']);
  });
});

describe('words people read instead of stored codes', () => {
  it('an audit event reads as a sentence with the record\'s name', () => {
    expect(describeAuditEvent({ action: 'report_sent', entityType: 'survey', entityId: 5, after: { recipients: ['a@b.test'], filename: 'x.pdf' } })).toBe('sent the report of survey #5');
    expect(describeAuditEvent({ action: 'scale_set', entityType: 'plan', entityId: 5, after: { name: 'Ground floor' } })).toBe('set the scale of plan “Ground floor” (#5)');
    expect(describeAuditEvent({ action: 'imported', entityType: 'log_import', entityId: 5 })).toBe('imported meter log #5');
  });

  it('a reason prints the uncertainty with the same rounding as the table (16.5, not 16)', () => {
    const stats = { validPoints: 9, eavg: 420, emin: 380, emax: 460, u0: 380 / 420, uEavg: 16.5, uU0: 0.05, bounded: { eavg: null, emin: null, u0: null }, reasons: [] } as unknown as ZoneStats;
    const v = decideZone(stats, { emLux: 400 }, 'guarded');
    expect(formatDisplayNumber(16.5)).toBe('16.5');
    expect(v.reasons[0]).toBe('Eavg 420 lx ± 16.5 lx against 400 lx: meets.');
  });
});

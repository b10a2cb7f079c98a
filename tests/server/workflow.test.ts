import { describe, it, expect, beforeEach } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { buildSurvey, insertDecode, OFFICE_AND_CORRIDOR, officeAndCorridorReadings } from './support/factories';
import { outboxAttachments, outboxMessages } from '@server/db/schema/organizations';
import { surveys } from '@server/db/schema/surveys';
import { RULE_TEXT } from '@shared/core/decision';

let t: TestApp;
beforeEach(async () => { t = await createTestApp(); });

const attachmentsOf = (messageId: number) => t.db.select().from(outboxAttachments).where(eq(outboxAttachments.messageId, messageId)).all();

describe('POST /api/surveys/:id/submit', () => {
  it('a draft with readings, when the surveyor submits it, becomes submitted, is audited and reviewers are told', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const c = await t.signIn(DEMO.surveyor);
    const res = await c.post(`/api/surveys/${surveyId}/submit`).send({ note: 'All floors done' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'submitted', submittedByName: 'Tobias Wrenfield' });
    expect(res.body.notified).toContain(DEMO.facility_manager);
    const mail = t.lastMail()!;
    expect(mail.subject).toMatch(/submitted for review/);
    expect(mail.text).toContain('All floors done');
    const audit = await (await t.signIn(DEMO.admin)).get(`/api/audit?surveyId=${surveyId}`);
    expect(audit.body.items.map((e: { action: string }) => e.action)).toContain('submitted');
  });

  it('a survey that is already submitted, when submitted again, answers 409', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const res = await (await t.signIn(DEMO.surveyor)).post(`/api/surveys/${surveyId}/submit`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/only a draft or a returned survey/);
  });
});

describe('POST /api/surveys/:id/sign-off', () => {
  it('a submitted survey, when the facility manager signs it off, is frozen, audited, and the surveyor gets the report', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.post(`/api/surveys/${surveyId}/sign-off`).send({ comment: 'Corridor relamping ordered' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'signed_off', signedOffByName: 'Marguerite Oakhurst', reviewComment: 'Corridor relamping ordered' });
    const row = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
    const frozen = row.frozen as { rule: string; zones: { verdict: string }[]; targets: { useType: string }[]; coefficientSets: { certificateNumber: string }[] };
    expect(frozen.rule).toBe('guarded');
    expect(frozen.zones.map((z) => z.verdict).sort()).toEqual(['falls_short', 'meets']);
    expect(frozen.targets.map((x) => x.useType).sort()).toEqual(['corridor', 'office_writing']);
    expect(frozen.coefficientSets[0].certificateNumber).toMatch(/^FX-CERT-/);

    const mail = t.lastMail()!;
    expect(mail.to).toContain(DEMO.surveyor);
    expect(mail.to).toContain(DEMO.facility_manager);
    expect(mail.text).toContain('2 zones: 1 meets its target, 1 falls short, 0 are inconclusive, 0 are not assessed (decision rule: guarded).');
    // Queued with the sign-off; the runner builds the frozen report and delivers it.
    expect(mail.status).toBe('queued');
    expect(attachmentsOf(mail.id)).toEqual([]);
    await t.deliverMail();
    expect(t.lastMail()).toMatchObject({ id: mail.id, status: 'sent', attempts: 1, pendingAttachments: null });
    const [pdf] = attachmentsOf(mail.id);
    expect(pdf.contentType).toBe('application/pdf');
    expect(pdf.content.subarray(0, 5).toString()).toBe('%PDF-');

    const audit = await (await t.signIn(DEMO.admin)).get(`/api/audit?surveyId=${surveyId}`);
    const signed = audit.body.items.find((e: { action: string }) => e.action === 'signed_off');
    expect(signed.after).toMatchObject({ rule: 'guarded', counts: { meets: 1, falls_short: 1 } });
  });

  it('a signed-off survey, when targets, the zone\'s entry and the rule change later, keeps its frozen verdicts', async () => {
    const { surveyId, zoneIds } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings(502) });
    const admin = await t.signIn(DEMO.admin);
    const own = await admin.post('/api/targets').send({ useType: 'office_writing', name: 'Trust office standard', emValue: 480, u0Min: 0.6, source: 'Trust lighting policy 2026, section 2' });
    expect(own.status).toBe(201);
    const before = (await admin.get(`/api/surveys/${surveyId}/compliance`)).body;
    const officeBefore = before.zones.find((z: { name: string }) => z.name === 'Fixture office');
    expect(officeBefore).toMatchObject({ targetId: own.body.id, targetLux: 480, verdict: 'meets' });

    await (await t.signIn(DEMO.facility_manager)).post(`/api/surveys/${surveyId}/sign-off`).send({});
    await admin.patch(`/api/targets/${own.body.id}`).send({ emValue: 750 });
    await admin.put(`/api/zones/${zoneIds.corridor}/target`).send({ targetId: own.body.id });
    await admin.patch('/api/organization').send({ decisionRule: 'simple' });

    const after = (await admin.get(`/api/surveys/${surveyId}/compliance`)).body;
    expect(after).toMatchObject({ frozen: true, rule: 'guarded', ruleText: RULE_TEXT.guarded });
    expect(after.zones).toEqual(before.zones);
    // The same edits do change a survey that is not signed off: the comparison shows the freeze is real.
    const live = buildSurvey(t, { ownerEmail: DEMO.surveyor, siteName: 'Live site', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings(502) });
    const liveOffice = (await admin.get(`/api/surveys/${live.surveyId}/compliance`)).body.zones.find((z: { name: string }) => z.name === 'Fixture office');
    expect(liveOffice).toMatchObject({ targetLux: 750, verdict: 'falls_short' });
    expect((await admin.get(`/api/surveys/${live.surveyId}/compliance`)).body.rule).toBe('simple');
  });

  it('a signed-off survey, when re-decoded later into different readings, keeps its frozen verdicts and exports', async () => {
    const f = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const fm = await t.signIn(DEMO.facility_manager);
    await fm.post(`/api/surveys/${f.surveyId}/sign-off`).send({});
    const before = (await fm.get(`/api/surveys/${f.surveyId}/compliance`)).body;
    const csvBefore = (await fm.get(`/api/surveys/${f.surveyId}/compliance/readings.csv`)).text;
    // A later decode (e.g. corrected coefficients) becomes the active one with every reading at 10 lx.
    insertDecode(t, f.surveyId, [{ point: 'X', xM: 1, yM: 1, role: 'task', timeMs: t.clock.now(), probeId: f.probeId, lux: 10, uLux: 0.4, luxBound: 'exact', flag: 'ok', sampleCount: 1 }]);
    const after = (await fm.get(`/api/surveys/${f.surveyId}/compliance`)).body;
    expect(after.zones).toEqual(before.zones);
    expect((await fm.get(`/api/surveys/${f.surveyId}/compliance/readings.csv`)).text).toBe(csvBefore);
  });

  it('a survey, when the person who submitted it tries to sign it off, answers 403 four_eyes (the same code as coefficient-set approval)', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.admin, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post(`/api/surveys/${surveyId}/sign-off`).send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('four_eyes');
    expect(res.body.error.message).toMatch(/another reviewer/);
    // The answer the page reads says the same: the submitter may return it but not sign it off.
    const c = (await admin.get(`/api/surveys/${surveyId}/compliance`)).body;
    expect(c.abilities).toMatchObject({ signOff: false, return: true, submit: false, upload: false });
    const fm = (await (await t.signIn(DEMO.facility_manager)).get(`/api/surveys/${surveyId}/compliance`)).body;
    expect(fm.abilities).toMatchObject({ signOff: true, return: true, submit: false, upload: false });
  });

  it('a draft, when signed off, answers 409 and stays a draft with nothing frozen', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const res = await (await t.signIn(DEMO.facility_manager)).post(`/api/surveys/${surveyId}/sign-off`).send({});
    expect(res.status).toBe(409);
    expect(t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()).toMatchObject({ status: 'draft', frozen: null });
  });

  it('a second survey of the site, when judged after the first is signed off, shows each zone\'s change', async () => {
    const first = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Earlier', startedOn: '2026-04-15', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings(540, 85) });
    const fm = await t.signIn(DEMO.facility_manager);
    await fm.post(`/api/surveys/${first.surveyId}/sign-off`).send({});
    const second = buildSurvey(t, {
      ownerEmail: DEMO.surveyor, siteId: first.siteId, surveyName: 'Later', startedOn: '2026-10-14', zones: OFFICE_AND_CORRIDOR,
      readings: officeAndCorridorReadings(540, 120), reuse: first,
    });
    const res = (await fm.get(`/api/surveys/${second.surveyId}/compliance`)).body;
    expect(res.previous).toMatchObject({ surveyId: first.surveyId, name: 'Earlier' });
    const corridor = res.zones.find((z: { name: string }) => z.name === 'Fixture corridor');
    expect(corridor.change).toMatchObject({ previousVerdict: 'falls_short', verdictChanged: true });
    expect(corridor.change.deltaEavg).toBeCloseTo(35, 6);
    const office = res.zones.find((z: { name: string }) => z.name === 'Fixture office');
    expect(office.change).toMatchObject({ previousVerdict: 'meets', verdictChanged: false });
    expect(office.change.deltaEavg).toBeCloseTo(0, 6);
  });
});

describe('POST /api/surveys/:id/return', () => {
  it('a submitted survey, when returned with a comment, goes back to the surveyor by e-mail', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.post(`/api/surveys/${surveyId}/return`).send({ comment: 'Please re-measure the corridor with the tripod' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'returned', reviewComment: 'Please re-measure the corridor with the tripod', notified: [DEMO.surveyor] });
    const mail = t.db.select().from(outboxMessages).where(and(eq(outboxMessages.to, DEMO.surveyor))).all().at(-1)!;
    expect(mail.subject).toMatch(/returned for changes/);
    expect(mail.text).toContain('re-measure the corridor');
    // Returned surveys can be submitted again.
    expect((await (await t.signIn(DEMO.surveyor)).post(`/api/surveys/${surveyId}/submit`).send({})).body.status).toBe('submitted');
  });

  it('a return without a comment, when posted, answers 400 naming the field and changes nothing', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const res = await (await t.signIn(DEMO.facility_manager)).post(`/api/surveys/${surveyId}/return`).send({ comment: ' ' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/comment/);
    expect(t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!.status).toBe('submitted');
  });
});

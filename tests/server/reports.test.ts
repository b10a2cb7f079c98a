import { describe, it, expect, beforeEach } from 'vitest';
import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { binary, pdfText } from './pdf-text';
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { buildSurvey, OFFICE_AND_CORRIDOR, officeAndCorridorReadings } from './support/factories';
import { outboxAttachments } from '@server/db/schema/organizations';
import { RULE_TEXT } from '@shared/core/decision';
import { GRID_RULE } from '@shared/core/zone-stats';
import { BOUND_FOOTNOTE } from '@server/modules/reports/report-pdf';
import { formatDisplayNumber } from '@shared/display-number';

let t: TestApp;
beforeEach(async () => { t = await createTestApp(); });

describe('GET /api/surveys/:id/report.pdf', () => {
  it('a survey report, when generated, is a PDF whose text holds the summary values, method, probes and cautions', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Report check', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const compliance = (await (await t.signIn(DEMO.facility_manager)).get(`/api/surveys/${surveyId}/compliance`)).body;
    const c = await t.signIn(DEMO.facility_manager);
    const res = await c.get(`/api/surveys/${surveyId}/report.pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toMatch(/luxtrail-report-\d+-report-check-provisional\.pdf/);
    const text = await pdfText(res.body);
    const corridor = compliance.zones.find((z: { name: string }) => z.name === 'Fixture corridor');
    const office = compliance.zones.find((z: { name: string }) => z.name === 'Fixture office');
    // Summary values as the compliance answer gives them, formatted as the report prints them.
    expect(text).toContain(`${corridor.eavg.toFixed(1)} lx ± ${corridor.uEavg.toFixed(2)} lx`);
    expect(text).toContain(`${office.eavg.toFixed(0)} lx ± ${office.uEavg.toFixed(1)} lx`);
    expect(text).toContain(`${corridor.points} / ${corridor.requiredPoints}`);
    expect(text).toContain('Falls short');
    expect(text).toContain('Meets target');
    expect(text).toContain('Fixture site');
    expect(text).toContain(GRID_RULE);
    expect(text).toContain(RULE_TEXT.guarded.slice(0, 60));
    expect(text).toMatch(/FX-CERT-\d+/);
    expect(text).toContain('Not signed off');
    // DOMAIN.md section 7 cautions.
    expect(text).toContain('does not certify emergency lighting');
    expect(text).toContain('Local codes and regulations take precedence');
    expect(text).toMatch(/k = 2/);
  });

  it('a zone whose figures are bounds (an over-range point), when reported, is marked in the summary and the mark is explained', async () => {
    // One office point over range: Eavg and Emin become lower bounds (their exact value is unknown).
    const readings = officeAndCorridorReadings().map((r, i) => (i === 3 ? { ...r, lux: 150_000, flag: 'over_range' as const, luxBound: 'lower' as const } : r));
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings });
    const c = await t.signIn(DEMO.surveyor);
    const office = (await c.get(`/api/surveys/${surveyId}/compliance`)).body.zones.find((z: { name: string }) => z.name === 'Fixture office');
    expect(office.bounds.eavg).toBe('lower');
    const text = await pdfText((await c.get(`/api/surveys/${surveyId}/report.pdf`).buffer(true).parse(binary)).body);
    // The summary writes the direction of the bound (≥ at least), not a bare mark.
    expect(text).toContain(`≥ ${formatDisplayNumber(office.eavg)} lx ± ${formatDisplayNumber(office.uEavg)} lx`);
    expect(text).toContain(BOUND_FOOTNOTE.slice(0, 50));
    expect(text).toContain('(a lower bound)');
    expect(text).not.toMatch(/lx \*/);
    // The zone plot's legend explains the triangle drawn for the over-range point.
    expect(text).toContain('open triangle up: over range (at least)');
  });

  it('a report with no bounded figure, when generated, has no bound footnote', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const c = await t.signIn(DEMO.surveyor);
    const text = await pdfText((await c.get(`/api/surveys/${surveyId}/report.pdf`).buffer(true).parse(binary)).body);
    expect(text).not.toContain(BOUND_FOOTNOTE.slice(0, 50));
  });

  it('a report, when generated, uses only characters its fonts can draw: Instrument Sans, or DejaVu Sans for ±, ≤ and ≥', async () => {
    const readings = officeAndCorridorReadings().map((r, i) => (i === 3 ? { ...r, lux: 150_000, flag: 'over_range' as const, luxBound: 'lower' as const } : r));
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings });
    const c = await t.signIn(DEMO.surveyor);
    const text = await pdfText((await c.get(`/api/surveys/${surveyId}/report.pdf`).buffer(true).parse(binary)).body);
    const require = createRequire(import.meta.url);
    const open = (file: string) => fontkit.openSync(require.resolve(file)) as unknown as { hasGlyphForCodePoint(cp: number): boolean };
    const body = open('@fontsource/instrument-sans/files/instrument-sans-latin-400-normal.woff');
    const symbols = open('@fontsource/dejavu-sans/files/dejavu-sans-latin-400-normal.woff');
    const used = [...new Set(text)].filter((ch) => ch.trim() !== '');
    expect(used).toContain('±');
    const undrawable = used.filter((ch) => !body.hasGlyphForCodePoint(ch.codePointAt(0)!) && !('±≤≥'.includes(ch) && symbols.hasGlyphForCodePoint(ch.codePointAt(0)!)));
    expect(undrawable).toEqual([]);
  });

  it('a report in foot-candles, when asked for, prints the target in fc', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const c = await t.signIn(DEMO.surveyor);
    const res = await c.get(`/api/surveys/${surveyId}/report.pdf?unit=fc`).buffer(true).parse(binary);
    const text = await pdfText(res.body);
    // 100 lx = 9.29 fc (1 fc = 10.7639 lx).
    expect(text).toContain('9.29 fc');
    expect(text).toContain('foot-candles');
  });

  it('a signed-off survey, when its report is generated, names who signed it off', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const fm = await t.signIn(DEMO.facility_manager);
    await fm.post(`/api/surveys/${surveyId}/sign-off`).send({ comment: 'Corridor relamping booked for January' });
    const text = await pdfText((await fm.get(`/api/surveys/${surveyId}/report.pdf`).buffer(true).parse(binary)).body);
    expect(text).toContain('Signed off by Marguerite Oakhurst');
    expect(text).not.toContain('Not signed off');
    // The signed record on the first page: who, when (in the site's zone, labelled) and the comment.
    const firstPage = text.slice(0, text.indexOf('Conditions'));
    expect(firstPage).toContain('Sign-off comment Corridor relamping booked for January');
    expect(firstPage).toMatch(/Signed off on \d{1,2} [A-Z][a-z]{2} \d{4}, \d{2}:\d{2} (GMT|BST)/);
    expect(firstPage).toContain('Submitted by');
  });
});

describe('report calibration block', () => {
  it('describes a 4-20 mA transmitter by its signal range and a counting probe by its gain codes, each in its own terms', async () => {
    const { describeCoefficientSet } = await import('@server/modules/reports/report-pdf');
    const base = { id: 1, probeId: 1, probeDescription: '', status: 'approved', effectiveFrom: 0, dueDate: 0, certificateNumber: 'C', readings: 3 };
    const analog = describeCoefficientSet({ ...base, probeSerial: 'RF-20-07', probeKind: 'current_4_20', version: 1, tRefMs: 100, alphaPerK: 0, tCalC: 23,
      gains: [{ code: 0, darkCounts: 0, luxPerCount: 1, uRel: 0.015 }], analog: { rangeLowLux: 0, rangeHighLux: 200_000, scale: 'linear', accuracyPercent: 0.25 } });
    expect(analog).toContain('4-20 mA transmitter');
    expect(analog).toContain('4 mA = 0 lx, 20 mA = 200000 lx (linear)');
    expect(analog).toContain('calibration uncertainty 1.50 % (k = 1)');
    expect(analog).not.toMatch(/lx per count|dark|integration time of|°C/);
    const counting = describeCoefficientSet({ ...base, probeSerial: 'LX-4102', probeKind: 'counts', version: 2, tRefMs: 100, alphaPerK: -0.001, tCalC: 23,
      gains: [{ code: 0, darkCounts: 12, luxPerCount: 0.125, uRel: 0.01 }] });
    expect(counting).toContain('Counting probe');
    expect(counting).toContain('gain code 0: dark 12 counts, 0.125 lx per count');
    expect(counting).toContain('integration time of 100 ms and 23 °C');
  });
});

describe('CSV exports', () => {
  it('the zone table, when exported, holds each zone\'s figures and neutralises formula-like names', async () => {
    const zones = [{ ...OFFICE_AND_CORRIDOR[0], name: '=HYPERLINK("http://x.test","office")' }, OFFICE_AND_CORRIDOR[1]];
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones, readings: officeAndCorridorReadings() });
    const c = await t.signIn(DEMO.facility_manager);
    const res = await c.get(`/api/surveys/${surveyId}/compliance/zones.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const rows = Papa.parse<Record<string, string>>(res.text, { header: true, skipEmptyLines: true }).data;
    const zoneRows = rows.filter((r) => r.check === 'task_plane');
    expect(zoneRows.map((r) => r.zone)).toEqual(['Fixture corridor', '\'=HYPERLINK("http://x.test","office")']);
    expect(zoneRows[0]).toMatchObject({ use_type: 'corridor', use: 'Corridor or circulation area', eavg_bound: 'exact', required_em_lx: '100', em_lx: '100', limit_lx: '100', installation: 'in_service', eavg_lx: '85', verdict: 'Falls short', decision_rule: 'guarded' });
    // The office entry (EN 12464-1:2021 shape, secondary) adds a row per further check: walls 150 lx, ceiling 100 lx, Ez 150 lx, none measured here.
    const officeChecks = rows.filter((r) => r.check !== 'task_plane' && r.zone !== 'Fixture corridor');
    expect(officeChecks.map((r) => [r.check, r.em_lx, r.u0_min, r.verdict])).toEqual([['wall', '150', '0.1', 'Not assessed'], ['ceiling', '100', '0.1', 'Not assessed'], ['cylindrical', '150', '', 'Not assessed']]);
  });

  it('the readings, when exported, carry their zone and neutralise point labels that start a formula', async () => {
    const readings = officeAndCorridorReadings();
    readings[0] = { ...readings[0], point: '@SUM(1+1)' };
    readings[1] = { ...readings[1], point: '-2+3' };
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings });
    const c = await t.signIn(DEMO.surveyor);
    const res = await c.get(`/api/surveys/${surveyId}/compliance/readings.csv`);
    const rows = Papa.parse<Record<string, string>>(res.text, { header: true, skipEmptyLines: true }).data;
    expect(rows).toHaveLength(readings.length);
    expect(rows[0]).toMatchObject({ point: '\'@SUM(1+1)', zone: 'Fixture office', in_wall_band: 'no' });
    expect(rows[1].point).toBe('\'-2+3');
    expect(rows.find((r) => r.point === 'wall-dark')).toMatchObject({ zone: 'Fixture office', in_wall_band: 'yes', illuminance_lx: '30', illuminance_bound: 'exact' });
  });
});

describe('POST /api/surveys/:id/report/send', () => {
  it('a report, when sent to two recipients, lands in the outbox with the PDF attached and is audited', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.post(`/api/surveys/${surveyId}/report/send`).send({ recipients: ['Board@Fernmoor.test', 'estates@fernmoor.test'], message: 'For Thursday\'s meeting' });
    expect(res.status).toBe(202);
    expect(res.body.sentTo).toEqual(['board@fernmoor.test', 'estates@fernmoor.test']);
    const mail = t.lastMail()!;
    expect(mail.to).toBe('board@fernmoor.test, estates@fernmoor.test');
    expect(mail.text).toContain('For Thursday\'s meeting');
    expect(res.body.messageId).toBe(mail.id);
    const admin = await t.signIn(DEMO.admin);
    const queued = await admin.get('/api/outbox');
    expect(queued.body.items[0]).toMatchObject({ status: 'queued', attempts: 0, attachments: [], pendingAttachments: [{ filename: res.body.filename }] });
    await t.deliverMail();
    const [att] = t.db.select().from(outboxAttachments).where(eq(outboxAttachments.messageId, mail.id)).all();
    expect(att).toMatchObject({ contentType: 'application/pdf', filename: res.body.filename });
    expect(att.content.subarray(0, 5).toString()).toBe('%PDF-');
    const outbox = await admin.get('/api/outbox');
    expect(outbox.body.items[0]).toMatchObject({ status: 'sent', attempts: 1, pendingAttachments: [] });
    expect(outbox.body.items[0].attachments[0]).toMatchObject({ filename: res.body.filename });
    const audit = await admin.get(`/api/audit?surveyId=${surveyId}`);
    expect(audit.body.items[0]).toMatchObject({ action: 'report_sent' });
  });

  it('a recipient list with a bad address, when posted, answers 400 naming it and sends nothing', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const before = t.lastMail()?.id;
    const res = await (await t.signIn(DEMO.facility_manager)).post(`/api/surveys/${surveyId}/report/send`).send({ recipients: ['ok@fernmoor.test', 'not-an-address'] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/recipients\.1/);
    expect(t.lastMail()?.id).toBe(before);
  });
});

import { eq, sql } from 'drizzle-orm';
import type { TestApp, TestClient } from '../helpers';
import { DEMO } from '../helpers';
import { coefficientSets, probes } from '@server/db/schema/calibration';
import { DEMO_ANALOG_PROBE, DEMO_COUNTING_PROBES, type DemoCountingProbe } from '@server/db/demo/demo-probes';
import { simulateDemoWalk, toLogCsv, type SimRow } from '@server/db/demo/simulate-log';
import { waitForImport } from '@server/modules/imports/imports-service';
import { pagesOfSamples, type StoredSample } from '@server/modules/imports/sample-blocks';
import { logImports } from '@server/db/schema/surveys';

const DAY = 86_400_000;

/** Serials this test data uses, so it never collides with the demo seed's probes. */
export const TEST_SERIALS = { tripod: 'T-4102', handheld: 'T-4107', reference: 'T-RF-07', lapsed: 'T-3990', undecoded: 'T-0001' } as const;

function insertCountingProbe(t: TestApp, organizationId: number, serial: string, p: DemoCountingProbe, set: { from: number; due: number } | null) {
  const now = t.clock.now();
  const row = t.db.insert(probes).values({
    organizationId, serial, kind: 'counts', description: p.description, fullScaleCounts: p.fullScaleCounts, saturationCounts: p.saturationCounts,
    floorCounts: p.floorCounts, gains: p.gains, createdAt: now, updatedAt: now,
  }).returning().get();
  if (set) {
    t.db.insert(coefficientSets).values({
      probeId: row.id, version: 1, status: 'approved', effectiveFrom: set.from, dueDate: set.due, tRefMs: p.tRefMs, alphaPerK: p.alphaPerK, tCalC: p.tCalC,
      gains: p.coefficients, certificateNumber: `${p.certificateNumber}-T`, createdAt: now, approvedAt: now,
    }).run();
  }
  return row.id;
}

/**
 * Probes of the test's own: two counting probes in calibration, one lapsed, one with no
 * approved set, and a 4-20 mA reference, all with the demo probes' coefficients.
 */
export function createTestProbes(t: TestApp, organizationId = 1) {
  const existing = t.db.select().from(probes).where(eq(probes.serial, TEST_SERIALS.tripod)).get();
  if (existing) return;
  const now = t.clock.now();
  const from = now - 400 * DAY;
  insertCountingProbe(t, organizationId, TEST_SERIALS.tripod, DEMO_COUNTING_PROBES[0], { from, due: now + 160 * DAY });
  insertCountingProbe(t, organizationId, TEST_SERIALS.handheld, DEMO_COUNTING_PROBES[1], { from, due: now + 12 * DAY });
  insertCountingProbe(t, organizationId, TEST_SERIALS.lapsed, DEMO_COUNTING_PROBES[2], { from, due: now - 21 * DAY });
  insertCountingProbe(t, organizationId, TEST_SERIALS.undecoded, DEMO_COUNTING_PROBES[0], null);
  const a = DEMO_ANALOG_PROBE;
  const ref = t.db.insert(probes).values({
    organizationId, serial: TEST_SERIALS.reference, kind: a.kind, description: a.description, rangeLowLux: a.rangeLowLux, rangeHighLux: a.rangeHighLux,
    scale: a.scale, accuracyPercent: a.accuracyPercent, createdAt: now, updatedAt: now,
  }).returning().get();
  t.db.insert(coefficientSets).values({
    probeId: ref.id, version: 1, status: 'approved', effectiveFrom: from, dueDate: now + 200 * DAY, tRefMs: a.tRefMs, alphaPerK: a.alphaPerK, tCalC: a.tCalC,
    gains: a.coefficients, certificateNumber: `${a.certificateNumber}-T`, createdAt: now, approvedAt: now,
  }).run();
}

const SERIAL_MAP: Record<string, string> = { 'LX-4102': TEST_SERIALS.tripod, 'LX-4107': TEST_SERIALS.handheld, 'RF-20-07': TEST_SERIALS.reference };

/** The demo walk simulated with the test probes' serials. */
export function testWalkRows(startMs: number, seed = 1): SimRow[] {
  return simulateDemoWalk({ startMs, seed }).map((r) => ({ ...r, probe: SERIAL_MAP[r.probe] ?? r.probe }));
}

export function testWalkCsv(startMs: number, seed = 1): string {
  return toLogCsv(testWalkRows(startMs, seed), 'Europe/London');
}

export async function newDraftSurvey(t: TestApp, c?: TestClient) {
  const client = c ?? await t.signIn(DEMO.surveyor);
  const site = (await client.get('/api/sites')).body.items.find((s: { name: string }) => s.name === 'Fernmoor Community Library');
  const res = await client.post('/api/surveys').send({ siteId: site.id, name: `Test survey ${Math.random().toString(36).slice(2)}` });
  if (res.status !== 201) throw new Error(`survey not created: ${JSON.stringify(res.body)}`);
  return res.body.id as number;
}

/** Uploads a log and waits for the import to finish; returns the upload answer and the final status. */
export async function uploadAndWait(t: TestApp, c: TestClient, surveyId: number, content: string | Buffer, filename = 'walk.csv') {
  const res = await c.post(`/api/surveys/${surveyId}/logs`).attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8'), { filename, contentType: 'text/csv' });
  if (res.status !== 202) return { upload: res, status: null };
  await waitForImport(t.deps, res.body.importId);
  const status = await c.get(`/api/imports/${res.body.importId}`);
  return { upload: res, status: status.body };
}

/** Row counts of every table (SQLite's own sqlite_sequence aside), to show that nothing was added. */
export function tableCounts(t: TestApp): Record<string, number> {
  const tables = t.db.$client.prepare("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%'").all() as { name: string }[];
  return Object.fromEntries(tables.map(({ name }) => [name, (t.db.$client.prepare(`select count(*) as n from "${name}"`).get() as { n: number }).n]));
}

/** Every sample a survey's imports keep, in import then file order, unpacked from their blocks. */
export function keptSamples(t: TestApp, surveyId: number): StoredSample[] {
  const imports = t.db.select({ id: logImports.id }).from(logImports).where(eq(logImports.surveyId, surveyId)).orderBy(logImports.id).all();
  return imports.flatMap((imp) => [...pagesOfSamples(t.db, imp.id)].flat());
}

export const countOf = (t: TestApp, table: string) => t.db.get<{ n: number }>(sql.raw(`select count(*) as n from ${table}`)).n;

// The server tests' one module of test data: builders that write straight into the database
// (creating the parents a record needs: organisation's site → plan → survey → log import → decode
// → readings), request bodies, and helpers that drive the API (probes, surveys, uploads). Direct
// writes stand in for other modules' routes, which have their own tests.
import { PNG } from 'pngjs';
import { and, eq, sql } from 'drizzle-orm';
import { surveys, decodes, logImports, readings } from '@server/db/schema/surveys';
import { sites } from '@server/db/schema/sites';
import { plans, zones } from '@server/db/schema/plans';
import { coefficientSets, probes } from '@server/db/schema/calibration';
import { targets } from '@server/db/schema/targets';
import { storedFiles, userSites, users } from '@server/db/schema/organizations';
import { DEMO_ANALOG_PROBE, DEMO_COUNTING_PROBES, type DemoCountingProbe } from '@server/db/demo/demo-probes';
import { simulateDemoWalk, toLogCsv, type SimRow } from '@server/db/demo/simulate-log';
import { waitForImport } from '@server/modules/imports/imports-service';
import { pagesOfSamples, type StoredSample } from '@server/modules/imports/sample-blocks';
import { createTestApp, DEMO, type TestApp, type TestClient } from '../helpers';

// ---- Parents: organisation, site, stored file, probe, decode with readings ----

export const userId = (t: TestApp, email: string) => t.db.select().from(users).where(eq(users.email, email)).get()!;

export function orgOf(t: TestApp, email: string): number {
  return userId(t, email).organizationId;
}

/** A site inserted directly (the sites API belongs to another module). */
export function insertSite(t: TestApp, organizationId: number, name = 'Test site'): number {
  return t.db.insert(sites).values({ organizationId, name, timeZone: 'Europe/London', createdAt: t.clock.now() }).returning().get().id;
}

let fileSerial = 0;
/** A stored-file row (no bytes on disk) for records that need one: a log import, a plan. */
export function insertStoredFile(t: TestApp, organizationId: number, filename = 'log.csv') {
  return t.db.insert(storedFiles).values({ organizationId, sha256: `${fileSerial++}`.padStart(64, 'f'), filename, contentType: 'text/csv', size: 1, createdAt: t.clock.now() }).returning().get();
}

let probeSerial = 0;
/** A counting probe row with no coefficient set (readings written directly name it). */
export function insertProbe(t: TestApp, organizationId: number, serialPrefix = 'TP', description = ''): number {
  const now = t.clock.now();
  return t.db.insert(probes).values({ organizationId, serial: `${serialPrefix}-${(probeSerial++).toString(36)}-${Math.random().toString(36).slice(2, 6)}`, kind: 'counts', description, createdAt: now, updatedAt: now }).returning().get().id;
}

/** A manual (hand-held, non-logging) meter: a DIN 5032-7 class, or a certificate's relative uncertainty as its coefficient set. */
export function insertManualProbe(t: TestApp, organizationId: number, opts: { serial: string; meterClass: 'L' | 'A' | 'B' | 'C' | null; uRel: number | null; rangeHighLux?: number | null }): number {
  const now = t.clock.now();
  const id = t.db.insert(probes).values({ organizationId, serial: opts.serial, kind: 'manual', description: 'hand-held', meterClass: opts.meterClass, rangeLowLux: 0, rangeHighLux: opts.rangeHighLux === undefined ? 50_000 : opts.rangeHighLux, createdAt: now, updatedAt: now }).returning().get().id;
  if (opts.uRel !== null) {
    insertCoefficientSet(t, id, { tRefMs: 100, alphaPerK: 0, tCalC: 23, gains: [{ code: 0, darkCounts: 0, luxPerCount: 1, uRel: opts.uRel }], certificateNumber: `CERT-${opts.serial}`, dueDate: now + 300 * 86_400_000 });
  }
  return id;
}

type CoefficientSetValues = Omit<typeof coefficientSets.$inferInsert, 'probeId' | 'version' | 'status' | 'effectiveFrom' | 'dueDate' | 'createdAt'>
  & Partial<Pick<typeof coefficientSets.$inferInsert, 'version' | 'status' | 'effectiveFrom' | 'dueDate'>>;
/** An approved coefficient set of a probe (version 1, in force from a day ago, due in 200 days unless given). */
export function insertCoefficientSet(t: TestApp, probeId: number, values: CoefficientSetValues) {
  const now = t.clock.now();
  return t.db.insert(coefficientSets).values({
    version: 1, status: 'approved', effectiveFrom: now - 86_400_000, dueDate: now + 200 * 86_400_000, createdAt: now, ...values, probeId,
  }).returning().get();
}

/** A plan of a site at 0.05 m per pixel over 1000 px × 1000 px (a 50 m square), on a stored file with no bytes. */
export function insertPlan(t: TestApp, organizationId: number, siteId: number, name = 'Fixture floor'): number {
  return t.db.insert(plans).values({ siteId, name, fileId: insertStoredFile(t, organizationId, 'plan.png').id, widthPx: 1000, heightPx: 1000, metresPerPixel: 0.05, createdAt: t.clock.now() }).returning().get().id;
}

/** A zone on a plan (a room with a 0.5 m wall band unless told). */
export function insertZone(t: TestApp, planId: number, z: Pick<FixtureZone, 'name' | 'useType' | 'polygon'> & Partial<Pick<FixtureZone, 'kind' | 'wallBandM'>>): number {
  return t.db.insert(zones).values({ planId, name: z.name, kind: z.kind ?? 'room', useType: z.useType, wallBandM: z.wallBandM ?? 0.5, polygon: z.polygon, createdAt: t.clock.now() }).returning().get().id;
}

/** An organisation's own target entry (300 lx, published) for a use type of its own. */
export function insertTarget(t: TestApp, organizationId: number, useType: string, name = 'Own entry'): number {
  return t.db.insert(targets).values({ organizationId, useType, name, emLux: 300, source: 'test entry', confidence: 'published', createdAt: t.clock.now() }).returning().get().id;
}

/** Limits a user (a facility manager) to the given sites. */
export function assignSites(t: TestApp, userIdValue: number, siteIds: readonly number[]): void {
  for (const siteId of siteIds) t.db.insert(userSites).values({ userId: userIdValue, siteId }).run();
}

/** Lifts a user's limit to some sites (back to every site of the organisation). */
export function unassignSites(t: TestApp, userIdValue: number): void {
  t.db.delete(userSites).where(eq(userSites.userId, userIdValue)).run();
}

export type ReadingValues = Omit<typeof readings.$inferInsert, 'surveyId' | 'decodeId' | 'importId'>;
/**
 * A new decode of the survey holding these readings, on a finished log import of a stored file,
 * made the survey's active decode (what an accepted import leaves behind); with `addLog`, the
 * readings join the active decode as a further log.
 */
export function insertDecode(t: TestApp, surveyId: number, rows: readonly ReadingValues[], opts: { addLog?: boolean } = {}): { decodeId: number; importId: number } {
  const survey = t.db.select({ organizationId: surveys.organizationId, activeDecodeId: surveys.activeDecodeId }).from(surveys).where(eq(surveys.id, surveyId)).get()!;
  const now = t.clock.now();
  const file = insertStoredFile(t, survey.organizationId);
  const imp = t.db.insert(logImports).values({ surveyId, fileId: file.id, status: 'done', createdAt: now }).returning().get();
  const decode = opts.addLog && survey.activeDecodeId !== null ? { id: survey.activeDecodeId } : t.db.insert(decodes).values({ surveyId, reason: 'import', createdAt: now }).returning().get();
  for (const r of rows) t.db.insert(readings).values({ ...r, surveyId, decodeId: decode.id, importId: imp.id }).run();
  t.db.update(surveys).set({ activeDecodeId: decode.id }).where(eq(surveys.id, surveyId)).run();
  return { decodeId: decode.id, importId: imp.id };
}

// ---- Surveys with readings, written directly ----

export type FixtureZone = { key: string; name: string; kind?: 'room' | 'task_area' | 'outdoor'; useType: string; polygon: [number, number][]; wallBandM?: number };
export type FixtureReading = { zone?: string; x: number | null; y: number | null; lux: number | null; point?: string; /** Default: the fixture plan for a positioned reading. */ planId?: number | null; role?: 'task' | 'reference'; flag?: typeof readings.$inferInsert['flag']; luxBound?: 'exact' | 'lower' | 'upper'; timeMs?: number; plane?: 'horizontal' | 'vertical' | 'wall' | 'ceiling'; azimuthDeg?: number };

/**
 * A site with one plan, its zones, and a survey whose single decode holds the given readings,
 * all written directly (the sites, plans and import modules belong to other features).
 * Every reading carries a 2 % calibration part (k = 1) from one coefficient set.
 */
export function buildSurvey(t: TestApp, opts: {
  ownerEmail: string;
  siteId?: number;
  siteName?: string;
  surveyName?: string;
  startedOn?: string;
  status?: 'draft' | 'submitted';
  zones: FixtureZone[];
  readings: FixtureReading[];
  /** Reuse the plan and zones of an earlier call (a second survey of the same site). */
  reuse?: { planId: number; zoneIds: Record<string, number>; probeId: number; coefficientSetId: number };
}) {
  const owner = userId(t, opts.ownerEmail);
  const org = owner.organizationId;
  const now = t.clock.now();
  const siteId = opts.siteId ?? insertSite(t, org, opts.siteName ?? 'Fixture site');
  let planId: number;
  let zoneIds: Record<string, number>;
  let probeId: number;
  let coefficientSetId: number;
  if (opts.reuse) ({ planId, zoneIds, probeId, coefficientSetId } = opts.reuse);
  else {
    planId = insertPlan(t, org, siteId);
    zoneIds = {};
    for (const z of opts.zones) zoneIds[z.key] = insertZone(t, planId, z);
    probeId = insertProbe(t, org, 'FX', 'fixture probe');
    coefficientSetId = insertCoefficientSet(t, probeId, {
      tRefMs: 100, alphaPerK: -0.001, tCalC: 23, gains: [{ code: 0, darkCounts: 50, luxPerCount: 2, uRel: 0.02 }], certificateNumber: `FX-CERT-${probeId}`,
    }).id;
  }
  const status = opts.status ?? 'submitted';
  const survey = t.db.insert(surveys).values({
    organizationId: org, siteId, name: opts.surveyName ?? 'Fixture survey', startedOn: opts.startedOn ?? '2026-11-01', status, createdBy: owner.id,
    submittedBy: status === 'submitted' ? owner.id : null, submittedAt: status === 'submitted' ? now : null, conditions: { daylightExcluded: false, notes: 'Overcast' }, createdAt: now,
  }).returning().get();
  const { decodeId } = insertDecode(t, survey.id, opts.readings.map((r, i) => ({
    point: r.point ?? `P${i + 1}`, xM: r.x, yM: r.y, planId: r.planId !== undefined ? r.planId : r.x === null ? null : planId, role: r.role ?? 'task', timeMs: r.timeMs ?? now + i * 5000, probeId,
    lux: r.lux, uLux: r.lux === null ? null : r.lux * 0.04, luxBound: r.luxBound ?? 'exact', flag: r.flag ?? 'ok', gainCode: 0, sampleCount: 1, coefficientSetId,
    budget: r.lux === null ? [] : [{ name: 'calibration', uRel: 0.02 }], plane: r.plane ?? 'horizontal', azimuthDeg: r.azimuthDeg ?? null,
  })));
  return { siteId, planId, zoneIds, surveyId: survey.id, probeId, coefficientSetId, decodeId };
}

/** Points on a regular grid inside [x0, x1] x [y0, y1] (inset by `inset`), at a level from the callback. */
export function gridReadings(x0: number, y0: number, x1: number, y1: number, nx: number, ny: number, lux: (i: number, j: number) => number | null, inset = 0.75): FixtureReading[] {
  const out: FixtureReading[] = [];
  for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) {
    const x = nx === 1 ? (x0 + x1) / 2 : x0 + inset + ((x1 - x0 - 2 * inset) * i) / (nx - 1);
    const y = ny === 1 ? (y0 + y1) / 2 : y0 + inset + ((y1 - y0 - 2 * inset) * j) / (ny - 1);
    out.push({ x, y, lux: lux(i, j) });
  }
  return out;
}

/** Two rooms: an office at about 540 lx and a corridor at 85 lx (demo-like: the corridor falls short of 100 lx). */
export const OFFICE_AND_CORRIDOR: FixtureZone[] = [
  { key: 'office', name: 'Fixture office', useType: 'office_writing', polygon: [[0, 0], [4, 0], [4, 4], [0, 4]] },
  { key: 'corridor', name: 'Fixture corridor', useType: 'corridor', polygon: [[4, 0], [12, 0], [12, 2], [4, 2]] },
];

export function officeAndCorridorReadings(officeLux = 540, corridorLux = 85): FixtureReading[] {
  return [
    ...gridReadings(0, 0, 4, 4, 7, 7, (i, j) => officeLux + (i - 3) * 4 + (j - 3) * 3),
    ...gridReadings(4, 0, 12, 2, 8, 3, (i) => corridorLux + (i % 2 ? 2 : -2), 0.6),
    { x: 0.2, y: 2, lux: 30, point: 'wall-dark' },
  ];
}

/** A small PNG of the given size, one colour, with a darker border (looks like a plan outline). */
export function pngOf(width: number, height: number, seed = 0): Buffer {
  const png = new PNG({ width, height });
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
    const i = (y * width + x) * 4;
    const edge = x < 2 || y < 2 || x >= width - 2 || y >= height - 2;
    png.data[i] = edge ? 40 : 240 - (seed % 50);
    png.data[i + 1] = edge ? 40 : 240;
    png.data[i + 2] = edge ? 40 : 235;
    png.data[i + 3] = 255;
  }
  return PNG.sync.write(png);
}

export type SeedReading = { point: string; x: number | null; y: number | null; lux: number | null; /** Default: the planId argument for a positioned reading. */ plan?: number | null; role?: 'task' | 'reference'; flag?: typeof readings.$inferInsert['flag']; luxBound?: 'exact' | 'lower' | 'upper'; uLux?: number };

/** A survey of the site with one decode holding the given readings (all tables written directly), taken on plan `planId` unless a row says otherwise. */
export function insertSurveyWithReadings(t: TestApp, organizationId: number, siteId: number, rows: SeedReading[], name = 'Test survey', planId: number | null = null): number {
  const now = t.clock.now();
  const probeId = insertProbe(t, organizationId, 'LX');
  const survey = t.db.insert(surveys).values({ organizationId, siteId, name, createdAt: now }).returning().get();
  insertDecode(t, survey.id, rows.map((r, i) => ({
    point: r.point, xM: r.x, yM: r.y, planId: r.plan !== undefined ? r.plan : r.x === null ? null : planId, role: r.role ?? 'task', timeMs: now + i * 1000, probeId,
    lux: r.lux, uLux: r.uLux ?? (r.lux === null ? null : r.lux * 0.08), luxBound: r.luxBound ?? 'exact', flag: r.flag ?? 'ok', gainCode: 2, sampleCount: 1,
    budget: r.lux === null ? [] : [{ name: 'calibration', uRel: 0.04 }],
  })));
  return survey.id;
}

// ---- Emergency lighting ----

/** When the mains were cut in these tests' surveys. */
export const MAINS_OFF = Date.parse('2026-11-18T19:00:00Z');
export const MIN = 60_000;

export const ROUTE = { kind: 'escape_route', code: 'R1', name: 'Corridor to east exit', line: [[2, 5], [18, 5]], widthM: 1.6, stair: false, spacingM: 4 } as const;
export const OPEN = { kind: 'open_area', code: 'A1', name: 'Reading room', polygon: [[2, 7], [10, 7], [10, 10], [2, 10]], borderM: 0.5, spacingM: 2 } as const;
export const HIGH_RISK = { kind: 'high_risk_area', code: 'H1', name: 'Book lift', polygon: [[12, 7], [14, 7], [14, 9], [12, 9]], spacingM: 1, normalEmLux: 300 } as const;
export const EQUIPMENT = { kind: 'safety_equipment', code: 'E1', name: 'Extinguisher by exit', point: [18, 4], equipment: 'fire_fighting' } as const;

/** A site with a 20 x 10 m plan (scaled), for emergency tests. */
export async function emergencySite(t: TestApp, admin: TestClient, name = `Emergency site ${Math.random().toString(36).slice(2, 8)}`) {
  const siteId = insertSite(t, orgOf(t, DEMO.admin), name);
  const res = await admin.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(200, 100, 3), { filename: 'p.png', contentType: 'image/png' }).field('name', 'Ground floor').field('widthM', '20');
  if (res.status !== 201) throw new Error(`plan upload failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { siteId, planId: res.body.id as number };
}

export type TimedReading = { point: string; lux: number | null; atMin: number; x?: number | null; y?: number | null; luxBound?: 'exact' | 'lower' | 'upper'; flag?: typeof readings.$inferInsert['flag']; uLux?: number };

/**
 * Readings written straight into a survey's new decode (the import path has its own tests), minutes
 * after MAINS_OFF, as one log; with `addLog` into the active decode as a further log. Returns the log's import id.
 */
export function insertTimedReadings(t: TestApp, surveyId: number, planId: number | null, rows: TimedReading[], opts: { addLog?: boolean } = {}): number {
  const survey = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
  const probeId = insertProbe(t, survey.organizationId, 'EM');
  return insertDecode(t, surveyId, rows.map((r) => ({
    point: r.point, xM: r.x ?? null, yM: r.y ?? null, planId: r.x === undefined || r.x === null ? null : planId, role: 'task',
    timeMs: MAINS_OFF + r.atMin * MIN, probeId, lux: r.lux, uLux: r.uLux ?? (r.lux === null ? null : r.lux * 0.04), luxBound: r.luxBound ?? 'exact',
    flag: r.flag ?? (r.luxBound === 'upper' ? 'under_range' : 'ok'), gainCode: 3, sampleCount: 1, budget: r.lux === null ? [] : [{ name: 'calibration', uRel: (r.uLux ? r.uLux / r.lux / 2 : 0.02) }],
  })), opts).importId;
}

export const conditions = (over: Record<string, unknown> = {}) => ({
  systemType: 'self_contained', ratedDurationMin: 180, mainsOffAt: new Date(MAINS_OFF).toISOString(), normalLightingOff: true, daylightExcluded: true, ...over,
});

// ---- Probes and calibration ----

let n = 0;
/** A serial no seed or other test uses. */
export const uniqueSerial = (prefix = 'TST') => `${prefix}-${Date.now().toString(36)}-${(n++).toString(36)}`.toUpperCase();

/** Four gain steps as on the demo probes (nominal gains 1, 8, 64, 512). */
export const FOUR_GAINS = [
  { code: 0, nominalGain: 1 }, { code: 1, nominalGain: 8 }, { code: 2, nominalGain: 64 }, { code: 3, nominalGain: 512 },
];

export function countingProbeBody(overrides: Record<string, unknown> = {}) {
  return { serial: uniqueSerial(), kind: 'counts', description: 'Test probe', fullScaleCounts: 65535, saturationCounts: 65000, floorCounts: 200, gains: FOUR_GAINS, ...overrides };
}

/** Invented coefficients for the four codes: lux per count scales with 1 / nominal gain. */
export function manualGains(base = 2.0) {
  return FOUR_GAINS.map((g) => ({ code: g.code, darkCounts: 50 + g.code, luxPerCount: base / g.nominalGain, uRel: 0.012 }));
}

export function manualDraftBody(overrides: Record<string, unknown> = {}) {
  return {
    source: 'manual', effectiveFrom: '2026-11-01T00:00:00.000Z', dueDate: '2027-11-01T00:00:00.000Z', tRefMs: 100, alphaPerK: -0.001, tCalC: 23,
    gains: manualGains(), certificateNumber: 'TEST-CERT-1', ...overrides,
  };
}

export async function createCountingProbe(c: TestClient, overrides: Record<string, unknown> = {}) {
  const res = await c.post('/api/probes').send(countingProbeBody(overrides));
  if (res.status !== 201) throw new Error(`probe create failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as { id: number; serial: string };
}

export function probeIdBySerial(t: TestApp, serial: string, organizationId = 1): number {
  const row = t.db.select({ id: probes.id }).from(probes).where(and(eq(probes.serial, serial), eq(probes.organizationId, organizationId))).get();
  if (!row) throw new Error(`no probe ${serial}`);
  return row.id;
}

/**
 * Bench CSV rows for a probe whose coefficients are known: counts = dark + E / luxPerCount at
 * int_ms = tRef, without temperature (the decoding model of DOMAIN.md section 2, inverted),
 * plus a small deterministic zero-mean wobble so the fit has a residual.
 */
export function benchCsv(gains: { code: number; darkCounts: number; luxPerCount: number }[], luxPerCode: number[] = [0.05, 0.2, 0.4, 0.6, 0.8], tempC: number | '' = 23) {
  const lines = ['gain,reference_lux,counts,int_ms,temp_c'];
  for (const g of gains) {
    const maxLux = 60000 * g.luxPerCount;
    luxPerCode.forEach((f, i) => {
      const lux = f * maxLux;
      lines.push(`${g.code},${lux.toPrecision(6)},${Math.round(g.darkCounts + lux / g.luxPerCount + (i % 2 === 0 ? 3 : -3))},100,${tempC}`);
    });
  }
  return `${lines.join('\n')}\n`;
}

/** A minimal PDF (magic bytes and trailer), enough for content sniffing. */
export const TINY_PDF = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n', 'latin1');

// ---- Survey logs through the API ----

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
export function createTestProbes(t: TestApp, organizationId = 1): void {
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

/** A fresh test app with the test probes, and the demo surveyor signed in: the import tests' common start. */
export async function appWithTestProbes(overrides: Parameters<typeof createTestApp>[0] = {}): Promise<{ t: TestApp; c: TestClient }> {
  const t = await createTestApp(overrides);
  createTestProbes(t);
  return { t, c: await t.signIn(DEMO.surveyor) };
}

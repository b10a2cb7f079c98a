import { eq } from 'drizzle-orm';
import { surveys, decodes, logImports, readings } from '@server/db/schema/surveys';
import { sites } from '@server/db/schema/sites';
import { plans, zones } from '@server/db/schema/plans';
import { coefficientSets, probes } from '@server/db/schema/calibration';
import { storedFiles, users } from '@server/db/schema/organizations';
import type { TestApp } from './helpers';

export type FixtureZone = { key: string; name: string; kind?: 'room' | 'task_area' | 'outdoor'; useType: string; polygon: [number, number][]; wallBandM?: number };
export type FixtureReading = { zone?: string; x: number | null; y: number | null; lux: number | null; point?: string; /** Default: the fixture plan for a positioned reading. */ planId?: number | null; role?: 'task' | 'reference'; flag?: typeof readings.$inferInsert['flag']; luxBound?: 'exact' | 'lower' | 'upper'; timeMs?: number; plane?: 'horizontal' | 'vertical' | 'wall' | 'ceiling'; azimuthDeg?: number };

export const userId = (t: TestApp, email: string) => t.db.select().from(users).where(eq(users.email, email)).get()!;

let serial = 0;

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
  const siteId = opts.siteId ?? t.db.insert(sites).values({ organizationId: org, name: opts.siteName ?? 'Fixture site', timeZone: 'Europe/London', createdAt: now }).returning().get().id;
  const file = t.db.insert(storedFiles).values({ organizationId: org, sha256: `${serial++}`.padStart(64, '0'), filename: 'fixture.csv', contentType: 'text/csv', size: 1, createdAt: now }).returning().get();
  let planId: number;
  let zoneIds: Record<string, number>;
  let probeId: number;
  let coefficientSetId: number;
  if (opts.reuse) ({ planId, zoneIds, probeId, coefficientSetId } = opts.reuse);
  else {
    planId = t.db.insert(plans).values({ siteId, name: 'Fixture floor', fileId: file.id, widthPx: 1000, heightPx: 1000, metresPerPixel: 0.05, createdAt: now }).returning().get().id;
    zoneIds = {};
    for (const z of opts.zones) {
      zoneIds[z.key] = t.db.insert(zones).values({ planId, name: z.name, kind: z.kind ?? 'room', useType: z.useType, wallBandM: z.wallBandM ?? 0.5, polygon: z.polygon, createdAt: now }).returning().get().id;
    }
    probeId = t.db.insert(probes).values({ organizationId: org, serial: `FX-${serial++}`, kind: 'counts', description: 'fixture probe', createdAt: now, updatedAt: now }).returning().get().id;
    coefficientSetId = t.db.insert(coefficientSets).values({
      probeId, version: 1, status: 'approved', effectiveFrom: now - 86_400_000, dueDate: now + 200 * 86_400_000, tRefMs: 100, alphaPerK: -0.001, tCalC: 23,
      gains: [{ code: 0, darkCounts: 50, luxPerCount: 2, uRel: 0.02 }], certificateNumber: `FX-CERT-${serial}`, createdAt: now,
    }).returning().get().id;
  }
  const status = opts.status ?? 'submitted';
  const survey = t.db.insert(surveys).values({
    organizationId: org, siteId, name: opts.surveyName ?? 'Fixture survey', startedOn: opts.startedOn ?? '2026-11-01', status, createdBy: owner.id,
    submittedBy: status === 'submitted' ? owner.id : null, submittedAt: status === 'submitted' ? now : null, conditions: { daylightExcluded: false, notes: 'Overcast' }, createdAt: now,
  }).returning().get();
  const imp = t.db.insert(logImports).values({ surveyId: survey.id, fileId: file.id, status: 'done', createdAt: now }).returning().get();
  const decode = t.db.insert(decodes).values({ surveyId: survey.id, reason: 'import', createdAt: now }).returning().get();
  opts.readings.forEach((r, i) => {
    t.db.insert(readings).values({
      surveyId: survey.id, decodeId: decode.id, importId: imp.id, point: r.point ?? `P${i + 1}`, xM: r.x, yM: r.y, planId: r.planId !== undefined ? r.planId : r.x === null ? null : planId, role: r.role ?? 'task', timeMs: r.timeMs ?? now + i * 5000, probeId,
      lux: r.lux, uLux: r.lux === null ? null : r.lux * 0.04, luxBound: r.luxBound ?? 'exact', flag: r.flag ?? 'ok', gainCode: 0, sampleCount: 1, coefficientSetId,
      budget: r.lux === null ? [] : [{ name: 'calibration', uRel: 0.02 }], plane: r.plane ?? 'horizontal', azimuthDeg: r.azimuthDeg ?? null,
    }).run();
  });
  t.db.update(surveys).set({ activeDecodeId: decode.id }).where(eq(surveys.id, survey.id)).run();
  return { siteId, planId, zoneIds, surveyId: survey.id, probeId, coefficientSetId, decodeId: decode.id };
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

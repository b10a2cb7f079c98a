import { eq } from 'drizzle-orm';
import { decodes, logImports, readings, surveys } from '@server/db/schema/surveys';
import { probes } from '@server/db/schema/calibration';
import { storedFiles } from '@server/db/schema/organizations';
import { DEMO, type TestApp, type TestClient } from './helpers';
import { insertSite, orgOf, pngOf } from './plans-fixtures';

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
export function insertTimedReadings(t: TestApp, surveyId: number, planId: number | null, rows: TimedReading[], opts: { addLog?: boolean } = {}) {
  const survey = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
  const now = t.clock.now();
  const probe = t.db.insert(probes).values({ organizationId: survey.organizationId, serial: `EM-${Math.random().toString(36).slice(2, 8)}`, kind: 'counts', createdAt: now, updatedAt: now }).returning().get();
  const file = t.db.insert(storedFiles).values({ organizationId: survey.organizationId, sha256: 'e'.repeat(64), filename: 'log.csv', contentType: 'text/csv', size: 1, createdAt: now }).returning().get();
  const imp = t.db.insert(logImports).values({ surveyId, fileId: file.id, status: 'done', createdAt: now }).returning().get();
  const decode = opts.addLog && survey.activeDecodeId !== null ? { id: survey.activeDecodeId } : t.db.insert(decodes).values({ surveyId, reason: 'import', createdAt: now }).returning().get();
  for (const r of rows) {
    t.db.insert(readings).values({
      surveyId, decodeId: decode.id, importId: imp.id, point: r.point, xM: r.x ?? null, yM: r.y ?? null, planId: r.x === undefined || r.x === null ? null : planId, role: 'task',
      timeMs: MAINS_OFF + r.atMin * MIN, probeId: probe.id, lux: r.lux, uLux: r.uLux ?? (r.lux === null ? null : r.lux * 0.04), luxBound: r.luxBound ?? 'exact',
      flag: r.flag ?? (r.luxBound === 'upper' ? 'under_range' : 'ok'), gainCode: 3, sampleCount: 1, budget: r.lux === null ? [] : [{ name: 'calibration', uRel: (r.uLux ? r.uLux / r.lux / 2 : 0.02) }],
    }).run();
  }
  t.db.update(surveys).set({ activeDecodeId: decode.id }).where(eq(surveys.id, surveyId)).run();
  return imp.id;
}

export const conditions = (over: Record<string, unknown> = {}) => ({
  systemType: 'self_contained', ratedDurationMin: 180, mainsOffAt: new Date(MAINS_OFF).toISOString(), normalLightingOff: true, daylightExcluded: true, ...over,
});

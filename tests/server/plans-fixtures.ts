import { PNG } from 'pngjs';
import { eq } from 'drizzle-orm';
import { surveys, decodes, logImports, readings } from '@server/db/schema/surveys';
import { sites } from '@server/db/schema/sites';
import { probes } from '@server/db/schema/calibration';
import { storedFiles, users } from '@server/db/schema/organizations';
import type { TestApp } from './helpers';

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

export function orgOf(t: TestApp, email: string): number {
  return t.db.select({ org: users.organizationId }).from(users).where(eq(users.email, email)).get()!.org;
}

/** A site inserted directly (the sites API belongs to another module). */
export function insertSite(t: TestApp, organizationId: number, name = 'Test site'): number {
  return t.db.insert(sites).values({ organizationId, name, timeZone: 'Europe/London', createdAt: t.clock.now() }).returning().get().id;
}

export type SeedReading = { point: string; x: number | null; y: number | null; lux: number | null; /** Default: the planId argument for a positioned reading. */ plan?: number | null; role?: 'task' | 'reference'; flag?: typeof readings.$inferInsert['flag']; luxBound?: 'exact' | 'lower' | 'upper'; uLux?: number };

/** A survey of the site with one decode holding the given readings (all tables written directly), taken on plan `planId` unless a row says otherwise. */
export function insertSurveyWithReadings(t: TestApp, organizationId: number, siteId: number, rows: SeedReading[], name = 'Test survey', planId: number | null = null): number {
  const now = t.clock.now();
  const probe = t.db.insert(probes).values({ organizationId, serial: `LX-${Math.random().toString(36).slice(2, 8)}`, kind: 'counts', createdAt: now, updatedAt: now }).returning().get();
  const survey = t.db.insert(surveys).values({ organizationId, siteId, name, createdAt: now }).returning().get();
  const file = t.db.insert(storedFiles).values({ organizationId, sha256: 'f'.repeat(64), filename: 'log.csv', contentType: 'text/csv', size: 1, createdAt: now }).returning().get();
  const imp = t.db.insert(logImports).values({ surveyId: survey.id, fileId: file.id, status: 'done', createdAt: now }).returning().get();
  const decode = t.db.insert(decodes).values({ surveyId: survey.id, reason: 'import', createdAt: now }).returning().get();
  rows.forEach((r, i) => {
    t.db.insert(readings).values({
      surveyId: survey.id, decodeId: decode.id, importId: imp.id, point: r.point, xM: r.x, yM: r.y, planId: r.plan !== undefined ? r.plan : r.x === null ? null : planId, role: r.role ?? 'task', timeMs: now + i * 1000, probeId: probe.id,
      lux: r.lux, uLux: r.uLux ?? (r.lux === null ? null : r.lux * 0.08), luxBound: r.luxBound ?? 'exact', flag: r.flag ?? 'ok', gainCode: 2, sampleCount: 1,
      budget: r.lux === null ? [] : [{ name: 'calibration', uRel: 0.04 }],
    }).run();
  });
  t.db.update(surveys).set({ activeDecodeId: decode.id }).where(eq(surveys.id, survey.id)).run();
  return survey.id;
}

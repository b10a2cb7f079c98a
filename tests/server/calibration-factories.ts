import { eq, and } from 'drizzle-orm';
import { probes } from '@server/db/schema/calibration';
import type { TestApp, TestClient } from './helpers';

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

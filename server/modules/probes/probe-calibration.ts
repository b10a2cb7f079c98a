import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { coefficientSets, probes } from '../../db/schema/calibration';
import type { CoefficientSet, Probe } from '@shared/core/types';

type ProbeRow = typeof probes.$inferSelect;
type CoefficientSetRow = typeof coefficientSets.$inferSelect;

/** What the decoder needs for one probe: its core description and its APPROVED sets only. */
export type DecodingCalibration = {
  probeId: number;
  serial: string;
  status: ProbeRow['status'];
  probe: Probe;
  /** Approved sets, oldest effectiveFrom first (drafts never decode). */
  sets: CoefficientSet[];
};

/** The shared/core Probe of a stored probe row (counting or analog). */
export function toCoreProbe(row: ProbeRow): Probe {
  if (row.kind === 'counts') {
    return {
      kind: 'counts',
      fullScaleCounts: row.fullScaleCounts ?? 0,
      saturationCounts: row.saturationCounts ?? 0,
      floorCounts: row.floorCounts ?? 0,
      gains: (row.gains ?? []).map((g) => ({ code: g.code, nominalGain: g.nominalGain })),
    };
  }
  if (row.kind === 'manual') return { kind: 'manual' };
  return {
    kind: row.kind,
    rangeLowLux: row.rangeLowLux ?? 0,
    rangeHighLux: row.rangeHighLux ?? 0,
    scale: row.scale ?? 'linear',
    accuracyPercent: row.accuracyPercent ?? 0,
  };
}

/** The shared/core CoefficientSet of a stored set row; id is the DB id as a string. */
export function toCoreCoefficientSet(row: CoefficientSetRow): CoefficientSet {
  return {
    id: String(row.id),
    effectiveFrom: row.effectiveFrom,
    dueDate: row.dueDate,
    tRefMs: row.tRefMs,
    alphaPerK: row.alphaPerK,
    tCalC: row.tCalC,
    gains: row.gains.map((g) => ({ code: g.code, darkCounts: g.darkCounts, luxPerCount: g.luxPerCount, uRel: g.uRel, ...(g.uDarkCounts !== undefined ? { uDarkCounts: g.uDarkCounts } : {}) })),
    approved: row.status === 'approved',
  };
}

/**
 * Every probe of the organisation (or only the one asked for) keyed by serial, with its approved
 * coefficient sets, for decoding survey logs (select the set in force with shared/core
 * createCoefficientSelector).
 */
export function loadDecodingCalibration(db: Db, organizationId: number, only?: { probeId: number }): Map<string, DecodingCalibration> {
  const probeRows = db.select().from(probes)
    .where(only ? and(eq(probes.organizationId, organizationId), eq(probes.id, only.probeId)) : eq(probes.organizationId, organizationId)).all();
  const out = new Map<string, DecodingCalibration>();
  if (probeRows.length === 0) return out;
  const setRows = db.select().from(coefficientSets)
    .where(and(inArray(coefficientSets.probeId, probeRows.map((p) => p.id)), eq(coefficientSets.status, 'approved')))
    .orderBy(asc(coefficientSets.effectiveFrom), asc(coefficientSets.version)).all();
  const setsOf = new Map<number, (typeof setRows)[number][]>();
  for (const s of setRows) {
    const list = setsOf.get(s.probeId);
    if (list) list.push(s);
    else setsOf.set(s.probeId, [s]);
  }
  for (const p of probeRows) {
    out.set(p.serial, {
      probeId: p.id,
      serial: p.serial,
      status: p.status,
      probe: toCoreProbe(p),
      sets: (setsOf.get(p.id) ?? []).map(toCoreCoefficientSet),
    });
  }
  return out;
}

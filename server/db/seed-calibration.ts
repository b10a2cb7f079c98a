import type { Deps } from '../deps';
import type { SeedContext } from './seed-context';
import { coefficientSets, probes } from './schema/calibration';
import { DEMO_ANALOG_PROBE, DEMO_COUNTING_PROBES } from './demo/demo-probes';
import { recordAudit } from '../modules/audit/audit-service';

const DAY = 86_400_000;
/** Calibration interval of the counting probes: one year (common practice, not from a standard). */
const COUNTING_INTERVAL_DAYS = 365;
/** The analog transmitter is recalibrated every two years (common practice for transmitters, from memory). */
const ANALOG_INTERVAL_DAYS = 730;

type SetSeed = {
  effectiveFrom: number; dueDate: number; tRefMs: number; alphaPerK: number; tCalC: number; certificateNumber: string; note?: string;
  gains: { code: number; darkCounts: number; luxPerCount: number; uRel: number }[];
};

/**
 * Calibration demo data: the demo organisation's counting probes and roof reference with approved
 * sets (drafted by calibration@, approved by calibration2@), LX-4102 with an earlier version so the
 * spring survey decodes with it, LX-4107 coming due, LX-3990 overdue; one probe of Quillbank Works.
 * Sets take effect months before the seed time, so demo survey logs of 2026 decode.
 */
export function seedCalibration(deps: Deps, ctx: SeedContext) {
  const drafter = ctx.usersByEmail['calibration@luxtrail.test'];
  const approver = ctx.usersByEmail['calibration2@luxtrail.test'];
  const otherAdmin = ctx.usersByEmail['admin@elsewhere.test'];
  const now = ctx.now;

  deps.db.transaction((tx) => {
    const addProbe = (organizationId: number, values: Omit<typeof probes.$inferInsert, 'organizationId' | 'createdAt' | 'updatedAt'>, createdAt: number, actorId: number | null) => {
      const row = tx.insert(probes).values({ ...values, organizationId, createdAt, updatedAt: createdAt }).returning().get();
      recordAudit(tx, { organizationId, actorId, entityType: 'probe', entityId: row.id, probeId: row.id, action: 'created', after: { ...values }, at: createdAt });
      return row;
    };
    const addSet = (organizationId: number, probeId: number, version: number, s: SetSeed, by: { drafter: number | null; approver: number }) => {
      const draftedAt = s.effectiveFrom - 2 * DAY;
      const approvedAt = s.effectiveFrom - DAY;
      const row = tx.insert(coefficientSets).values({
        probeId, version, status: 'approved', effectiveFrom: s.effectiveFrom, dueDate: s.dueDate, tRefMs: s.tRefMs, alphaPerK: s.alphaPerK, tCalC: s.tCalC,
        gains: s.gains, certificateNumber: s.certificateNumber, note: s.note ?? '', draftedBy: by.drafter, approvedBy: by.approver, approvedAt, createdAt: draftedAt,
      }).returning().get();
      const view = { version, effectiveFrom: new Date(s.effectiveFrom).toISOString(), dueDate: new Date(s.dueDate).toISOString(), tRefMs: s.tRefMs, alphaPerK: s.alphaPerK, tCalC: s.tCalC, gains: s.gains, certificateNumber: s.certificateNumber };
      recordAudit(tx, { organizationId, actorId: by.drafter, entityType: 'coefficient_set', entityId: row.id, probeId, action: 'drafted', after: { ...view, status: 'draft' }, at: draftedAt });
      recordAudit(tx, { organizationId, actorId: by.approver, entityType: 'coefficient_set', entityId: row.id, probeId, action: 'approved', before: { ...view, status: 'draft' }, after: { ...view, status: 'approved', approvedBy: by.approver }, at: approvedAt });
    };
    const staff = { drafter, approver };

    for (const p of DEMO_COUNTING_PROBES) {
      const due = now + p.dueInDays * DAY;
      const effective = due - COUNTING_INTERVAL_DAYS * DAY;
      // LX-4102 was recalibrated in spring: keep its earlier version so older logs still decode with it.
      const earlier = p.serial === 'LX-4102' ? { effectiveFrom: effective - COUNTING_INTERVAL_DAYS * DAY, dueDate: effective + 7 * DAY } : null;
      const probe = addProbe(ctx.demoOrgId, {
        serial: p.serial, kind: 'counts', description: p.description, status: 'in_service',
        fullScaleCounts: p.fullScaleCounts, saturationCounts: p.saturationCounts, floorCounts: p.floorCounts, gains: p.gains,
      }, (earlier?.effectiveFrom ?? effective) - 10 * DAY, drafter);
      const base = { tRefMs: p.tRefMs, alphaPerK: p.alphaPerK, tCalC: p.tCalC };
      let version = 1;
      if (earlier) {
        addSet(ctx.demoOrgId, probe.id, version++, {
          ...base, ...earlier, certificateNumber: 'FCT-CAL-2025-0140', note: 'Previous annual calibration',
          // Dark offsets drift a little between calibrations; responsivity as now.
          gains: p.coefficients.map((c) => ({ ...c, darkCounts: c.darkCounts + 2 })),
        }, staff);
      }
      addSet(ctx.demoOrgId, probe.id, version, { ...base, effectiveFrom: effective, dueDate: due, certificateNumber: p.certificateNumber, gains: p.coefficients }, staff);
    }

    const a = DEMO_ANALOG_PROBE;
    const analogDue = now + a.dueInDays * DAY;
    const analogEffective = analogDue - ANALOG_INTERVAL_DAYS * DAY;
    const ref = addProbe(ctx.demoOrgId, {
      serial: a.serial, kind: a.kind, description: a.description, status: 'in_service',
      rangeLowLux: a.rangeLowLux, rangeHighLux: a.rangeHighLux, scale: a.scale, accuracyPercent: a.accuracyPercent,
    }, analogEffective - 10 * DAY, drafter);
    addSet(ctx.demoOrgId, ref.id, 1, { effectiveFrom: analogEffective, dueDate: analogDue, tRefMs: a.tRefMs, alphaPerK: a.alphaPerK, tCalC: a.tCalC, certificateNumber: a.certificateNumber, gains: a.coefficients }, staff);

    // Quillbank Works has its own probe; its set came with the supplier's certificate (no drafter in Luxtrail).
    const qw = DEMO_COUNTING_PROBES[0];
    const qwEffective = now - 90 * DAY;
    const other = addProbe(ctx.otherOrgId, {
      serial: 'QW-0012', kind: 'counts', description: 'Assembly hall probe', status: 'in_service',
      fullScaleCounts: qw.fullScaleCounts, saturationCounts: qw.saturationCounts, floorCounts: qw.floorCounts, gains: qw.gains,
    }, qwEffective - 10 * DAY, otherAdmin);
    addSet(ctx.otherOrgId, other.id, 1, {
      effectiveFrom: qwEffective, dueDate: qwEffective + COUNTING_INTERVAL_DAYS * DAY, tRefMs: qw.tRefMs, alphaPerK: qw.alphaPerK, tCalC: qw.tCalC,
      certificateNumber: 'QBW-2026-017', note: 'Entered from the supplier certificate at commissioning',
      gains: qw.coefficients.map((c) => ({ ...c, luxPerCount: c.luxPerCount * 1.01 })),
    }, { drafter: null, approver: otherAdmin });
  });
}

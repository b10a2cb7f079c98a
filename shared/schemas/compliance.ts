import { z } from 'zod';
import { fieldPhotoSchema, zoneNoteSchema } from './field';
import { LUX_BOUNDS } from '../core/types';
import { READING_PLANES } from '../core/planes';
import { DECISION_RULES } from './organization';
import { TARGET_CONFIDENCE } from './targets';
import { INSTALLATION_STATES, installationInfoSchema, SURVEY_STATUSES, surveyAbilitiesSchema } from './surveys';

export const VERDICTS = ['meets', 'falls_short', 'inconclusive', 'not_assessed'] as const;
export type ZoneVerdict = (typeof VERDICTS)[number];

export const VERDICT_LABELS: Record<ZoneVerdict, string> = {
  meets: 'Meets target',
  falls_short: 'Falls short',
  inconclusive: 'Inconclusive',
  not_assessed: 'Not assessed',
};

/**
 * The zones' verdicts counted in a sentence, for the sign-off e-mail and the report's summary:
 * "14 zones: 6 meet their target, 5 fall short, 2 are inconclusive, 1 is not assessed".
 */
export function zoneVerdictCountsText(counts: Record<ZoneVerdict, number>): string {
  const total = VERDICTS.reduce((n, v) => n + counts[v], 0);
  const one = (n: number, singular: string, plural: string) => `${n} ${n === 1 ? singular : plural}`;
  return `${one(total, 'zone', 'zones')}: ${one(counts.meets, 'meets its target', 'meet their target')}, ${one(counts.falls_short, 'falls short', 'fall short')}, `
    + `${one(counts.inconclusive, 'is inconclusive', 'are inconclusive')}, ${one(counts.not_assessed, 'is not assessed', 'are not assessed')}`;
}

/** Worst first: what a facility manager acts on comes to the top. */
export const VERDICT_ORDER: Record<ZoneVerdict, number> = { falls_short: 0, inconclusive: 1, not_assessed: 2, meets: 3 };

const statBound = z.enum(['lower', 'upper', 'indeterminate']).nullable();

export const zoneChangeSchema = z.object({
  previousEavg: z.number().nullable(),
  /** Eavg now minus Eavg in the previous signed-off survey, lux. */
  deltaEavg: z.number().nullable(),
  previousVerdict: z.enum(VERDICTS),
  verdictChanged: z.boolean(),
});
export type ZoneChange = z.infer<typeof zoneChangeSchema>;

/** A check of a zone beyond its horizontal task plane: a surface, cylindrical illuminance or a derived area around a task. */
export const CHECK_KINDS = ['wall', 'ceiling', 'cylindrical', 'surrounding', 'background'] as const;
export type CheckKind = (typeof CHECK_KINDS)[number];
export const CHECK_LABELS: Record<CheckKind, string> = {
  wall: 'Walls (Em,wall)',
  ceiling: 'Ceiling (Em,ceiling)',
  cylindrical: 'Cylindrical (Ez)',
  surrounding: 'Immediate surrounding area',
  background: 'Background area',
};

export const zoneCheckSchema = z.object({
  kind: z.enum(CHECK_KINDS),
  /** The maintained value for this check, lux (null: the entry gives none). */
  targetLux: z.number().nullable(),
  /** What the measured value is compared with: targetLux, or targetLux / MF for a new installation. */
  limitLux: z.number().nullable(),
  u0Min: z.number().nullable(),
  /** Where the value and its relation come from, and how sure we are. */
  source: z.string(),
  confidence: z.enum(TARGET_CONFIDENCE),
  points: z.number().int(),
  eavg: z.number().nullable(),
  emin: z.number().nullable(),
  u0: z.number().nullable(),
  uEavg: z.number().nullable(),
  bounds: z.object({ eavg: statBound, emin: statBound, u0: statBound }),
  verdict: z.enum(VERDICTS),
  reasons: z.array(z.string()),
  /** A derived area in plan metres (surrounding and background bands): its pieces, each an outer ring then any holes. */
  polygons: z.array(z.array(z.array(z.tuple([z.number(), z.number()])))).optional(),
  areaM2: z.number().optional(),
});
export type ZoneCheck = z.infer<typeof zoneCheckSchema>;

export const zoneComplianceSchema = z.object({
  zoneId: z.number().int(),
  name: z.string(),
  kind: z.enum(['room', 'task_area', 'outdoor']),
  useType: z.string(),
  planId: z.number().int(),
  planName: z.string(),
  planeHeightM: z.number(),
  targetId: z.number().int().nullable(),
  targetName: z.string().nullable(),
  targetSource: z.string().nullable(),
  targetConfidence: z.enum(TARGET_CONFIDENCE).nullable(),
  /** The maintained value Em the zone is judged against (the entry's required value, or the value its design chose), lux. */
  targetLux: z.number().nullable(),
  targetU0: z.number().nullable(),
  /** The entry's required and modified values (EN 12464-1:2021), lux; absent in sign-offs frozen before they were kept. */
  requiredLux: z.number().nullable().optional(),
  modifiedLux: z.number().nullable().optional(),
  /** Which value was judged and why (context modifiers). */
  design: z.object({ basis: z.enum(['required', 'modified', 'stepped']), steps: z.number().int(), explanation: z.string(), modifiers: z.array(z.string()) }).optional(),
  /** What Eavg was compared with: targetLux, or targetLux / MF for a new installation. */
  limitLux: z.number().nullable().optional(),
  /** Ra and RUGL of the entry, for information (a meter cannot measure them). */
  info: z.object({ ra: z.number().nullable(), rugl: z.number().nullable(), note: z.string() }).optional(),
  /** Valid points inside the zone and outside its wall band. */
  points: z.number().int(),
  /** Points the grid asks for: the EN 12464-1 grid from the zone's outline under the survey's rounding, or its justified planned grid. */
  requiredPoints: z.number().int(),
  gridAdequate: z.boolean(),
  /** False for outdoor areas: the indoor grid rule is not applied (absent in sign-offs frozen before this was kept: applied). */
  gridRuleApplies: z.boolean().optional(),
  /** Points left out because they lie in the wall band. */
  wallBandPoints: z.number().int(),
  /** Readings excluded by hand from the statistics (each with its reason in `reasons`). */
  excludedPoints: z.number().int().optional(),
  eavg: z.number().nullable(),
  emin: z.number().nullable(),
  emax: z.number().nullable(),
  u0: z.number().nullable(),
  /** Expanded uncertainty (k = 2) of Eavg, lux. */
  uEavg: z.number().nullable(),
  /** Which statistics are only bounds (over- or under-range points). */
  bounds: z.object({ eavg: statBound, emin: statBound, u0: statBound }),
  dfAvg: z.number().optional(),
  dfTargetPercent: z.number().optional(),
  /** Set when the outdoor level changed too fast for some pairings to be trusted. */
  dfWarning: z.string().optional(),
  verdict: z.enum(VERDICTS),
  reasons: z.array(z.string()),
  /** Walls, ceiling, cylindrical illuminance and the areas around a task, each judged on its own. */
  checks: z.array(zoneCheckSchema).optional(),
  /** Ez / Eh where both exist; 0.30 to 0.60 was the 2011 recommendation (informative). */
  modelling: z.object({ ratio: z.number(), ezLux: z.number(), ehLux: z.number(), withinRecommendation: z.boolean(), source: z.string() }).optional(),
  /** Against the previous signed-off survey of the site, when there is one with this zone. */
  change: zoneChangeSchema.optional(),
});
export type ZoneCompliance = z.infer<typeof zoneComplianceSchema>;

export const complianceCountsSchema = z.object({ meets: z.number().int(), falls_short: z.number().int(), inconclusive: z.number().int(), not_assessed: z.number().int() });
export type ComplianceCounts = z.infer<typeof complianceCountsSchema>;

export const complianceResponseSchema = z.object({
  surveyId: z.number().int(),
  surveyName: z.string(),
  siteId: z.number().int(),
  siteName: z.string(),
  /** The site's IANA time zone: every time of this survey is shown in it. */
  siteTimeZone: z.string(),
  startedOn: z.string().nullable(),
  status: z.enum(SURVEY_STATUSES),
  /** What the caller may do with the survey now (sign off, return, submit…). */
  abilities: surveyAbilitiesSchema,
  /** The reviewer's comment (on return or sign-off). */
  reviewComment: z.string().nullable(),
  submittedByName: z.string().nullable(),
  submittedAt: z.string().nullable(),
  /** The signed record: who signed off and when (with reviewComment, the sign-off comment). */
  signedOffByName: z.string().nullable(),
  signedOffAt: z.string().nullable(),
  rule: z.enum(DECISION_RULES),
  ruleText: z.string(),
  gridRule: z.string(),
  /** True once signed off: the verdicts are those frozen at sign-off. */
  frozen: z.boolean(),
  frozenAt: z.string().nullable(),
  /** Whether an outdoor reference probe logged during the survey. */
  hasDaylightReference: z.boolean(),
  /** New (judged against Em / MF) or in service (against Em), and that case in words. */
  installation: installationInfoSchema,
  installationText: z.string(),
  counts: complianceCountsSchema,
  /** Worst first: falls short (largest shortfall first), inconclusive, not assessed, meets. */
  zones: z.array(zoneComplianceSchema),
  /** Readings that lie in no zone. */
  unassignedPoints: z.number().int(),
  previous: z.object({ surveyId: z.number().int(), name: z.string(), signedOffAt: z.string().nullable() }).nullable(),
  warnings: z.array(z.string()),
});
export type ComplianceResponse = z.infer<typeof complianceResponseSchema>;

export const zoneDetailParamsSchema = z.object({ id: z.coerce.number().int().positive(), zoneId: z.coerce.number().int().positive() });

export const zonePointSchema = z.object({
  readingId: z.number().int(),
  point: z.string(),
  xM: z.number(),
  yM: z.number(),
  timestamp: z.string(),
  lux: z.number().nullable(),
  uLux: z.number().nullable(),
  luxBound: z.enum(LUX_BOUNDS),
  flag: z.string(),
  /** In the wall band: shown, left out of the statistics. */
  inWallBand: z.boolean(),
  plane: z.enum(READING_PLANES).optional(),
  azimuthDeg: z.number().nullable().optional(),
  dfPercent: z.number().optional(),
});
export type ZonePoint = z.infer<typeof zonePointSchema>;

export const zoneDetailResponseSchema = z.object({
  surveyId: z.number().int(),
  rule: z.enum(DECISION_RULES),
  ruleText: z.string(),
  gridRule: z.string(),
  frozen: z.boolean(),
  zone: zoneComplianceSchema,
  polygon: z.array(z.tuple([z.number(), z.number()])),
  points: z.array(zonePointSchema),
  /** Photos taken in the field of this zone or of one of its points. */
  photos: z.array(fieldPhotoSchema),
  /** Notes written on this zone in the field view, oldest first. */
  notes: z.array(zoneNoteSchema),
  /** The site's IANA time zone (photo times are shown in it). */
  siteTimeZone: z.string(),
});
export type ZoneDetailResponse = z.infer<typeof zoneDetailResponseSchema>;

export const siteOverviewSchema = z.object({
  siteId: z.number().int(),
  name: z.string(),
  address: z.string().nullable(),
  latestSurvey: z.object({ id: z.number().int(), name: z.string(), status: z.enum(SURVEY_STATUSES), startedOn: z.string().nullable() }).nullable(),
  counts: complianceCountsSchema.nullable(),
  rule: z.enum(DECISION_RULES).nullable(),
});
export type SiteOverview = z.infer<typeof siteOverviewSchema>;
export const sitesOverviewResponseSchema = z.object({ items: z.array(siteOverviewSchema), rule: z.enum(DECISION_RULES), ruleText: z.string() });
export type SitesOverviewResponse = z.infer<typeof sitesOverviewResponseSchema>;

export const MAINTENANCE_STATES = ['due', 'due_soon', 'ok', 'unknown'] as const;
export const MAINTENANCE_LABELS: Record<(typeof MAINTENANCE_STATES)[number], string> = {
  due: 'Maintenance due',
  due_soon: 'Due within a year',
  ok: 'No maintenance due',
  unknown: 'No signed-off value',
};

export const maintenanceZoneSchema = z.object({
  siteId: z.number().int(),
  siteName: z.string(),
  zoneId: z.number().int(),
  zoneName: z.string(),
  planName: z.string(),
  /** The maintained value Em of the latest sign-off (never Em / MF), lux. */
  targetLux: z.number(),
  state: z.enum(MAINTENANCE_STATES),
  /** Least-squares slope of the signed-off Eavg values, lux per year. */
  slopeLuxPerYear: z.number().nullable(),
  /** When the fitted line reaches Em, if it falls towards it (ISO date). */
  reachesTargetOn: z.string().nullable(),
  reason: z.string(),
  /** The zone's signed-off values, oldest first. */
  trend: z.array(z.object({ surveyId: z.number().int(), surveyName: z.string(), date: z.string(), eavg: z.number(), verdict: z.enum(VERDICTS), installation: z.enum(INSTALLATION_STATES) })),
});
export type MaintenanceZone = z.infer<typeof maintenanceZoneSchema>;
export const maintenanceResponseSchema = z.object({ rule: z.string(), items: z.array(maintenanceZoneSchema) });
export type MaintenanceResponse = z.infer<typeof maintenanceResponseSchema>;

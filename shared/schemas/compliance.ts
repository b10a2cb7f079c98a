import { z } from 'zod';
import { DECISION_RULES } from './organization';
import { TARGET_CONFIDENCE } from './targets';

export const VERDICTS = ['meets', 'falls_short', 'inconclusive', 'not_assessed'] as const;
export type ZoneVerdict = (typeof VERDICTS)[number];

export const VERDICT_LABELS: Record<ZoneVerdict, string> = {
  meets: 'Meets target',
  falls_short: 'Falls short',
  inconclusive: 'Inconclusive',
  not_assessed: 'Not assessed',
};

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
  /** Em, lux. */
  targetLux: z.number().nullable(),
  targetU0: z.number().nullable(),
  /** Valid points inside the zone and outside its wall band. */
  points: z.number().int(),
  /** Points the grid rule (GRID_RULE) asks for, from the zone's extent less the wall band. */
  requiredPoints: z.number().int(),
  gridAdequate: z.boolean(),
  /** Points left out because they lie in the wall band. */
  wallBandPoints: z.number().int(),
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
  startedOn: z.string().nullable(),
  status: z.enum(['draft', 'submitted', 'signed_off', 'returned']),
  /** The reviewer's comment (on return or sign-off). */
  reviewComment: z.string().nullable(),
  rule: z.enum(DECISION_RULES),
  ruleText: z.string(),
  gridRule: z.string(),
  /** True once signed off: the verdicts are those frozen at sign-off. */
  frozen: z.boolean(),
  frozenAt: z.string().nullable(),
  /** Whether an outdoor reference probe logged during the survey. */
  hasDaylightReference: z.boolean(),
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
  luxBound: z.enum(['exact', 'lower', 'upper']),
  flag: z.string(),
  /** In the wall band: shown, left out of the statistics. */
  inWallBand: z.boolean(),
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
});
export type ZoneDetailResponse = z.infer<typeof zoneDetailResponseSchema>;

export const siteOverviewSchema = z.object({
  siteId: z.number().int(),
  name: z.string(),
  address: z.string().nullable(),
  latestSurvey: z.object({ id: z.number().int(), name: z.string(), status: z.enum(['draft', 'submitted', 'signed_off', 'returned']), startedOn: z.string().nullable() }).nullable(),
  counts: complianceCountsSchema.nullable(),
  rule: z.enum(DECISION_RULES).nullable(),
});
export type SiteOverview = z.infer<typeof siteOverviewSchema>;
export const sitesOverviewResponseSchema = z.object({ items: z.array(siteOverviewSchema), rule: z.enum(DECISION_RULES), ruleText: z.string() });
export type SitesOverviewResponse = z.infer<typeof sitesOverviewResponseSchema>;

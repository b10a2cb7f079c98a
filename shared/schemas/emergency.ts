import { z } from 'zod';
import { multiLineText, singleLineText } from './text';
import { LUX_BOUNDS } from '../core/types';
import {
  EMERGENCY_ELEMENT_KINDS, EMERGENCY_PASSES, EMERGENCY_POINT_ROLES, EMERGENCY_SCOPES,
  type EmergencyCheck, type EmergencyCriteriaSet,
} from '../core/emergency';
import { EMERGENCY_TEST_KINDS, EMERGENCY_TEST_RESULTS } from '../core/emergency-schedule';

export const ELEMENT_KIND_LABELS: Record<(typeof EMERGENCY_ELEMENT_KINDS)[number], string> = {
  escape_route: 'Escape route',
  open_area: 'Open area',
  high_risk_area: 'High-risk task area',
  safety_equipment: 'Safety equipment',
};

export const EQUIPMENT_KINDS = ['fire_fighting', 'call_point', 'first_aid', 'other'] as const;
export const EQUIPMENT_LABELS: Record<(typeof EQUIPMENT_KINDS)[number], string> = {
  fire_fighting: 'Fire-fighting equipment',
  call_point: 'Fire alarm call point',
  first_aid: 'First-aid point',
  other: 'Other safety equipment',
};

export const SYSTEM_TYPES = ['self_contained', 'central'] as const;
export const SYSTEM_TYPE_LABELS: Record<(typeof SYSTEM_TYPES)[number], string> = {
  self_contained: 'Self-contained (battery in each luminaire)',
  central: 'Central battery or generator',
};

const planPoint = z.tuple([z.number().finite(), z.number().finite()]);
const code = z.string().trim().min(1, 'Give the element a short code such as R1').max(12).regex(/^[A-Za-z0-9_.]+$/, 'Use letters, digits, dot or underscore in a code (it starts each point label)');
const name = singleLineText(z.string().trim().min(1, 'Enter a name').max(120));
const spacing = z.number().min(0.2, 'Spacing at least 0.2 m').max(20, 'Spacing at most 20 m');

export const emergencyElementBodySchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('escape_route'), code, name,
    /** The centre line in plan metres, from one end to the other. */
    line: z.array(planPoint).min(2, 'A route needs at least two points along its centre line').max(200),
    widthM: z.number().min(0.3, 'Width at least 0.3 m').max(20, 'Width at most 20 m'),
    /** The route is (or includes) a stair flight. */
    stair: z.boolean().default(false),
    spacingM: spacing.default(2),
  }),
  z.object({ kind: z.literal('open_area'), code, name, polygon: z.array(planPoint).min(3).max(200), borderM: z.number().min(0).max(5).default(0.5), spacingM: spacing.default(2) }),
  z.object({
    kind: z.literal('high_risk_area'), code, name, polygon: z.array(planPoint).min(3).max(200), spacingM: spacing.default(1),
    /** The normal lighting's maintained illuminance the emergency level is a share of; or the zone whose target gives it. */
    normalEmLux: z.number().positive().max(100_000).nullable().default(null),
    normalZoneId: z.number().int().positive().nullable().default(null),
  }),
  z.object({ kind: z.literal('safety_equipment'), code, name, point: planPoint, equipment: z.enum(EQUIPMENT_KINDS) }),
]);
export type EmergencyElementBody = z.input<typeof emergencyElementBodySchema>;
export type ParsedElementBody = z.output<typeof emergencyElementBodySchema>;

export const plannedPointSchema = z.object({
  label: z.string(), role: z.enum(EMERGENCY_POINT_ROLES), xM: z.number(), yM: z.number(),
  /** A route wider than 2 m: the strip the point belongs to (1 = leftmost looking along the route). */
  strip: z.number().int().optional(),
});
export type PlannedPointDto = z.infer<typeof plannedPointSchema>;

export const emergencyElementSchema = z.object({
  id: z.number().int(),
  planId: z.number().int(),
  kind: z.enum(EMERGENCY_ELEMENT_KINDS),
  code: z.string(),
  name: z.string(),
  /** Route: centre line; areas: outline; equipment: one point. */
  geometry: z.array(planPoint),
  widthM: z.number().nullable(),
  stair: z.boolean(),
  borderM: z.number().nullable(),
  spacingM: z.number().nullable(),
  normalEmLux: z.number().nullable(),
  normalZoneId: z.number().int().nullable(),
  /** normalEmLux, or the target of normalZoneId's zone, or null. */
  effectiveNormalEmLux: z.number().nullable(),
  equipment: z.enum(EQUIPMENT_KINDS).nullable(),
  /** Route length or area, for the list. */
  lengthM: z.number().nullable(),
  plannedPoints: z.array(plannedPointSchema),
  createdAt: z.string(),
});
export type EmergencyElement = z.infer<typeof emergencyElementSchema>;
export const emergencyElementListSchema = z.object({ items: z.array(emergencyElementSchema) });

const limitSchema = z.object({ value: z.number().positive(), unit: z.enum(['lx', 'fc']) });
const checkBase = {
  id: singleLineText(z.string().trim().min(1).max(40)),
  appliesTo: z.array(z.enum(EMERGENCY_ELEMENT_KINDS)).min(1),
  pass: z.enum([...EMERGENCY_PASSES, 'each']),
  source: singleLineText(z.string().trim().min(1, 'Name the source of each check').max(300)),
};
export const emergencyCheckSchema = z.discriminatedUnion('kind', [
  z.object({ ...checkBase, kind: z.literal('min'), scope: z.enum(EMERGENCY_SCOPES), limit: limitSchema }),
  z.object({ ...checkBase, kind: z.literal('average'), scope: z.enum(EMERGENCY_SCOPES), limit: limitSchema }),
  z.object({ ...checkBase, kind: z.literal('max_min_ratio'), scope: z.enum(EMERGENCY_SCOPES), maxRatio: z.number().gt(1) }),
  z.object({ ...checkBase, kind: z.literal('min_over_max'), scope: z.enum(EMERGENCY_SCOPES), minRatio: z.number().gt(0).lte(1) }),
  z.object({ ...checkBase, kind: z.literal('share_of_normal'), scope: z.enum(EMERGENCY_SCOPES), share: z.number().gt(0).lte(1), floor: limitSchema }),
  z.object({ ...checkBase, kind: z.literal('response'), share: z.number().gt(0).lte(1), withinS: z.number().positive() }),
  z.object({ ...checkBase, kind: z.literal('route_width'), maxWidthM: z.number().positive() }),
]);

export const criteriaSetBodySchema = z.object({
  name: singleLineText(z.string().trim().min(1).max(120)),
  source: singleLineText(z.string().trim().min(1, 'Say what the set stands on').max(300)),
  requiredPasses: z.array(z.enum(EMERGENCY_PASSES)),
  checks: z.array(emergencyCheckSchema).min(1).max(60).refine((cs) => new Set(cs.map((c) => c.id)).size === cs.length, 'Each check needs its own id'),
  notes: z.array(multiLineText(z.string().max(500))).max(20).default([]),
});
export type CriteriaSetBody = z.input<typeof criteriaSetBodySchema>;

export const criteriaSetSchema = criteriaSetBodySchema.extend({ key: z.string(), builtIn: z.boolean() });
export type CriteriaSetDto = z.infer<typeof criteriaSetSchema>;
export const criteriaSetKeyParamsSchema = z.object({ key: z.string().min(1).max(40) });
export const criteriaSetListSchema = z.object({ items: z.array(criteriaSetSchema) });

// The API's check shape and the core's must stay one: this fails to compile if they drift.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const checksAgree: Same<z.output<typeof emergencyCheckSchema>, EmergencyCheck> = true;
void checksAgree;
export type { EmergencyCriteriaSet };

export const emergencyConditionsSchema = z.object({
  systemType: z.enum(SYSTEM_TYPES),
  /** Rated duration of the installation, minutes (60, 90, 180 are usual). */
  ratedDurationMin: z.number().int().min(10, 'Rated duration at least 10 min').max(1440),
  /** When the normal supply was cut for the test (ISO 8601 with offset). */
  mainsOffAt: z.iso.datetime({ offset: true, message: 'Use a time such as 2026-11-20T20:00:00+00:00' }),
  normalLightingOff: z.boolean(),
  daylightExcluded: z.boolean(),
  notes: multiLineText(z.string().trim().max(1000)).optional(),
});
export type EmergencyConditions = z.infer<typeof emergencyConditionsSchema>;

export const createEmergencySurveyBodySchema = z.object({
  siteId: z.number().int().positive(),
  name: singleLineText(z.string().trim().min(1, 'Enter a survey name').max(160)),
  startedOn: z.iso.date({ message: 'Use a date such as 2026-11-20' }).optional(),
  criteriaSetKey: z.string().min(1),
  conditions: emergencyConditionsSchema,
});
export type CreateEmergencySurveyBody = z.input<typeof createEmergencySurveyBodySchema>;

export const updateEmergencySurveyBodySchema = z.object({
  criteriaSetKey: z.string().min(1).optional(),
  conditions: emergencyConditionsSchema.optional(),
});

export const logPassBodySchema = z.object({
  /** The pass the whole log holds; null: split its readings by time after the mains failed. */
  pass: z.enum(EMERGENCY_PASSES).nullable(),
});
export const logPassParamsSchema = z.object({ id: z.coerce.number().int().positive(), importId: z.coerce.number().int().positive() });

export const responseTimesBodySchema = z.object({
  toHalfS: z.number().min(0).max(3600).nullable(),
  toFullS: z.number().min(0).max(3600).nullable(),
});
export type ResponseTimesBody = z.infer<typeof responseTimesBodySchema>;
export const elementResponseParamsSchema = z.object({ id: z.coerce.number().int().positive(), elementId: z.coerce.number().int().positive() });

const verdictEnum = z.enum(['meets', 'falls_short', 'inconclusive', 'not_judged']);
const statBound = z.enum(['lower', 'upper', 'indeterminate']).nullable();

export const checkResultSchema = z.object({
  checkId: z.string(), kind: z.string(), pass: z.enum(EMERGENCY_PASSES).nullable(), verdict: z.enum(['meets', 'falls_short', 'inconclusive']),
  value: z.number().nullable(), valueBound: statBound, uncertainty: z.number().nullable(), limit: z.number().nullable(),
  worstPoint: z.string().nullable(), text: z.string(), source: z.string(), roundingNote: z.string().nullable(),
});
export const pointResultSchema = z.object({
  label: z.string(), role: z.enum(EMERGENCY_POINT_ROLES), pass: z.enum(EMERGENCY_PASSES), lux: z.number().nullable(),
  luxBound: z.enum(LUX_BOUNDS), uLux: z.number(), flag: z.string(), limitLux: z.number().nullable(), verdict: verdictEnum,
  xM: z.number().nullable(), yM: z.number().nullable(), readingId: z.number().int(),
});

export const elementVerdictSchema = z.object({
  element: emergencyElementSchema,
  planName: z.string(),
  verdict: verdictEnum,
  checks: z.array(checkResultSchema),
  points: z.array(pointResultSchema),
  worstPoint: z.object({ label: z.string(), pass: z.enum(EMERGENCY_PASSES), lux: z.number(), luxBound: z.enum(LUX_BOUNDS), uLux: z.number() }).nullable(),
  reasons: z.array(z.string()),
  response: responseTimesBodySchema.nullable(),
  /** Planned points with no reading in a pass. */
  unmeasured: z.array(z.object({ pass: z.enum(EMERGENCY_PASSES), labels: z.array(z.string()) })),
});
export type ElementVerdict = z.infer<typeof elementVerdictSchema>;

export const passSummarySchema = z.object({
  pass: z.enum(EMERGENCY_PASSES),
  readings: z.number().int(),
  firstAt: z.string().nullable(),
  lastAt: z.string().nullable(),
  /** Minutes from the mains failing to the first and last reading. */
  fromMin: z.number().nullable(),
  toMin: z.number().nullable(),
});

export const emergencySurveySchema = z.object({
  surveyId: z.number().int(),
  name: z.string(),
  siteId: z.number().int(),
  siteName: z.string(),
  siteTimeZone: z.string(),
  status: z.string(),
  startedOn: z.string().nullable(),
  criteriaSet: criteriaSetSchema,
  conditions: emergencyConditionsSchema,
  rule: z.enum(['simple', 'guarded']),
  ruleText: z.string(),
  verdict: verdictEnum,
  passes: z.array(passSummarySchema),
  /** The survey's logs: the pass the surveyor said each holds (null: its readings are split by time), and its readings in the current decode. */
  logs: z.array(z.object({ importId: z.number().int(), filename: z.string(), uploadedAt: z.string(), pass: z.enum(EMERGENCY_PASSES).nullable(), readings: z.number().int() })),
  elements: z.array(elementVerdictSchema),
  /** Readings before the mains failed, or whose label and position match no element. */
  readingsBeforeMainsOff: z.number().int(),
  readingsUnmatched: z.number().int(),
  warnings: z.array(z.string()),
  cautions: z.array(z.string()),
  canEdit: z.boolean(),
  /** Set once signed off: the verdicts, criteria and logbook shown are those frozen at that moment. */
  frozenAt: z.string().nullable(),
  /** The review record: who submitted and signed off, when, and a returned survey's comment. */
  review: z.object({ submittedByName: z.string().nullable(), submittedAt: z.string().nullable(), signedOffByName: z.string().nullable(), signedOffAt: z.string().nullable(), reviewComment: z.string().nullable() }),
});
export type EmergencySurvey = z.infer<typeof emergencySurveySchema>;

export const emergencySurveyListItemSchema = z.object({ surveyId: z.number().int(), name: z.string(), siteId: z.number().int(), siteName: z.string(), status: z.string(), criteriaSetKey: z.string(), startedOn: z.string().nullable(), createdAt: z.string() });
export const emergencySurveyListSchema = z.object({ items: z.array(emergencySurveyListItemSchema) });
export const emergencySurveyListQuerySchema = z.object({ siteId: z.coerce.number().int().positive().optional() });

export const logbookEntryBodySchema = z.object({
  kind: z.enum(EMERGENCY_TEST_KINDS),
  testedOn: z.iso.date({ message: 'Use a date such as 2026-11-20' }),
  testedBy: singleLineText(z.string().trim().min(1, 'Say who tested').max(120)),
  result: z.enum(EMERGENCY_TEST_RESULTS),
  /** Fittings that failed (codes or locations), one per entry. */
  failedFittings: z.array(singleLineText(z.string().trim().min(1).max(120))).max(500).default([]),
  remarks: multiLineText(z.string().trim().max(2000)).default(''),
}).refine((b) => b.result === 'fail' || b.failedFittings.length === 0, { message: 'A passed test lists no failed fittings', path: ['failedFittings'] })
  .refine((b) => b.result === 'pass' || b.failedFittings.length > 0 || b.remarks.length > 0, { message: 'Say which fittings failed or what went wrong', path: ['failedFittings'] });
export type LogbookEntryBody = z.input<typeof logbookEntryBodySchema>;

export const logbookEntrySchema = z.object({
  id: z.number().int(), siteId: z.number().int(), kind: z.enum(EMERGENCY_TEST_KINDS), testedOn: z.string(), testedBy: z.string(),
  result: z.enum(EMERGENCY_TEST_RESULTS), failedFittings: z.array(z.string()), remarks: z.string(), recordedByName: z.string().nullable(), createdAt: z.string(),
});
export type LogbookEntry = z.infer<typeof logbookEntrySchema>;

export const testDueSchema = z.object({
  kind: z.enum(EMERGENCY_TEST_KINDS), lastTestedOn: z.string().nullable(), lastResult: z.enum(EMERGENCY_TEST_RESULTS).nullable(),
  dueOn: z.string().nullable(), state: z.enum(['ok', 'due_soon', 'overdue', 'never_tested']), daysOverdue: z.number().int(),
});
export type TestDueDto = z.infer<typeof testDueSchema>;

export const testScheduleSchema = z.object({
  functionalEveryDays: z.number().int().min(1).max(366),
  fullDurationEveryMonths: z.number().int().min(1).max(60),
});

export const siteLogbookSchema = z.object({
  siteId: z.number().int(), siteName: z.string(), siteTimeZone: z.string(), today: z.string(),
  schedule: testScheduleSchema, due: z.array(testDueSchema), entries: z.array(logbookEntrySchema), total: z.number().int(),
});
export type SiteLogbook = z.infer<typeof siteLogbookSchema>;
export const logbookQuerySchema = z.object({ limit: z.coerce.number().int().min(1).max(500).default(50) });

export const testsDueOverviewSchema = z.object({
  schedule: testScheduleSchema,
  sites: z.array(z.object({ siteId: z.number().int(), siteName: z.string(), today: z.string(), due: z.array(testDueSchema) })),
});
export type TestsDueOverview = z.infer<typeof testsDueOverviewSchema>;

export const EMERGENCY_CAUTIONS = [
  'Luxtrail supports the check of emergency lighting; it does not certify an installation.',
  'A competent person and the local codes and regulations decide whether the installation complies; they take precedence over the criteria sets Luxtrail ships.',
  'Stairs, exits and escape routes need the judgement of a qualified lighting professional.',
] as const;

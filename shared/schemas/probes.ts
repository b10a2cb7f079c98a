import { z } from 'zod';
import { SURVEY_STATUSES } from './surveys';
import { multiLineText } from './text';
import { METER_CLASSES, METER_CLASS_LIMIT } from '../core/typed-readings';

export const PROBE_KINDS = ['counts', 'current_4_20', 'voltage_0_10', 'manual'] as const;
export const PROBE_STATUSES = ['in_service', 'out_of_service', 'retired'] as const;
export const ANALOG_SCALES = ['linear', 'log10'] as const;
export type ProbeKind = (typeof PROBE_KINDS)[number];
export type ProbeStatus = (typeof PROBE_STATUSES)[number];

export const PROBE_KIND_LABELS: Record<ProbeKind, string> = {
  counts: 'Counting (ADC with gain steps)',
  current_4_20: '4-20 mA transmitter',
  voltage_0_10: '0-10 V transmitter',
  manual: 'Hand-held meter, values typed',
};

/** A manual meter's class choices as shown (DIN 5032-7:1985 total error limits, secondary source). */
export const METER_CLASS_LABELS = Object.fromEntries(METER_CLASSES.map((c) => [c, `Class ${c} (±${Math.round(METER_CLASS_LIMIT[c] * 100)} %)`])) as Record<(typeof METER_CLASSES)[number], string>;
export const PROBE_STATUS_LABELS: Record<ProbeStatus, string> = {
  in_service: 'In service',
  out_of_service: 'Out of service',
  retired: 'Retired',
};

/** Gain codes a counting probe may declare (the core indexes codes 0..65535 directly). */
export const MAX_GAIN_CODE = 65535;
export const MIN_GAIN_STEPS = 2;
export const MAX_GAIN_STEPS = 16;

export const gainStepSchema = z.object({
  code: z.number().int('A gain code is a whole number').min(0).max(MAX_GAIN_CODE),
  nominalGain: z.number().positive('A nominal gain must be positive').max(1e9),
});
export type GainStepInput = z.infer<typeof gainStepSchema>;

const optionalNumber = z.number().finite().nullable().optional();

/** The fields of a probe; which ones are required depends on its kind (see probeFieldIssues). */
export const probeFieldsSchema = z.object({
  serial: z.string().trim().min(1, 'Enter the serial number').max(60).regex(/^[A-Za-z0-9][A-Za-z0-9._\-/]*$/, 'Use letters, digits and . _ - / only'),
  kind: z.enum(PROBE_KINDS),
  description: multiLineText(z.string().trim().max(500)).default(''),
  status: z.enum(PROBE_STATUSES).default('in_service'),
  fullScaleCounts: z.number().int().positive().max(2 ** 31 - 1).nullable().optional(),
  saturationCounts: z.number().int().positive().max(2 ** 31 - 1).nullable().optional(),
  floorCounts: z.number().int().min(0).max(2 ** 31 - 1).nullable().optional(),
  gains: z.array(gainStepSchema).max(MAX_GAIN_STEPS, `At most ${MAX_GAIN_STEPS} gain steps`).nullable().optional(),
  rangeLowLux: optionalNumber,
  rangeHighLux: optionalNumber,
  scale: z.enum(ANALOG_SCALES).nullable().optional(),
  accuracyPercent: z.number().min(0).max(50).nullable().optional(),
  /** Manual meters: DIN 5032-7 class, or null to take the certificate's uncertainty from the coefficient set. */
  meterClass: z.enum(METER_CLASSES).nullable().optional(),
});
export type ProbeFields = z.infer<typeof probeFieldsSchema>;

type Issue = { path: string; message: string };

/** Rules that span fields (kind-dependent). Used by the body schema and by PATCH on the merged record. */
export function probeFieldIssues(p: ProbeFields): Issue[] {
  const issues: Issue[] = [];
  if (p.kind === 'counts') {
    if (p.fullScaleCounts == null) issues.push({ path: 'fullScaleCounts', message: 'A counting probe needs its ADC full scale' });
    if (p.saturationCounts == null) issues.push({ path: 'saturationCounts', message: 'A counting probe needs its saturation threshold' });
    if (p.floorCounts == null) issues.push({ path: 'floorCounts', message: 'A counting probe needs its low-signal floor' });
    if (p.fullScaleCounts != null && p.saturationCounts != null && p.saturationCounts > p.fullScaleCounts) {
      issues.push({ path: 'saturationCounts', message: `Saturation (${p.saturationCounts}) cannot exceed the full scale (${p.fullScaleCounts})` });
    }
    if (p.saturationCounts != null && p.floorCounts != null && p.floorCounts >= p.saturationCounts) {
      issues.push({ path: 'floorCounts', message: 'The low-signal floor must be below saturation' });
    }
    const gains = p.gains ?? [];
    if (gains.length < MIN_GAIN_STEPS) issues.push({ path: 'gains', message: `A counting probe needs at least ${MIN_GAIN_STEPS} gain steps` });
    const seen = new Set<number>();
    gains.forEach((g, i) => {
      if (seen.has(g.code)) issues.push({ path: `gains.${i}.code`, message: `Gain code ${g.code} appears twice` });
      seen.add(g.code);
    });
  } else if (p.kind === 'manual') {
    // The display's range is optional; values beyond it are refused when given.
    if (p.rangeLowLux != null && p.rangeLowLux < 0) issues.push({ path: 'rangeLowLux', message: 'The range low cannot be negative' });
    if (p.rangeLowLux != null && p.rangeHighLux != null && p.rangeHighLux <= p.rangeLowLux) {
      issues.push({ path: 'rangeHighLux', message: 'The range high must be above the range low' });
    }
  } else {
    if (p.rangeLowLux == null) issues.push({ path: 'rangeLowLux', message: 'An analog probe needs its range low (lux)' });
    if (p.rangeHighLux == null) issues.push({ path: 'rangeHighLux', message: 'An analog probe needs its range high (lux)' });
    if (p.scale == null) issues.push({ path: 'scale', message: 'Choose linear or log10 scaling' });
    if (p.accuracyPercent == null) issues.push({ path: 'accuracyPercent', message: 'Enter the transmitter\'s stated accuracy (%)' });
    if (p.rangeLowLux != null && p.rangeLowLux < 0) issues.push({ path: 'rangeLowLux', message: 'The range low cannot be negative' });
    if (p.rangeLowLux != null && p.rangeHighLux != null && p.rangeHighLux <= p.rangeLowLux) {
      issues.push({ path: 'rangeHighLux', message: 'The range high must be above the range low' });
    }
    if (p.scale === 'log10' && p.rangeLowLux != null && p.rangeLowLux <= 0) {
      issues.push({ path: 'rangeLowLux', message: 'A log10 range must start above 0 lx' });
    }
  }
  return issues;
}

function refineProbe(p: ProbeFields, ctx: z.RefinementCtx) {
  for (const i of probeFieldIssues(p)) ctx.addIssue({ code: 'custom', path: i.path.split('.').map((s) => (/^\d+$/.test(s) ? Number(s) : s)), message: i.message });
}

export const createProbeBodySchema = probeFieldsSchema.superRefine(refineProbe);
export type CreateProbeBody = z.input<typeof createProbeBodySchema>;

/** Any subset of the fields; the merged probe must still satisfy probeFieldIssues. */
export const updateProbeBodySchema = probeFieldsSchema.partial()
  .extend({ description: multiLineText(z.string().trim().max(500)).optional(), status: z.enum(PROBE_STATUSES).optional() })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateProbeBody = z.infer<typeof updateProbeBodySchema>;

export const CALIBRATION_STATES = ['ok', 'due_soon', 'overdue', 'no_approved_set'] as const;
export type CalibrationState = (typeof CALIBRATION_STATES)[number];

export const probeSchema = z.object({
  id: z.number().int(),
  serial: z.string(),
  kind: z.enum(PROBE_KINDS),
  description: z.string(),
  status: z.enum(PROBE_STATUSES),
  fullScaleCounts: z.number().nullable(),
  saturationCounts: z.number().nullable(),
  floorCounts: z.number().nullable(),
  gains: z.array(gainStepSchema).nullable(),
  rangeLowLux: z.number().nullable(),
  rangeHighLux: z.number().nullable(),
  scale: z.enum(ANALOG_SCALES).nullable(),
  accuracyPercent: z.number().nullable(),
  meterClass: z.enum(METER_CLASSES).nullable(),
  /** The approved set in force now, if any. */
  currentSet: z.object({ id: z.number().int(), version: z.number().int(), effectiveFrom: z.string(), dueDate: z.string(), certificateNumber: z.string() }).nullable(),
  calibrationState: z.enum(CALIBRATION_STATES),
  draftCount: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type ProbeDto = z.infer<typeof probeSchema>;
export const probeListResponseSchema = z.object({ items: z.array(probeSchema) });

export const probeListQuerySchema = z.object({
  status: z.enum(PROBE_STATUSES).optional(),
  kind: z.enum(PROBE_KINDS).optional(),
});

/** Days ahead the dashboard calls "due soon". */
export const DASHBOARD_DUE_SOON_DAYS = 30;

/** One row of the calibration dashboard. */
export const dashboardRowSchema = z.object({
  probeId: z.number().int(),
  serial: z.string(),
  kind: z.enum(PROBE_KINDS),
  status: z.enum(PROBE_STATUSES),
  description: z.string(),
  calibrationState: z.enum(CALIBRATION_STATES),
  currentSetId: z.number().int().nullable(),
  currentVersion: z.number().int().nullable(),
  certificateNumber: z.string().nullable(),
  dueDate: z.string().nullable(),
  /** Whole days from now to the due date (negative: overdue). */
  daysUntilDue: z.number().int().nullable(),
  draftCount: z.number().int(),
  lastReminderAt: z.string().nullable(),
});
export type DashboardRow = z.infer<typeof dashboardRowSchema>;
export const dashboardResponseSchema = z.object({ now: z.string(), dueSoonDays: z.number().int(), items: z.array(dashboardRowSchema) });
export type DashboardResponse = z.infer<typeof dashboardResponseSchema>;

/** A survey whose current readings used a probe, and how many of them a re-decode would change. */
export const probeSurveySchema = z.object({
  surveyId: z.number().int(),
  name: z.string(),
  siteName: z.string(),
  status: z.enum(SURVEY_STATUSES),
  readings: z.number().int(),
  /** Readings decoded with a set other than the approved set now in force at their time. */
  staleReadings: z.number().int(),
  /** Signed-off surveys are frozen: they are never re-decoded. */
  canRedecode: z.boolean(),
});
export type ProbeSurvey = z.infer<typeof probeSurveySchema>;
export const probeSurveysResponseSchema = z.object({ items: z.array(probeSurveySchema) });

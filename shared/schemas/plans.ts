import { z } from 'zod';
import { singleLineText } from './text';
import { LUX_BOUNDS, READING_ROLES } from '../core/types';

/** Largest plan image accepted, bytes; larger plans are better exported at a lower resolution. */
export const PLAN_IMAGE_MAX_BYTES = 25 * 1024 * 1024;
/** Longest image side accepted, pixels (beyond this browsers struggle to draw the overlay). */
export const PLAN_IMAGE_MAX_SIDE_PX = 16_384;
/** Scale points closer than this (pixels) give too coarse a scale. */
export const MIN_SCALE_SPAN_PX = 10;

const widthM = z.coerce.number({ message: 'The plan width must be a number of metres' })
  .positive('The plan width must be more than 0 m').max(100_000, 'The plan width is at most 100 km');

/** The multipart text fields of an upload (the image goes in the field `file`). */
export const createPlanFieldsSchema = z.object({
  name: singleLineText(z.string().trim().min(1, 'Give the plan a name').max(120, 'Use at most 120 characters')),
  widthM: z.preprocess((v) => (v === '' ? undefined : v), widthM.optional()),
});
export type CreatePlanFields = z.infer<typeof createPlanFieldsSchema>;

const pixelPoint = z.tuple([z.number().min(0), z.number().min(0)]);

/**
 * Either rename / give the width, or set the scale from two image points (pixels from the
 * image's top-left corner) and the distance between them in metres.
 */
export const updatePlanBodySchema = z.object({
  name: createPlanFieldsSchema.shape.name.optional(),
  widthM: z.number().positive('The plan width must be more than 0 m').max(100_000).optional(),
  scalePoints: z.tuple([pixelPoint, pixelPoint]).optional(),
  distanceM: z.number().positive('The distance must be more than 0 m').max(100_000).optional(),
}).superRefine((b, ctx) => {
  if ((b.scalePoints === undefined) !== (b.distanceM === undefined)) {
    ctx.addIssue({ code: 'custom', path: [b.scalePoints ? 'distanceM' : 'scalePoints'], message: 'Send scalePoints and distanceM together' });
  }
  if (b.scalePoints && b.widthM !== undefined) {
    ctx.addIssue({ code: 'custom', path: ['widthM'], message: 'Set the scale either by width or by two points, not both' });
  }
  if (b.name === undefined && b.widthM === undefined && b.scalePoints === undefined) {
    ctx.addIssue({ code: 'custom', path: [], message: 'Send a name, a width or two scale points' });
  }
});
export type UpdatePlanBody = z.infer<typeof updatePlanBodySchema>;

export const planSchema = z.object({
  id: z.number().int(),
  siteId: z.number().int(),
  name: z.string(),
  widthPx: z.number().int(),
  heightPx: z.number().int(),
  /** Null until the scale is set. */
  metresPerPixel: z.number().nullable(),
  widthM: z.number().nullable(),
  heightM: z.number().nullable(),
  imageUrl: z.string(),
  imageSha256: z.string(),
  contentType: z.string(),
  zoneCount: z.number().int(),
  createdAt: z.string(),
});
export type Plan = z.infer<typeof planSchema>;

export const planListResponseSchema = z.object({ items: z.array(planSchema) });
export type PlanListResponse = z.infer<typeof planListResponseSchema>;

export const surveyMapQuerySchema = z.object({ planId: z.coerce.number().int().positive().optional() });

const readingFlag = z.enum(['ok', 'over_range', 'under_range', 'fault', 'calibration_lapsed', 'low_confidence']);

export const mapReadingSchema = z.object({
  id: z.number().int(),
  point: z.string(),
  xM: z.number(),
  yM: z.number(),
  role: z.enum(READING_ROLES),
  lux: z.number().nullable(),
  /** Expanded uncertainty U (k = 2), lux. */
  uLux: z.number().nullable(),
  luxBound: z.enum(LUX_BOUNDS),
  flag: readingFlag,
  timestamp: z.string(),
  probe: z.string(),
  gainCode: z.number().int().nullable(),
  zoneId: z.number().int().nullable(),
  inWallBand: z.boolean(),
});
export type MapReading = z.infer<typeof mapReadingSchema>;

export const mapZoneSummarySchema = z.object({
  zoneId: z.number().int(),
  /** Task points in the zone outside its wall band (the ones its statistics use). */
  points: z.number().int(),
  wallBandPoints: z.number().int(),
  eavg: z.number().nullable(),
  /** 'lower' / 'upper' when over- or under-range points make Eavg a bound; 'indeterminate' when no figure. */
  eavgBound: z.enum(['lower', 'upper', 'indeterminate']).nullable(),
  uEavg: z.number().nullable(),
});
export type MapZoneSummary = z.infer<typeof mapZoneSummarySchema>;

export const surveyMapResponseSchema = z.object({
  surveyId: z.number().int(),
  surveyName: z.string(),
  siteId: z.number().int(),
  /** The site's IANA time zone: reading times are shown in it. */
  siteTimeZone: z.string(),
  planId: z.number().int(),
  readings: z.array(mapReadingSchema),
  zones: z.array(mapZoneSummarySchema),
  /** Readings of the survey without a position (they cannot be drawn on any plan). */
  withoutPosition: z.number().int(),
  /** Readings of the survey with a position but no plan (the log named none and the site has several plans). */
  withoutPlan: z.number().int(),
  /** Readings of this plan whose position lies beyond the plan's edge (or all of them while it has no scale). */
  outsidePlan: z.number().int(),
  /** When the plan holds more readings than the map draws: how many it holds (the map shows an even sample of them). */
  sampledFrom: z.number().int().nullable(),
  /** Why nothing is placed (e.g. the plan has no scale yet). */
  notice: z.string().nullable(),
});
export type SurveyMapResponse = z.infer<typeof surveyMapResponseSchema>;

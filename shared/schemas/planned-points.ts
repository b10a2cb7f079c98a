import { z } from 'zod';
import { GRID_ROUNDINGS, GRID_LAYOUTS, GRID_SURFACES, PLANNED_PLANES, WALL_HEIGHT_RANGE_M } from '../spatial/measurement-grid';
import { mapReadingSchema } from './plans';
import { multiLineText } from './text';

/** A planned point from the grid generator, or one added by hand. Stored codes. */
export const POINT_ORIGINS = ['generated', 'added'] as const;
/** A hand placement: 'placed' at a position, 'unplaced' (no position), 'as_logged' (the log's position, only an exclusion recorded). Stored codes. */
export const PLACEMENT_STATES = ['placed', 'unplaced', 'as_logged'] as const;

export { GRID_ROUNDINGS, GRID_LAYOUTS, GRID_SURFACES };

export const GRID_ROUNDING_LABELS: Record<(typeof GRID_ROUNDINGS)[number], string> = {
  next_higher: 'Next higher integer (EN 12464-1:2011 text)',
  nearest: 'Nearest integer (EN 12464-1:2021 as reported, secondary)',
};

export const GRID_SURFACE_LABELS: Record<(typeof GRID_SURFACES)[number], string> = {
  working_plane: 'Working plane',
  walls: 'Walls',
  ceiling: 'Ceiling',
};

export const PLANNED_PLANE_LABELS: Record<(typeof PLANNED_PLANES)[number], string> = {
  horizontal: 'Working plane',
  wall: 'Wall',
  ceiling: 'Ceiling',
};

/**
 * Where a planned point is read, in words (screens and the walk sheet): the working plane, a wall
 * at its height and facing, or the ceiling. `metres` formats the wall point's height.
 */
export function plannedPlaceText(p: { plane: (typeof PLANNED_PLANES)[number]; heightM: number | null; azimuthDeg: number | null }, metres: (v: number) => string): string {
  if (p.plane === 'wall') return `${PLANNED_PLANE_LABELS.wall}, ${metres(p.heightM ?? 0)} m up, facing ${Math.round(p.azimuthDeg ?? 0)}°`;
  if (p.plane === 'ceiling') return `${PLANNED_PLANE_LABELS.ceiling}, facing down`;
  return PLANNED_PLANE_LABELS.horizontal;
}

export const GRID_LAYOUT_LABELS: Record<(typeof GRID_LAYOUTS)[number], string> = {
  full: 'Full grid',
  centreline: 'Centreline row (narrow zones)',
};

const reasonSchema = multiLineText(z.string().trim().min(3, 'Write a reason of at least 3 characters').max(1000, 'Use at most 1,000 characters'));
const metres = (what: string) => z.number({ message: `${what} must be a number of metres` }).finite();

/** A planned point label: letters, digits, dot, dash, underscore; compared trimmed and case-insensitively. */
export const plannedLabelSchema = z.string().trim().min(1, 'Give the point a label').max(40, 'Use at most 40 characters')
  .regex(/^[A-Za-z0-9][A-Za-z0-9._-]*$/, 'Use letters, digits, dots, dashes and underscores, starting with a letter or digit');

export const generateGridBodySchema = z.object({
  zoneId: z.number().int().positive().optional(),
  planId: z.number().int().positive().optional(),
  /** Defaults to the survey's rounding; another value changes the survey's rule (audited). */
  rounding: z.enum(GRID_ROUNDINGS, { message: 'Rounding must be next_higher or nearest' }).optional(),
  /** 'auto': the full grid (a narrow zone may ask for 'centreline'). */
  layout: z.enum(GRID_LAYOUTS, { message: 'Layout must be full or centreline' }).default('full'),
  /** The surface to grid: the working plane (default), or a room's walls or ceiling (planned on request, EN 12464-1:2021). */
  surface: z.enum(GRID_SURFACES, { message: 'Surface must be working_plane, walls or ceiling' }).default('working_plane'),
  /** The room's height, metres: needed for walls. */
  wallHeightM: z.number({ message: 'wallHeightM must be a number of metres' }).min(WALL_HEIGHT_RANGE_M.min, `The room height must be at least ${WALL_HEIGHT_RANGE_M.min} m`).max(WALL_HEIGHT_RANGE_M.max, `The room height must be at most ${WALL_HEIGHT_RANGE_M.max} m`).optional(),
}).refine((b) => (b.zoneId === undefined) !== (b.planId === undefined), { message: 'Name either a zoneId or a planId', path: ['zoneId'] })
  .refine((b) => b.surface !== 'walls' || b.wallHeightM !== undefined, { message: 'Give the room height (wallHeightM, metres) to plan wall grids', path: ['wallHeightM'] })
  .refine((b) => b.surface === 'working_plane' || b.layout === 'full', { message: 'A centreline row is for the working plane of a narrow zone', path: ['layout'] });
export type GenerateGridBody = z.input<typeof generateGridBodySchema>;

export const createPlannedPointBodySchema = z.object({
  zoneId: z.number().int().positive(),
  xM: metres('xM'),
  yM: metres('yM'),
  label: plannedLabelSchema.optional(),
  reason: reasonSchema.optional(),
});
export type CreatePlannedPointBody = z.infer<typeof createPlannedPointBodySchema>;

export const movePlannedPointBodySchema = z.object({
  xM: metres('xM'),
  yM: metres('yM'),
  reason: reasonSchema.optional(),
});
export type MovePlannedPointBody = z.infer<typeof movePlannedPointBodySchema>;

export const deletePlannedPointQuerySchema = z.object({ reason: reasonSchema.optional() });

export const justifyGridBodySchema = z.object({ reason: reasonSchema });

export const surveyPointParamsSchema = z.object({ id: z.coerce.number().int().positive(), pointId: z.coerce.number().int().positive() });
export const surveyGridParamsSchema = z.object({ id: z.coerce.number().int().positive(), gridId: z.coerce.number().int().positive() });
export const plannedPointsQuerySchema = z.object({ planId: z.coerce.number().int().positive().optional() });

export const plannedPointSchema = z.object({
  id: z.number().int(),
  gridId: z.number().int(),
  planId: z.number().int(),
  zoneId: z.number().int(),
  label: z.string(),
  xM: z.number(),
  yM: z.number(),
  plane: z.enum(PLANNED_PLANES),
  /** A wall point's height above the floor, metres. */
  heightM: z.number().nullable(),
  /** A wall point's facing, degrees clockwise from the plan's up. */
  azimuthDeg: z.number().nullable(),
  origin: z.enum(POINT_ORIGINS),
  /** Readings of the current decode that name this point (label) or were placed on it. */
  readingCount: z.number().int(),
});
export type PlannedPoint = z.infer<typeof plannedPointSchema>;

export const surveyGridSchema = z.object({
  id: z.number().int(),
  zoneId: z.number().int(),
  zoneName: z.string(),
  planId: z.number().int(),
  code: z.string(),
  surface: z.enum(GRID_SURFACES),
  /** The room height of a wall grid, metres. */
  wallHeightM: z.number().nullable(),
  rounding: z.enum(GRID_ROUNDINGS),
  layout: z.enum(GRID_LAYOUTS),
  spacingM: z.number(),
  dM: z.number(),
  generatedCount: z.number().int(),
  pointCount: z.number().int(),
  /** Points of the full grid under each reading of the rounding, from the zone's outline now. */
  countsByRounding: z.object({ next_higher: z.number().int(), nearest: z.number().int() }),
  /** True when the two readings give different counts for this zone. */
  roundingsDiffer: z.boolean(),
  /** The grid differs from the one generated (points added, moved or deleted). */
  changed: z.boolean(),
  reason: z.string().nullable(),
  /** The zone qualifies for the centreline row. */
  narrow: z.boolean(),
  notes: z.array(z.string()),
});
export type SurveyGrid = z.infer<typeof surveyGridSchema>;

export const plannedPointsResponseSchema = z.object({
  surveyId: z.number().int(),
  rounding: z.enum(GRID_ROUNDINGS),
  roundingText: z.string(),
  grids: z.array(surveyGridSchema),
  items: z.array(plannedPointSchema),
});
export type PlannedPointsResponse = z.infer<typeof plannedPointsResponseSchema>;

/** A reading without a position, for the hand-placement panel. */
export const unplacedReadingSchema = mapReadingSchema.pick({ id: true, point: true, timestamp: true, probe: true, role: true, lux: true, uLux: true, luxBound: true, flag: true });
export const unplacedResponseSchema = z.object({
  total: z.number().int(),
  groups: z.array(z.object({ point: z.string(), readings: z.array(unplacedReadingSchema) })),
});
export type UnplacedResponse = z.infer<typeof unplacedResponseSchema>;

export const surveyReadingParamsSchema = z.object({ id: z.coerce.number().int().positive(), readingId: z.coerce.number().int().positive() });

export const placementBodySchema = z.union([
  z.object({ planId: z.number().int().positive(), xM: metres('xM'), yM: metres('yM'), reason: reasonSchema.optional() }),
  z.object({ plannedPointId: z.number().int().positive(), reason: reasonSchema.optional() }),
  z.object({ unplace: z.literal(true), reason: reasonSchema }),
], { message: 'Send {planId, xM, yM}, {plannedPointId} or {unplace: true, reason}' });
export type PlacementBody = z.infer<typeof placementBodySchema>;

export const exclusionBodySchema = z.union([
  z.object({ excluded: z.literal(true), reason: reasonSchema }),
  z.object({ excluded: z.literal(false), reason: reasonSchema.optional() }),
], { message: 'Send {excluded: true, reason} or {excluded: false}' });
export type ExclusionBody = z.infer<typeof exclusionBodySchema>;

export const placementResultSchema = z.object({
  readingId: z.number().int(),
  point: z.string(),
  planId: z.number().int().nullable(),
  xM: z.number().nullable(),
  yM: z.number().nullable(),
  plannedPointId: z.number().int().nullable(),
  excludedReason: z.string().nullable(),
});
export type PlacementResult = z.infer<typeof placementResultSchema>;

import { z } from 'zod';
import { singleLineText } from './text';

export const ZONE_KINDS = ['room', 'task_area', 'outdoor'] as const;
export type ZoneKindValue = (typeof ZONE_KINDS)[number];

export const ZONE_KIND_LABELS: Record<ZoneKindValue, string> = {
  room: 'Room',
  task_area: 'Task area in a room',
  outdoor: 'Outdoor area',
};

/**
 * Use types until the target library lands (the compliance work replaces this list with it).
 * `safety` marks zones where the map shows the caution about local codes and professionals.
 */
export const ZONE_USE_TYPES = [
  { value: 'office_writing', label: 'Office: writing, reading, data processing', safety: false },
  { value: 'office_filing', label: 'Office: filing, copying', safety: false },
  { value: 'technical_drawing', label: 'Technical drawing', safety: false },
  { value: 'conference', label: 'Conference and meeting room', safety: false },
  { value: 'library_reading', label: 'Library: reading area', safety: false },
  { value: 'classroom', label: 'Classroom (daytime)', safety: false },
  { value: 'classroom_evening', label: 'Classroom for evening classes', safety: false },
  { value: 'corridor', label: 'Corridor or circulation area', safety: false },
  { value: 'stairs', label: 'Stairs', safety: true },
  { value: 'exit_route', label: 'Exit or escape route', safety: true },
  { value: 'toilets', label: 'Toilets and washrooms', safety: false },
  { value: 'storage', label: 'Storage room', safety: false },
  { value: 'warehouse_traffic', label: 'Warehouse with person traffic', safety: false },
  { value: 'car_park', label: 'Car park', safety: false },
  { value: 'walkway', label: 'Walkway or entrance', safety: false },
  { value: 'osha_general_construction', label: 'Construction site: general area (US)', safety: false },
  { value: 'osha_construction_access', label: 'Construction site: access ways, excavation (US)', safety: true },
  { value: 'osha_indoor_corridors', label: 'Construction indoors: corridors, exitways (US)', safety: true },
  { value: 'osha_shops', label: 'Construction: shops, equipment rooms (US)', safety: false },
  { value: 'osha_offices', label: 'Construction: offices, first aid (US)', safety: false },
  { value: 'other', label: 'Other', safety: false },
] as const;
export type ZoneUseType = (typeof ZONE_USE_TYPES)[number]['value'];
const USE_TYPE_VALUES = ZONE_USE_TYPES.map((u) => u.value) as [ZoneUseType, ...ZoneUseType[]];

export function labelOfUseType(value: string): string {
  return ZONE_USE_TYPES.find((u) => u.value === value)?.label ?? value;
}

/** Stairs and exit routes: where the map reminds users that the survey does not certify safety. */
export function isSafetyRelevant(useType: string): boolean {
  return ZONE_USE_TYPES.some((u) => u.value === useType && u.safety);
}

/** Corners in plan metres; the geometric checks (>= 3 corners, no crossing, inside the plan) answer 422. */
export const polygonSchema = z.array(z.tuple([z.number(), z.number()]), { message: 'The polygon must be a list of [x, y] corners in metres' })
  .max(500, 'A zone may have at most 500 corners');

export const zoneBodySchema = z.object({
  name: singleLineText(z.string().trim().min(1, 'Give the zone a name').max(120, 'Use at most 120 characters')),
  kind: z.enum(ZONE_KINDS, { message: 'Kind must be room, task_area or outdoor' }),
  useType: z.enum(USE_TYPE_VALUES, { message: 'Choose a use type from the list' }),
  planeHeightM: z.number().min(0, 'The working plane cannot be below the floor').max(10, 'The working plane is at most 10 m high').default(0.75),
  wallBandM: z.number().min(0, 'The wall band cannot be negative').max(5, 'The wall band is at most 5 m').default(0.5),
  polygon: polygonSchema,
});
export type ZoneBody = z.infer<typeof zoneBodySchema>;
export type ZoneBodyInput = z.input<typeof zoneBodySchema>;

export const updateZoneBodySchema = z.object({
  name: zoneBodySchema.shape.name.optional(),
  kind: zoneBodySchema.shape.kind.optional(),
  useType: zoneBodySchema.shape.useType.optional(),
  planeHeightM: z.number().min(0).max(10).optional(),
  wallBandM: z.number().min(0).max(5).optional(),
  polygon: polygonSchema.optional(),
}).refine((b) => Object.keys(b).length > 0, { message: 'Send at least one field to change' });
export type UpdateZoneBody = z.infer<typeof updateZoneBodySchema>;

export const zoneSchema = z.object({
  id: z.number().int(),
  planId: z.number().int(),
  name: z.string(),
  kind: z.enum(ZONE_KINDS),
  useType: z.string(),
  targetId: z.number().int().nullable(),
  planeHeightM: z.number(),
  wallBandM: z.number(),
  polygon: z.array(z.tuple([z.number(), z.number()])),
  areaM2: z.number(),
  createdAt: z.string(),
});
export type Zone = z.infer<typeof zoneSchema>;

export const zoneListResponseSchema = z.object({ items: z.array(zoneSchema) });
export type ZoneListResponse = z.infer<typeof zoneListResponseSchema>;

/**
 * The invented demo scenario's geometry: the Fernmoor Community Library, a two-storey
 * building run by the (fictional) Fernmoor Civic Trust, and its car park. Every demo
 * feature draws on this one description so that plans, zones, logs and verdicts agree.
 * Coordinates are plan metres from the plan's lower-left corner, y upwards.
 */
export type DemoZone = {
  key: string;
  name: string;
  kind: 'room' | 'task_area' | 'outdoor';
  useType: string;
  polygon: [number, number][];
  /** The illuminance the demo's simulated luminaires give at the room centre, lux. */
  demoLevelLux: number;
  /** Relative fall-off towards the walls, for a believable dark edge (0 = flat). */
  demoFalloff: number;
};

export type DemoPlan = { key: string; name: string; widthM: number; heightM: number; zones: DemoZone[] };

const rect = (x0: number, y0: number, x1: number, y1: number): [number, number][] => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];

export const DEMO_SITE = { name: 'Fernmoor Community Library', address: '14 Lantern Row, Fernmoor', timeZone: 'Europe/London' };

export const DEMO_PLANS: DemoPlan[] = [
  {
    key: 'ground',
    name: 'Ground floor',
    widthM: 36,
    heightM: 20,
    zones: [
      { key: 'reading', name: 'Reading room', kind: 'room', useType: 'library_reading', polygon: rect(0, 0, 20, 12), demoLevelLux: 560, demoFalloff: 0.35 },
      { key: 'study', name: 'Study tables', kind: 'task_area', useType: 'office_writing', polygon: rect(4, 3, 12, 8), demoLevelLux: 610, demoFalloff: 0.1 },
      { key: 'office-a', name: 'Office A', kind: 'room', useType: 'office_writing', polygon: rect(20, 0, 28, 6), demoLevelLux: 540, demoFalloff: 0.2 },
      { key: 'office-b', name: 'Office B', kind: 'room', useType: 'office_writing', polygon: rect(28, 0, 36, 6), demoLevelLux: 430, demoFalloff: 0.25 },
      { key: 'corridor', name: 'Corridor', kind: 'room', useType: 'corridor', polygon: rect(20, 6, 36, 9), demoLevelLux: 85, demoFalloff: 0.3 },
      { key: 'toilets', name: 'Toilets', kind: 'room', useType: 'toilets', polygon: rect(20, 9, 26, 12), demoLevelLux: 240, demoFalloff: 0.15 },
      { key: 'stairs', name: 'Stairs', kind: 'room', useType: 'stairs', polygon: rect(26, 9, 30, 12), demoLevelLux: 170, demoFalloff: 0.2 },
      { key: 'store', name: 'Book store', kind: 'room', useType: 'storage', polygon: rect(30, 9, 36, 12), demoLevelLux: 130, demoFalloff: 0.2 },
      { key: 'meeting', name: 'Meeting room', kind: 'room', useType: 'conference', polygon: rect(0, 12, 12, 20), demoLevelLux: 520, demoFalloff: 0.15 },
      { key: 'carrels', name: 'Study carrels', kind: 'room', useType: 'library_reading', polygon: rect(12, 12, 24, 20), demoLevelLux: 505, demoFalloff: 0.3 },
    ],
  },
  {
    key: 'first',
    name: 'First floor',
    widthM: 36,
    heightM: 20,
    zones: [
      { key: 'archive', name: 'Local history archive', kind: 'room', useType: 'library_reading', polygon: rect(0, 0, 18, 12), demoLevelLux: 480, demoFalloff: 0.2 },
      { key: 'staff', name: 'Staff room', kind: 'room', useType: 'office_writing', polygon: rect(18, 0, 30, 8), demoLevelLux: 520, demoFalloff: 0.15 },
      { key: 'landing', name: 'Landing', kind: 'room', useType: 'corridor', polygon: rect(18, 8, 36, 12), demoLevelLux: 140, demoFalloff: 0.2 },
    ],
  },
  {
    key: 'outdoor',
    name: 'Car park and entrance',
    widthM: 60,
    heightM: 40,
    zones: [
      { key: 'car-park', name: 'Car park', kind: 'outdoor', useType: 'car_park', polygon: rect(2, 2, 42, 30), demoLevelLux: 14, demoFalloff: 0.5 },
      { key: 'entrance', name: 'Entrance walkway', kind: 'outdoor', useType: 'walkway', polygon: [[44, 2], [58, 2], [58, 38], [50, 38], [50, 10], [44, 10]], demoLevelLux: 32, demoFalloff: 0.3 },
    ],
  },
];

/** Where the outdoor daylight reference probe stood (roof of the library), on the site plan. */
export const DEMO_REFERENCE_POINT: [number, number] = [30, 36];

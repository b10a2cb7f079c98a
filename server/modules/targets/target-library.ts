import { footcandlesToLux } from '@shared/core/units';
import type { TargetConfidence } from '@shared/schemas/targets';

export type ShippedTarget = {
  useType: string;
  name: string;
  /** Em in the source's unit. */
  em: number;
  sourceUnit: 'lx' | 'fc';
  u0Min: number | null;
  dfTargetPercent: number | null;
  source: string;
  confidence: TargetConfidence;
  /** EN 12464-1:2021 fields (lux), where a source gave them. */
  en2021?: { emModifiedLux: number; ezLux: number | null; emWallLux: number | null; emCeilingLux: number | null; ra: number | null; rugl: number | null };
};

/**
 * The shipped target library (../shared/DOMAIN.md section 5). EN 12464-1 values reached us through
 * secondary sources or memory and keep that mark; the OSHA foot-candle set was checked against the
 * published text of 29 CFR 1926.56 Table D-3 (osha.gov e-CFR page). Local codes take precedence.
 */
export const SHIPPED_TARGETS: ShippedTarget[] = [
  // 2021 shape (secondary sources, issue #15 and DOMAIN.md section 10): 500 lx required, 1000 lx modified, U0 0.60, Ra 80, RUGL 19, Ez 150, walls 150, ceiling 100 lx.
  {
    useType: 'office_writing', name: 'Offices: writing, typing, reading, data processing', em: 500, sourceUnit: 'lx', u0Min: 0.6, dfTargetPercent: null,
    source: 'EN 12464-1:2021, offices table (ISO/CIE 8995-1)', confidence: 'secondary',
    en2021: { emModifiedLux: 1000, ezLux: 150, emWallLux: 150, emCeilingLux: 100, ra: 80, rugl: 19 },
  },
  {
    useType: 'office_filing', name: 'Offices: filing, copying', em: 300, sourceUnit: 'lx', u0Min: 0.4, dfTargetPercent: null,
    source: 'EN 12464-1:2021, offices table', confidence: 'secondary',
    en2021: { emModifiedLux: 500, ezLux: null, emWallLux: null, emCeilingLux: null, ra: null, rugl: null },
  },
  { useType: 'technical_drawing', name: 'Offices: technical drawing', em: 750, sourceUnit: 'lx', u0Min: 0.7, dfTargetPercent: null, source: 'EN 12464-1:2011/2021, offices table', confidence: 'secondary' },
  { useType: 'conference', name: 'Conference and meeting rooms', em: 500, sourceUnit: 'lx', u0Min: 0.6, dfTargetPercent: null, source: 'EN 12464-1:2011/2021, offices table', confidence: 'memory' },
  { useType: 'corridor', name: 'Corridors and circulation areas', em: 100, sourceUnit: 'lx', u0Min: 0.4, dfTargetPercent: null, source: 'EN 12464-1:2011/2021, traffic zones inside buildings', confidence: 'secondary' },
  { useType: 'toilets', name: 'Toilets, washrooms, cloakrooms', em: 200, sourceUnit: 'lx', u0Min: 0.4, dfTargetPercent: null, source: 'EN 12464-1:2011/2021, rest, sanitation and first aid rooms', confidence: 'secondary' },
  { useType: 'storage', name: 'Store rooms', em: 100, sourceUnit: 'lx', u0Min: 0.4, dfTargetPercent: null, source: 'EN 12464-1:2011/2021, storage rooms', confidence: 'secondary' },
  { useType: 'warehouse_traffic', name: 'Warehouses with person traffic', em: 150, sourceUnit: 'lx', u0Min: null, dfTargetPercent: null, source: 'EN 12464-1:2011/2021, warehouses', confidence: 'secondary' },
  { useType: 'classroom', name: 'Classrooms (daytime)', em: 300, sourceUnit: 'lx', u0Min: 0.6, dfTargetPercent: 2, source: 'EN 12464-1:2011/2021, educational buildings; DF 2 % band after BS 8206-2 (withdrawn, replaced by EN 17037)', confidence: 'memory' },
  { useType: 'classroom_evening', name: 'Classrooms for evening classes and adult education', em: 500, sourceUnit: 'lx', u0Min: 0.6, dfTargetPercent: null, source: 'EN 12464-1:2011/2021, educational buildings', confidence: 'memory' },
  { useType: 'library_reading', name: 'Libraries: reading areas', em: 500, sourceUnit: 'lx', u0Min: 0.6, dfTargetPercent: 2, source: 'EN 12464-1:2011/2021, libraries; DF 2 % band after BS 8206-2 (withdrawn, replaced by EN 17037)', confidence: 'memory' },
  { useType: 'stairs', name: 'Stairs and escalators', em: 150, sourceUnit: 'lx', u0Min: 0.4, dfTargetPercent: null, source: 'EN 12464-1:2011, traffic zones inside buildings (the 2021 edition may differ)', confidence: 'memory' },
  { useType: 'car_park', name: 'Outdoor parking areas, medium traffic', em: 10, sourceUnit: 'lx', u0Min: 0.25, dfTargetPercent: null, source: 'EN 12464-2:2014, parking areas', confidence: 'memory' },
  { useType: 'walkway', name: 'Pedestrian walkways outdoors', em: 5, sourceUnit: 'lx', u0Min: 0.25, dfTargetPercent: null, source: 'EN 12464-2:2014, walkways exclusively for pedestrians', confidence: 'memory' },
  // US construction minima: no uniformity requirement; values stated in foot-candles.
  { useType: 'osha_construction_access', name: 'Construction: concrete placement, excavation, access ways, active storage (US)', em: 3, sourceUnit: 'fc', u0Min: null, dfTargetPercent: null, source: 'OSHA 29 CFR 1926.56, Table D-3', confidence: 'published' },
  { useType: 'osha_general_construction', name: 'Construction: general area lighting (US)', em: 5, sourceUnit: 'fc', u0Min: null, dfTargetPercent: null, source: 'OSHA 29 CFR 1926.56, Table D-3', confidence: 'published' },
  { useType: 'osha_indoor_corridors', name: 'Construction indoors: warehouses, corridors, hallways, exitways (US)', em: 5, sourceUnit: 'fc', u0Min: null, dfTargetPercent: null, source: 'OSHA 29 CFR 1926.56, Table D-3', confidence: 'published' },
  { useType: 'osha_shops', name: 'Construction plant and shops, equipment rooms, indoor toilets (US)', em: 10, sourceUnit: 'fc', u0Min: null, dfTargetPercent: null, source: 'OSHA 29 CFR 1926.56, Table D-3', confidence: 'published' },
  { useType: 'osha_offices', name: 'Construction: first aid stations, infirmaries, offices (US)', em: 30, sourceUnit: 'fc', u0Min: null, dfTargetPercent: null, source: 'OSHA 29 CFR 1926.56, Table D-3', confidence: 'published' },
];

/** Em in lux from a value in the source's unit (units.ts: 1 fc = 1/0.3048^2 lx). */
export function emToLux(value: number, unit: 'lx' | 'fc'): number {
  return unit === 'fc' ? footcandlesToLux(value) : value;
}

import { Polygon, Tooltip } from 'react-leaflet';
import type { LatLngExpression } from 'leaflet';
import { CHECK_LABELS, VERDICT_LABELS, type ZoneCompliance } from '@shared/schemas/compliance';
import { VERDICT_FILL } from './verdict-badge';

/** The derived areas around task areas (EN 12464-1:2021 immediate surrounding and background bands). */
const BAND_KINDS = ['surrounding', 'background'] as const;
type BandKind = (typeof BAND_KINDS)[number];

/** Outline style per band (task areas themselves are dashed): the surrounding dash-dotted, the background dotted, so the two read apart without colour. */
const BAND_DASH: Record<BandKind, string> = { surrounding: '10 3 2 3', background: '1 5' };

export type TaskBand = { key: string; zoneName: string; kind: BandKind; verdict: ZoneCompliance['verdict']; areaM2: number | null; pieces: [number, number][][][] };

/** The bands of the zones on one plan, as judged (each with its own verdict). */
export function taskBandsOf(zones: readonly ZoneCompliance[], planId: number): TaskBand[] {
  return zones.filter((z) => z.planId === planId).flatMap((z) => (z.checks ?? [])
    .filter((c): c is typeof c & { kind: BandKind } => (BAND_KINDS as readonly string[]).includes(c.kind) && (c.polygons?.length ?? 0) > 0)
    .map((c) => ({ key: `${z.zoneId}-${c.kind}`, zoneName: z.name, kind: c.kind, verdict: c.verdict, areaM2: c.areaM2 ?? null, pieces: c.polygons! })));
}

/** Plan metres [x, y] to the map's [lat, lng] = [y, x] (L.CRS.Simple). */
const toLatLngs = (pieces: [number, number][][][]): LatLngExpression[][][] => pieces.map((rings) => rings.map((ring) => ring.map(([x, y]) => [y, x] as LatLngExpression)));

/** Draws the bands over the plan, outlined in their verdict's colour, lightly filled, with a focusable description. */
export function TaskBandsLayer({ bands }: { bands: readonly TaskBand[] }) {
  return (
    <>
      {bands.map((b) => (
        <Polygon key={b.key} positions={toLatLngs(b.pieces)} interactive
          pathOptions={{ color: VERDICT_FILL[b.verdict], weight: 2, dashArray: BAND_DASH[b.kind], fillColor: VERDICT_FILL[b.verdict], fillOpacity: b.kind === 'surrounding' ? 0.18 : 0.08 }}>
          <Tooltip sticky>{`${b.zoneName}: ${CHECK_LABELS[b.kind]}${b.areaM2 !== null ? `, ${b.areaM2.toFixed(1)} m²` : ''}: ${VERDICT_LABELS[b.verdict]}`}</Tooltip>
        </Polygon>
      ))}
    </>
  );
}

/** The bands in words under the map (no hover needed): which band of which task area, its area and verdict. */
export function TaskBandsLegend({ bands }: { bands: readonly TaskBand[] }) {
  if (bands.length === 0) return null;
  return (
    <div className="space-y-1 text-xs text-ink-700" data-testid="task-bands-legend">
      <p>
        Around each task area: the immediate surrounding (dash-dotted outline, at least 0.5 m) and the background (dotted, at least 3 m within the room),
        each judged as an area of its own (EN 12464-1:2021, secondary).
      </p>
      <ul className="flex flex-wrap gap-x-4 gap-y-1">
        {bands.map((b) => (
          <li key={b.key} className="inline-flex items-center gap-1.5">
            <svg width="18" height="10" aria-hidden><line x1="1" y1="5" x2="17" y2="5" stroke={VERDICT_FILL[b.verdict]} strokeWidth="2" strokeDasharray={BAND_DASH[b.kind]} /></svg>
            {b.zoneName}, {CHECK_LABELS[b.kind].toLowerCase()}{b.areaM2 !== null ? ` (${b.areaM2.toFixed(1)} m²)` : ''}: {VERDICT_LABELS[b.verdict]}
          </li>
        ))}
      </ul>
    </div>
  );
}

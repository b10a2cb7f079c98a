import { useMemo } from 'react';
import { Polygon, Polyline, Tooltip } from 'react-leaflet';
import type { Zone } from '@shared/schemas/zones';
import type { PlanPoint } from '@shared/spatial/polygon';
import { placeZoneLabel, type LabelBox } from '@shared/spatial/label-placement';
import { toLatLng } from './plan-frame';
import { labelSizeM, usePxPerMetre } from './use-px-per-metre';

/** How a zone is drawn: the survey map shades by average illuminance, compliance views by verdict. */
export type ZoneFill = { colour: string; opacity?: number; label?: string; dashed?: boolean };

type Props = {
  zones: readonly Zone[];
  fillOf?: (z: Zone) => ZoneFill | null;
  showNames?: boolean;
  onSelect?: (z: Zone) => void;
  /** Measurement points the names must not hide (plan metres). */
  points?: readonly PlanPoint[];
};

/** Zone names placed where they hide no measurement point (inside the zone if there is room, else just outside it). */
export function useZoneLabels(zones: readonly Zone[], texts: (z: Zone) => string, points: readonly PlanPoint[]) {
  const pxPerM = usePxPerMetre();
  return useMemo(() => {
    const taken: LabelBox[] = [];
    const out = new Map<number, LabelBox>();
    for (const z of zones) {
      const placed = placeZoneLabel(z.polygon, points, { ...labelSizeM(texts(z), pxPerM), taken });
      taken.push(placed.box);
      out.set(z.id, placed.box);
    }
    return { byZone: out, taken };
  }, [zones, texts, points, pxPerM]);
}

export function ZonesLayer({ zones, fillOf, showNames = true, onSelect, points = NO_POINTS }: Props) {
  const text = useMemo(() => (z: Zone) => { const f = fillOf?.(z); return `${z.name}${f?.label ? ` · ${f.label}` : ''}`; }, [fillOf]);
  const labels = useZoneLabels(zones, text, points);
  return (
    <>
      {zones.map((z) => {
        const fill = fillOf?.(z) ?? null;
        return (
          <Polygon
            key={`${z.id}:${fill?.colour ?? ''}`}
            positions={z.polygon.map(toLatLng)}
            pathOptions={{
              color: z.kind === 'task_area' ? '#4b5563' : '#1d232b', weight: z.kind === 'task_area' ? 1.5 : 2,
              dashArray: z.kind === 'task_area' || fill?.dashed ? '6 4' : undefined,
              fill: fill !== null, fillColor: fill?.colour, fillOpacity: fill?.opacity ?? 0.35,
            }}
            eventHandlers={onSelect ? { click: () => onSelect(z) } : undefined}
            // Under the readings, and not stealing their hover.
            interactive={Boolean(onSelect)}
          />
        );
      })}
      {showNames && zones.map((z) => {
        const at = labels.byZone.get(z.id);
        if (!at) return null;
        const ll = toLatLng([at.x, at.y]);
        return (
          <Polyline key={`label-${z.id}`} positions={[ll, ll]} interactive={false} pathOptions={{ opacity: 0 }}>
            <Tooltip permanent direction="center" className="zone-label !border-0 !bg-white/90 !px-1 !py-0 !text-[11px] !shadow-none">{text(z)}</Tooltip>
          </Polyline>
        );
      })}
    </>
  );
}

const NO_POINTS: readonly PlanPoint[] = [];

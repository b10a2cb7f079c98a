import { Polygon, Tooltip } from 'react-leaflet';
import type { Zone } from '@shared/schemas/zones';
import { toLatLng } from './plan-frame';

/** How a zone is drawn: the survey map shades by average illuminance, compliance views by verdict. */
export type ZoneFill = { colour: string; opacity?: number; label?: string; dashed?: boolean };

export function ZonesLayer({ zones, fillOf, showNames = true, onSelect }: { zones: readonly Zone[]; fillOf?: (z: Zone) => ZoneFill | null; showNames?: boolean; onSelect?: (z: Zone) => void }) {
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
          >
            {showNames && (
              <Tooltip direction="center" permanent className="!border-0 !bg-white/80 !px-1 !py-0 !text-[11px] !shadow-none">
                {z.name}{fill?.label ? ` · ${fill.label}` : ''}
              </Tooltip>
            )}
          </Polygon>
        );
      })}
    </>
  );
}

import { useMemo, type ReactNode } from 'react';
import L from 'leaflet';
import { ImageOverlay, MapContainer } from 'react-leaflet';
import 'leaflet/dist/leaflet.css';
import { planFrame, type PlanFrameInput } from './plan-frame';
import { ScaleBar } from './scale-bar';
import { cx } from '@/components/ui/cx';

/**
 * A plan image on a Leaflet map in plan metres (L.CRS.Simple; no tile server), with a metre
 * scale bar. Layers (readings, zones, isolux, editing tools) go in as children.
 */
export function PlanMap({ plan, children, className, label, testId }: { plan: PlanFrameInput; children?: ReactNode; className?: string; label: string; testId?: string }) {
  const frame = useMemo(() => planFrame(plan), [plan]);
  return (
    <div className={cx('relative overflow-hidden rounded-xl ring-1 ring-ink-200', className)} data-testid={testId}>
      <MapContainer
        key={`${plan.imageUrl}:${frame.unitsPerPx}`}
        crs={L.CRS.Simple}
        bounds={frame.bounds.pad(0.02)}
        maxBounds={frame.bounds.pad(0.5)}
        minZoom={-6}
        maxZoom={6}
        zoomSnap={0.25}
        attributionControl={false}
        className="h-full min-h-[18rem] w-full bg-ink-100"
        // The container is labelled for screen readers; the controls around it carry the work.
        aria-label={label}
      >
        <ImageOverlay url={plan.imageUrl} bounds={frame.bounds} />
        <ScaleBar scaled={frame.scaled} />
        {children}
      </MapContainer>
    </div>
  );
}

import { useEffect, useRef } from 'react';
import L from 'leaflet';
import { CircleMarker, Polygon, Polyline, Tooltip, useMap } from 'react-leaflet';
import '@geoman-io/leaflet-geoman-free';
import '@geoman-io/leaflet-geoman-free/dist/leaflet-geoman.css';
import type { Plan } from '@shared/schemas/plans';
import type { EmergencyElement, ElementVerdict } from '@shared/schemas/emergency';
import type { PlanPoint } from '@shared/spatial/polygon';
import { routeStrips } from '@shared/spatial/emergency-points';
import { PlanMap } from '@/components/plan-map/plan-map';
import { fromLatLng, toLatLng } from '@/components/plan-map/plan-frame';
import { EMERGENCY_VERDICT_COLOUR, EMERGENCY_VERDICT_LABELS } from './emergency-verdict';

export type DrawShape = 'Line' | 'Polygon' | 'Marker';

type Props = {
  plan: Plan;
  elements: readonly EmergencyElement[];
  /** When judging: each element's verdict and its measured points. */
  verdicts?: readonly ElementVerdict[];
  /** Drawing: the shape to draw and where the drawn points go (plan metres). */
  draw?: { shape: DrawShape; onDrawn: (points: PlanPoint[]) => void } | null;
  className?: string;
};

const ROUTE_COLOUR = '#0f766e';
const AREA_COLOUR = '#7c3aed';

/** The plan with its escape routes, areas and equipment points; planned points as small rings; measured points coloured by verdict. */
export function EmergencyMap({ plan, elements, verdicts, draw, className }: Props) {
  const verdictOf = new Map(verdicts?.map((v) => [v.element.id, v]));
  return (
    <PlanMap plan={plan} label={`Emergency lighting on ${plan.name}`} className={className ?? 'h-[55vh] min-h-[18rem]'} testId="emergency-map">
      {elements.map((e) => {
        const v = verdictOf.get(e.id);
        const colour = v ? EMERGENCY_VERDICT_COLOUR[v.verdict] : e.kind === 'escape_route' || e.kind === 'safety_equipment' ? ROUTE_COLOUR : AREA_COLOUR;
        const label = `${e.code} ${e.name}${v ? ` · ${EMERGENCY_VERDICT_LABELS[v.verdict]}` : ''}`;
        const positions = e.geometry.map(toLatLng);
        const strips = e.kind === 'escape_route' && e.widthM !== null ? routeStrips(e.geometry, e.widthM) : [];
        return (
          <span key={e.id}>
            {e.kind === 'escape_route' && (
              <Polyline positions={positions} pathOptions={{ color: colour, weight: 4, dashArray: e.stair ? '8 6' : undefined }}>
                <Tooltip sticky>{label}{e.stair ? ' (stair)' : ''}</Tooltip>
              </Polyline>
            )}
            {/* A route wider than 2 m: each strip's own centre line, thin and dotted. */}
            {strips.length > 1 && strips.map((strip) => (
              <Polyline key={`strip-${strip.index}`} positions={strip.line.map(toLatLng)} pathOptions={{ color: colour, weight: 1.5, dashArray: '2 5' }}>
                <Tooltip sticky>{`${e.code}: strip ${strip.index} of ${strips.length}, ${Number(strip.widthM.toFixed(2))} m wide`}</Tooltip>
              </Polyline>
            ))}
            {(e.kind === 'open_area' || e.kind === 'high_risk_area') && (
              <Polygon positions={positions} pathOptions={{ color: colour, weight: 2, fillOpacity: 0.08, dashArray: e.kind === 'high_risk_area' ? '4 3' : undefined }}>
                <Tooltip sticky>{label}</Tooltip>
              </Polygon>
            )}
            {e.kind === 'safety_equipment' && (
              <CircleMarker center={positions[0]} radius={7} pathOptions={{ color: colour, weight: 2, fillOpacity: 0.2 }}>
                <Tooltip>{label}</Tooltip>
              </CircleMarker>
            )}
            {!v && e.plannedPoints.map((p) => (
              <CircleMarker key={p.label} center={[p.yM, p.xM]} radius={2.5} pathOptions={{ color: colour, weight: 1, fillOpacity: 0 }}>
                <Tooltip>{p.label}</Tooltip>
              </CircleMarker>
            ))}
            {v?.points.filter((p) => p.xM !== null && p.yM !== null).map((p) => (
              <CircleMarker key={`${p.readingId}`} center={[p.yM as number, p.xM as number]} radius={p.verdict === 'falls_short' ? 6 : 4}
                pathOptions={{ color: '#1d232b', weight: 1, fillColor: EMERGENCY_VERDICT_COLOUR[p.verdict], fillOpacity: 0.9 }}>
                <Tooltip>{p.label} ({p.pass === 'initial' ? 'initial' : 'end'}): {EMERGENCY_VERDICT_LABELS[p.verdict]}</Tooltip>
              </CircleMarker>
            ))}
          </span>
        );
      })}
      {draw && <DrawTool shape={draw.shape} onDrawn={draw.onDrawn} />}
    </PlanMap>
  );
}

/** leaflet-geoman's draw mode for one shape; the drawn layer is removed and its points handed on. */
function DrawTool({ shape, onDrawn }: { shape: DrawShape; onDrawn: (points: PlanPoint[]) => void }) {
  const map = useMap();
  const drawn = useRef(onDrawn);
  useEffect(() => { drawn.current = onDrawn; }, [onDrawn]);
  useEffect(() => {
    map.pm.setGlobalOptions({ snappable: true, snapDistance: 12 });
    map.pm.enableDraw(shape, { tooltips: true, allowSelfIntersection: false, pathOptions: { color: '#b45309' } } as L.PM.DrawModeOptions);
    const onCreate = (e: { layer: L.Layer }) => {
      let pts: PlanPoint[];
      if (shape === 'Marker') pts = [fromLatLng((e.layer as L.Marker).getLatLng())];
      else if (shape === 'Line') pts = ((e.layer as L.Polyline).getLatLngs() as L.LatLng[]).map(fromLatLng);
      else pts = ((e.layer as L.Polygon).getLatLngs()[0] as L.LatLng[]).map(fromLatLng);
      e.layer.remove();
      drawn.current(pts);
    };
    map.on('pm:create', onCreate);
    return () => { map.off('pm:create', onCreate); map.pm.disableDraw(); };
  }, [map, shape]);
  return null;
}

import { useEffect, useMemo, useRef, type ReactNode } from 'react';
import L from 'leaflet';
import { CircleMarker, Polyline, useMap } from 'react-leaflet';
import '@geoman-io/leaflet-geoman-free';
import '@geoman-io/leaflet-geoman-free/dist/leaflet-geoman.css';
import type { Plan } from '@shared/schemas/plans';
import type { Zone } from '@shared/schemas/zones';
import type { PlanPoint } from '@shared/spatial/polygon';
import { PlanMap } from '@/components/plan-map/plan-map';
import { ZonesLayer } from '@/components/plan-map/zones-layer';
import { fromLatLng, planFrame } from '@/components/plan-map/plan-frame';
import type { ScalePick } from './scale-form';

export type EditorMode = { kind: 'view' } | { kind: 'scale' } | { kind: 'draw' } | { kind: 'edit'; zoneId: number };

type Props = {
  plan: Plan;
  zones: readonly Zone[];
  mode: EditorMode;
  scalePick: ScalePick;
  onScalePick: (p: ScalePick) => void;
  /** Corners drawn or edited on the map, in plan metres. */
  onOutline: (corners: PlanPoint[]) => void;
  editingCorners?: PlanPoint[] | null;
  /** Further layers composed by the page (a survey's planned points, a drop target). */
  children?: ReactNode;
};

/** The plan editor's map: zones, picking scale points, and drawing or editing outlines (leaflet-geoman). */
export function PlanEditorMap({ plan, zones, mode, scalePick, onScalePick, onOutline, editingCorners, children }: Props) {
  const frame = useMemo(() => planFrame(plan), [plan]);
  const clamp = (c: PlanPoint): PlanPoint => [Math.min(frame.width, Math.max(0, c[0])), Math.min(frame.height, Math.max(0, c[1]))];
  const toMap = ([px, py]: [number, number]): L.LatLngTuple => [(plan.heightPx - py) * frame.unitsPerPx, px * frame.unitsPerPx];
  return (
    <PlanMap plan={plan} label={`Plan ${plan.name}`} className="h-[60vh] min-h-[20rem]" testId="plan-editor-map">
      <ZonesLayer zones={mode.kind === 'edit' ? zones.filter((z) => z.id !== mode.zoneId) : zones} fillOf={() => ({ colour: '#f5b841', opacity: 0.12 })} />
      {mode.kind === 'scale' && (
        <ScalePicker onPick={(ll) => onScalePick({ active: true, points: [...(scalePick.points.length >= 2 ? [] : scalePick.points), frame.toImagePx(ll)] })} />
      )}
      {scalePick.points.map((p, i) => <CircleMarker key={i} center={toMap(p)} radius={6} pathOptions={{ color: '#b45309', weight: 2, fillColor: '#fde68a', fillOpacity: 1 }} />)}
      {scalePick.points.length === 2 && <Polyline positions={scalePick.points.map(toMap)} pathOptions={{ color: '#b45309', dashArray: '6 4' }} />}
      {mode.kind === 'draw' && <DrawOutline onDrawn={(c) => onOutline(c.map(clamp))} />}
      {mode.kind === 'edit' && editingCorners && <EditOutline corners={editingCorners} onChange={(c) => onOutline(c.map(clamp))} />}
      {children}
    </PlanMap>
  );
}

function ScalePicker({ onPick }: { onPick: (ll: L.LatLng) => void }) {
  const map = useMap();
  const pick = useRef(onPick);
  useEffect(() => { pick.current = onPick; }, [onPick]);
  useEffect(() => {
    const container = map.getContainer();
    container.style.cursor = 'crosshair';
    const onClick = (e: L.LeafletMouseEvent) => pick.current(e.latlng);
    map.on('click', onClick);
    return () => { map.off('click', onClick); container.style.cursor = ''; };
  }, [map]);
  return null;
}

function DrawOutline({ onDrawn }: { onDrawn: (corners: PlanPoint[]) => void }) {
  const map = useMap();
  const drawn = useRef(onDrawn);
  useEffect(() => { drawn.current = onDrawn; }, [onDrawn]);
  useEffect(() => {
    map.pm.setGlobalOptions({ allowSelfIntersection: false, snappable: true, snapDistance: 12 });
    map.pm.enableDraw('Polygon', { allowSelfIntersection: false, tooltips: true, pathOptions: { color: '#b45309' } });
    const onCreate = (e: { layer: L.Layer }) => {
      const ring = ((e.layer as L.Polygon).getLatLngs()[0] as L.LatLng[]).map(fromLatLng);
      e.layer.remove();
      drawn.current(ring);
    };
    map.on('pm:create', onCreate);
    return () => { map.off('pm:create', onCreate); map.pm.disableDraw(); };
  }, [map]);
  return null;
}

function EditOutline({ corners, onChange }: { corners: PlanPoint[]; onChange: (c: PlanPoint[]) => void }) {
  const map = useMap();
  const changed = useRef(onChange);
  useEffect(() => { changed.current = onChange; }, [onChange]);
  const initial = useRef(corners);
  useEffect(() => {
    const layer = L.polygon(initial.current.map(([x, y]) => [y, x] as L.LatLngTuple), { color: '#b45309', weight: 2, fillOpacity: 0.15 }).addTo(map);
    layer.pm.enable({ allowSelfIntersection: false, snappable: true });
    const read = () => changed.current(((layer.getLatLngs()[0] as L.LatLng[]).map(fromLatLng)));
    layer.on('pm:edit', read);
    return () => { layer.off('pm:edit', read); layer.pm.disable(); layer.remove(); };
  }, [map]);
  return null;
}

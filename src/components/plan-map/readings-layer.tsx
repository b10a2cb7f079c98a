import { useCallback, useEffect, useMemo, useRef } from 'react';
import L from 'leaflet';
import { useMap } from 'react-leaflet';
import type { MapReading } from '@shared/schemas/plans';
import { ShapeMarker, shapeOf } from './marker-shapes';

export type ReadingsLayerProps = {
  readings: readonly MapReading[];
  colourOf: (r: MapReading) => string;
  detailsOf: (r: MapReading) => string;
  /** The reading whose details to open (chosen from the list beside the map). */
  focusedId?: number | null;
  /** Called once the markers have been drawn, with ms since the data arrived (for the benchmark). */
  onPainted?: (ms: number) => void;
};

/**
 * Readings as markers on one shared canvas renderer (L.canvas), so 20,000 points stay smooth.
 * One tooltip follows the pointer (hover) and one popup opens on click or tap.
 */
export function ReadingsLayer({ readings, colourOf, detailsOf, focusedId, onPainted }: ReadingsLayerProps) {
  const map = useMap();
  const renderer = useMemo(() => L.canvas({ padding: 0.3, tolerance: 4 }), []);
  const markers = useRef(new Map<number, L.CircleMarker>());
  const details = useRef(detailsOf);
  // The popup left open, so a change of units (a new detailsOf) rewrites what it shows.
  const open = useRef<{ popup: L.Popup; r: MapReading } | null>(null);
  useEffect(() => {
    details.current = detailsOf;
    const o = open.current;
    if (o && map.hasLayer(o.popup)) o.popup.setContent(detailsOf(o.r));
  }, [detailsOf, map]);
  const openPopup = useCallback((latLng: L.LatLngExpression, r: MapReading) => {
    const popup = L.popup({ maxWidth: 280 }).setLatLng(latLng).setContent(details.current(r));
    open.current = { popup, r };
    popup.openOn(map);
  }, [map]);

  useEffect(() => {
    const started = performance.now();
    const group = L.featureGroup();
    const byId = new Map<number, L.CircleMarker>();
    const reading = new Map<L.Layer, MapReading>();
    for (const r of readings) {
      const m = new ShapeMarker([r.yM, r.xM], {
        renderer, shape: shapeOf(r), radius: r.role === 'reference' ? 7 : 5,
        color: r.flag === 'fault' ? '#b42318' : '#1d232b', weight: r.flag === 'fault' ? 2.5 : 1,
        fill: r.flag !== 'fault' && r.flag !== 'low_confidence', fillColor: colourOf(r), fillOpacity: 0.95,
        ...(r.flag === 'low_confidence' ? { color: colourOf(r), weight: 2.5 } : {}),
      });
      reading.set(m, r);
      byId.set(r.id, m);
      group.addLayer(m);
    }
    const tooltip = L.tooltip({ direction: 'top', offset: [0, -8], opacity: 0.97 });
    group.on('mouseover', (e) => {
      const r = reading.get(e.layer as L.Layer);
      if (r) tooltip.setLatLng([r.yM, r.xM]).setContent(details.current(r)).addTo(map);
    });
    group.on('mouseout', () => { tooltip.remove(); });
    group.on('click', (e) => {
      const r = reading.get(e.layer as L.Layer);
      if (!r) return;
      tooltip.remove();
      openPopup([r.yM, r.xM], r);
    });
    group.addTo(map);
    markers.current = byId;
    // The canvas draws on the next animation frame; the frame after it has been painted.
    let frame = requestAnimationFrame(() => { frame = requestAnimationFrame(() => onPainted?.(performance.now() - started)); });
    return () => {
      cancelAnimationFrame(frame);
      tooltip.remove();
      group.remove();
    };
    // Markers are rebuilt when the readings or their colours change.
  }, [map, renderer, readings, colourOf, onPainted, openPopup]);

  useEffect(() => {
    if (focusedId === null || focusedId === undefined) return;
    const m = markers.current.get(focusedId);
    const r = readings.find((x) => x.id === focusedId);
    if (!m || !r) return;
    map.panTo(m.getLatLng());
    openPopup(m.getLatLng(), r);
  }, [focusedId, map, readings, openPopup]);

  return null;
}

import { useEffect, useRef } from 'react';
import L from 'leaflet';
import { useMap } from 'react-leaflet';
import { plannedPlaceText, type PlannedPoint } from '@shared/schemas/planned-points';
import type { PlanPoint } from '@shared/spatial/polygon';

export type PlannedPointsLayerProps = {
  points: readonly PlannedPoint[];
  /** Points can be dragged to a new place (the survey is being worked on and the user may edit it). */
  draggable?: boolean;
  selectedId?: number | null;
  showLabels?: boolean;
  onSelect?: (p: PlannedPoint) => void;
  onMove?: (p: PlannedPoint, to: PlanPoint) => void;
};

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/**
 * Planned points as small focusable markers with their labels: filled when a reading names the
 * point (visited), a ring when not yet; round on the working plane, square on a wall, a diamond on the ceiling. Markers are DOM elements (Leaflet divIcons) so they can be
 * dragged, focused with Tab and chosen with Enter.
 */
export function PlannedPointsLayer({ points, draggable = false, selectedId = null, showLabels = true, onSelect, onMove }: PlannedPointsLayerProps) {
  const map = useMap();
  const handlers = useRef({ onSelect, onMove });
  useEffect(() => { handlers.current = { onSelect, onMove }; }, [onSelect, onMove]);

  useEffect(() => {
    const group = L.layerGroup();
    for (const p of points) {
      const visited = p.readingCount > 0;
      const surface = p.plane === 'horizontal' ? '' : ` is-${p.plane}`;
      const html = `<span class="lt-pp-dot${surface}${visited ? ' is-visited' : ''}${p.id === selectedId ? ' is-selected' : ''}"></span>${showLabels ? `<span class="lt-pp-label">${escapeHtml(p.label)}</span>` : ''}`;
      const marker = L.marker([p.yM, p.xM], {
        icon: L.divIcon({ className: 'lt-pp', html, iconSize: [12, 12], iconAnchor: [6, 6] }),
        draggable, keyboard: true, autoPan: true,
        title: `${p.label} (${plannedPlaceText(p, (v) => v.toFixed(2))}): ${visited ? `${p.readingCount} reading(s)` : 'no reading yet'}`,
        alt: p.label,
        riseOnHover: true,
      });
      marker.on('click', () => handlers.current.onSelect?.(p));
      marker.on('dragend', () => {
        const ll = marker.getLatLng();
        handlers.current.onMove?.(p, [ll.lng, ll.lat]);
      });
      group.addLayer(marker);
    }
    group.addTo(map);
    return () => { group.remove(); };
  }, [map, points, draggable, selectedId, showLabels]);
  return null;
}

/** Accepts a reading dragged from the unplaced panel (HTML drag and drop) and reports where on the plan it was dropped. */
export function ReadingDropTarget({ onDrop }: { onDrop: (readingId: number, at: PlanPoint) => void }) {
  const map = useMap();
  const drop = useRef(onDrop);
  useEffect(() => { drop.current = onDrop; }, [onDrop]);
  useEffect(() => {
    const el = map.getContainer();
    const over = (e: DragEvent) => {
      if (e.dataTransfer?.types.includes('application/x-luxtrail-reading')) {
        e.preventDefault();
        e.dataTransfer.dropEffect = 'move';
      }
    };
    const dropped = (e: DragEvent) => {
      const id = Number(e.dataTransfer?.getData('application/x-luxtrail-reading'));
      if (!id) return;
      e.preventDefault();
      const ll = map.mouseEventToLatLng(e as unknown as MouseEvent);
      drop.current(id, [ll.lng, ll.lat]);
    };
    el.addEventListener('dragover', over);
    el.addEventListener('drop', dropped);
    return () => { el.removeEventListener('dragover', over); el.removeEventListener('drop', dropped); };
  }, [map]);
  return null;
}

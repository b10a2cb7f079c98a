import { useEffect } from 'react';
import L from 'leaflet';
import { useMap } from 'react-leaflet';

/** Picks 1, 2 or 5 x 10^n metres, the longest that fits in maxPx. */
export function niceScaleLength(metresPerScreenPx: number, maxPx = 120): number {
  const maxM = metresPerScreenPx * maxPx;
  const pow = 10 ** Math.floor(Math.log10(maxM));
  const first = [5, 2, 1].find((m) => m * pow <= maxM) ?? 1;
  return first * pow;
}

function formatMetres(m: number): string {
  if (m >= 1000) return `${m / 1000} km`;
  if (m >= 1) return `${m} m`;
  return `${Math.round(m * 100)} cm`;
}

/**
 * A scale bar in plan metres. L.control.scale measures the earth's surface in a geographic CRS,
 * which means nothing in L.CRS.Simple; here one map unit is one metre.
 */
export function ScaleBar({ scaled }: { scaled: boolean }) {
  const map = useMap();
  useEffect(() => {
    const Control = L.Control.extend({
      onAdd() {
        const box = L.DomUtil.create('div', 'leaflet-control rounded bg-white/90 px-2 py-1 text-xs text-ink-900 shadow ring-1 ring-ink-200');
        box.setAttribute('aria-live', 'polite');
        box.dataset.testid = 'plan-scale-bar';
        const bar = L.DomUtil.create('div', 'h-1.5 border-x-2 border-b-2 border-ink-900', box);
        const label = L.DomUtil.create('div', 'mt-0.5 text-center font-medium', box);
        const update = () => {
          if (!scaled) {
            bar.style.display = 'none';
            label.textContent = 'Scale not set';
            return;
          }
          const y = map.getSize().y / 2;
          const a = map.containerPointToLatLng([0, y]);
          const b = map.containerPointToLatLng([100, y]);
          const perPx = Math.abs(b.lng - a.lng) / 100;
          const metres = niceScaleLength(perPx);
          bar.style.display = '';
          bar.style.width = `${Math.round(metres / perPx)}px`;
          label.textContent = formatMetres(metres);
        };
        map.on('zoomend moveend resize', update);
        update();
        (this as unknown as { _off: () => void })._off = () => map.off('zoomend moveend resize', update);
        return box;
      },
      onRemove() {
        (this as unknown as { _off?: () => void })._off?.();
      },
    });
    const control = new Control({ position: 'bottomleft' });
    control.addTo(map);
    return () => { control.remove(); };
  }, [map, scaled]);
  return null;
}

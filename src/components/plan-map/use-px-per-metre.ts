import { useState } from 'react';
import { useMap, useMapEvents } from 'react-leaflet';

/** Screen pixels per plan metre at the map's zoom (L.CRS.Simple: one map unit is 2^zoom px). */
export function usePxPerMetre(): number {
  const map = useMap();
  const [zoom, setZoom] = useState(() => map.getZoom());
  useMapEvents({ zoomend: () => setZoom(map.getZoom()) });
  return 2 ** zoom;
}

/** A map label's size in metres from its text, as the label styles draw it (about 6.3 px a character at 11 px, 16.5 px tall). */
export function labelSizeM(text: string, pxPerM: number, fontPx = 11) {
  const charPx = fontPx * 0.57;
  // Leaflet sets the map's text at line-height 1.5.
  return { width: (text.length * charPx + 8) / pxPerM, height: (fontPx * 1.5) / pxPerM, pointMargin: 5 / pxPerM };
}

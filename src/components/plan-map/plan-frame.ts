import L from 'leaflet';
import type { PlanPoint } from '@shared/spatial/polygon';

/** What the map needs of a plan to lay its image out in plan metres. */
export type PlanFrameInput = { widthPx: number; heightPx: number; metresPerPixel: number | null; imageUrl: string };

/**
 * Map units are plan metres from the lower-left corner, y up (L.CRS.Simple: lat = y, lng = x).
 * Before the scale is set, one map unit is one image pixel, so the image still shows.
 */
export function planFrame(plan: PlanFrameInput) {
  const unitsPerPx = plan.metresPerPixel ?? 1;
  const width = plan.widthPx * unitsPerPx;
  const height = plan.heightPx * unitsPerPx;
  return {
    scaled: plan.metresPerPixel !== null,
    unitsPerPx,
    width,
    height,
    bounds: L.latLngBounds([0, 0], [height, width]),
    /** Image pixels (from the top-left, y down) of a map position. */
    toImagePx(latlng: L.LatLng): [number, number] {
      return [latlng.lng / unitsPerPx, plan.heightPx - latlng.lat / unitsPerPx];
    },
  };
}

export const toLatLng = ([x, y]: PlanPoint): L.LatLngTuple => [y, x];
export const fromLatLng = (ll: L.LatLng): PlanPoint => [ll.lng, ll.lat];

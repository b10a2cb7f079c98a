import L from 'leaflet';
import type { MapReading } from '@shared/schemas/plans';

/** One shape per kind of point, so that flags never rely on colour alone. */
export type MarkerShape = 'circle' | 'ring' | 'diamond' | 'triangle-up' | 'triangle-down' | 'square' | 'cross';

export function shapeOf(r: Pick<MapReading, 'role' | 'flag'>): MarkerShape {
  if (r.role === 'reference') return 'diamond';
  switch (r.flag) {
    case 'over_range': return 'triangle-up';
    case 'under_range': return 'triangle-down';
    case 'fault': return 'cross';
    case 'calibration_lapsed': return 'square';
    case 'low_confidence': return 'ring';
    default: return 'circle';
  }
}

export const SHAPE_LEGEND: { shape: MarkerShape; label: string }[] = [
  { shape: 'circle', label: 'Task point' },
  { shape: 'diamond', label: 'Outdoor reference point' },
  { shape: 'triangle-up', label: 'Over range (at least the value shown)' },
  { shape: 'triangle-down', label: 'Under range (at most the value shown)' },
  { shape: 'square', label: 'Calibration lapsed' },
  { shape: 'ring', label: 'Low confidence (wide uncertainty)' },
  { shape: 'cross', label: 'Fault (no value)' },
];

/** Traces a shape centred on (x, y) with "radius" r into a canvas path (also used by the legend). */
export function traceShape(ctx: CanvasRenderingContext2D, shape: MarkerShape, x: number, y: number, r: number) {
  switch (shape) {
    case 'circle':
    case 'ring':
      ctx.arc(x, y, r, 0, Math.PI * 2);
      break;
    case 'diamond':
      ctx.moveTo(x, y - r * 1.35); ctx.lineTo(x + r * 1.35, y); ctx.lineTo(x, y + r * 1.35); ctx.lineTo(x - r * 1.35, y); ctx.closePath();
      break;
    case 'triangle-up':
      ctx.moveTo(x, y - r * 1.3); ctx.lineTo(x + r * 1.2, y + r * 0.9); ctx.lineTo(x - r * 1.2, y + r * 0.9); ctx.closePath();
      break;
    case 'triangle-down':
      ctx.moveTo(x, y + r * 1.3); ctx.lineTo(x + r * 1.2, y - r * 0.9); ctx.lineTo(x - r * 1.2, y - r * 0.9); ctx.closePath();
      break;
    case 'square':
      ctx.rect(x - r, y - r, 2 * r, 2 * r);
      break;
    case 'cross':
      ctx.moveTo(x - r, y - r); ctx.lineTo(x + r, y + r); ctx.moveTo(x + r, y - r); ctx.lineTo(x - r, y + r);
      break;
  }
}

type CanvasInternals = { _drawing: boolean; _ctx: CanvasRenderingContext2D; _fillStroke: (ctx: CanvasRenderingContext2D, layer: L.Layer) => void };
type MarkerInternals = { _renderer: CanvasInternals; _point: L.Point; _radius: number; _empty: () => boolean; options: L.CircleMarkerOptions & { shape: MarkerShape } };

/**
 * A circle marker drawn as another shape on Leaflet's canvas renderer (L.canvas): the renderer
 * keeps its hit testing and events; only the path differs. Needs a canvas renderer.
 */
export const ShapeMarker = L.CircleMarker.extend({
  _updatePath(this: MarkerInternals) {
    const renderer = this._renderer;
    if (!renderer._drawing || this._empty()) return;
    const ctx = renderer._ctx;
    ctx.beginPath();
    traceShape(ctx, this.options.shape, this._point.x, this._point.y, Math.max(1, this._radius));
    renderer._fillStroke(ctx, this as unknown as L.Layer);
  },
}) as unknown as new (latlng: L.LatLngExpression, options: L.CircleMarkerOptions & { shape: MarkerShape }) => L.CircleMarker;

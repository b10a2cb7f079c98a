import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import GeoJSONWriter from 'jsts/org/locationtech/jts/io/GeoJSONWriter.js';
import BufferOp from 'jsts/org/locationtech/jts/operation/buffer/BufferOp.js';
import BufferParameters from 'jsts/org/locationtech/jts/operation/buffer/BufferParameters.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import SnapIfNeededOverlayOp from 'jsts/org/locationtech/jts/operation/overlay/snap/SnapIfNeededOverlayOp.js';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import { BACKGROUND_BAND_M, SURROUNDING_BAND_M } from '../core/planes';
import { normalisePolygon, polygonAreaM2, toTurfPolygon, type PlanPoint } from './polygon';

/** A band's pieces: each an outer ring followed by any holes (the task area, or what lies inside the surrounding). */
export type Band = PlanPoint[][][];

const reader = new GeoJSONReader(new GeometryFactory());
const writer = new GeoJSONWriter();

const toGeom = (ring: readonly PlanPoint[]) => reader.read({ type: 'Polygon', coordinates: [[...ring, ring[0]].map((p) => [p[0], p[1]])] });

/**
 * Planar offset with mitred corners, so a rectangular task area gives a rectangular band (JTS buffer,
 * through jsts: plan metres are a flat frame; turf's buffer works on the sphere and does not apply).
 */
function offset(geom: unknown, distanceM: number) {
  const params = new BufferParameters();
  params.setJoinStyle(BufferParameters.JOIN_MITRE);
  params.setMitreLimit(10);
  return BufferOp.bufferOp(geom, distanceM, params);
}

function toBand(geom: unknown): Band {
  const g = writer.write(geom) as { type: string; coordinates: number[][][] | number[][][][] };
  const polys = g.type === 'Polygon' ? [g.coordinates as number[][][]] : g.type === 'MultiPolygon' ? (g.coordinates as number[][][][]) : [];
  return polys
    .map((rings) => rings.map((ring) => normalisePolygon(ring.map((c) => [c[0], c[1]] as PlanPoint))))
    .filter((rings) => rings.length > 0 && rings[0].length >= 3);
}

/**
 * The immediate surrounding area (a band of SURROUNDING_BAND_M around the task area) and the background
 * area (a band of BACKGROUND_BAND_M beyond it), EN 12464-1:2021 (secondary), each clipped to the room
 * when one is given. Widths are the minima the standard asks for.
 */
export function deriveTaskBands(task: readonly PlanPoint[], room: readonly PlanPoint[] | null, widths = { surroundingM: SURROUNDING_BAND_M, backgroundM: BACKGROUND_BAND_M }) {
  const t = toGeom(task);
  const inner = offset(t, widths.surroundingM);
  const outer = offset(t, widths.surroundingM + widths.backgroundM);
  // Overlays snap when plain noding fails (JTS SnapIfNeededOverlayOp), so float noise at shared edges cannot throw.
  const overlay = (a: unknown, b: unknown, op: number) => SnapIfNeededOverlayOp.overlayOp(a, b, op);
  let surrounding = overlay(inner, t, OverlayOp.DIFFERENCE);
  let background = overlay(outer, inner, OverlayOp.DIFFERENCE);
  if (room) {
    const r = toGeom(room);
    surrounding = overlay(surrounding, r, OverlayOp.INTERSECTION);
    background = overlay(background, r, OverlayOp.INTERSECTION);
  }
  return { surrounding: toBand(surrounding), background: toBand(background) };
}

/** Area of a band, m² (outer rings less holes; d3-polygon through polygonAreaM2). */
export function bandArea(band: Band): number {
  return band.reduce((sum, rings) => sum + polygonAreaM2(rings[0]) - rings.slice(1).reduce((h, ring) => h + polygonAreaM2(ring), 0), 0);
}

/** Inside a band (outline counted as inside, holes excluded) by @turf/boolean-point-in-polygon, a planar test. */
export function pointInBand(p: PlanPoint, band: Band): boolean {
  const pt = turfPoint(p);
  return band.some((rings) => booleanPointInPolygon(pt, { type: 'Polygon', coordinates: rings.map((ring) => [...ring, ring[0]]) }, { ignoreBoundary: false }));
}

export function pointInPolygon(p: PlanPoint, polygon: readonly PlanPoint[]): boolean {
  return booleanPointInPolygon(turfPoint(p), toTurfPolygon(polygon));
}

import { useCallback, useMemo, useState, type ReactNode } from 'react';
import { TriangleAlert } from 'lucide-react';
import type { MapReading, MapZoneSummary, Plan, SurveyMapResponse } from '@shared/schemas/plans';
import { isSafetyRelevant, type Zone } from '@shared/schemas/zones';
import { isoluxLines, type IsoluxResult } from '@shared/spatial/isolux';
import { diffByLabel } from '@shared/spatial/difference';
import { formatClock } from '@shared/datetime';
import { useUnits } from '@/lib/units';
import { cx } from '@/components/ui/cx';
import { PlanMap } from './plan-map';
import { ReadingsLayer } from './readings-layer';
import { ZonesLayer, type ZoneFill } from './zones-layer';
import { IsoluxLayer } from './isolux-layer';
import { differenceColourScale, luxColourScale } from './colour-scale';
import { DifferenceLegend, LuxLegend, ShapeLegend } from './map-legend';
import { readingDetailsHtml } from './reading-details';
import { shapeOf, type MarkerShape } from './marker-shapes';

export type SurveyMapViewProps = {
  plan: Plan;
  zones: readonly Zone[];
  map: SurveyMapResponse;
  /** An earlier survey of the same plan: colours then show the lux change per point label. */
  compareWith?: SurveyMapResponse | null;
  /** Zone shading; the default shades by the zone's average illuminance (compliance views pass verdicts). */
  zoneFill?: (zone: Zone, summary: MapZoneSummary | undefined) => ZoneFill | null;
  /** Shown under the legend (e.g. a verdict legend from the compliance view). */
  zoneLegend?: ReactNode;
  onPainted?: (ms: number) => void;
  /** More map layers drawn above the readings (planned points, a drop target). */
  extraLayers?: ReactNode;
  className?: string;
};

type Layers = { points: boolean; reference: boolean; zones: boolean; isolux: boolean };

/**
 * The survey map: readings coloured by illuminance (or by change), flagged and reference points
 * with their own shapes, zones shaded, isolux lines, layer toggles, legend and a keyboard-usable
 * point finder. Shared by the survey page and the compliance views.
 */
export function SurveyMapView({ plan, zones, map, compareWith, zoneFill, zoneLegend, onPainted, extraLayers, className }: SurveyMapViewProps) {
  const { format } = useUnits();
  const [layers, setLayers] = useState<Layers>({ points: true, reference: true, zones: true, isolux: true });
  const [focusedId, setFocusedId] = useState<number | null>(null);
  const zoneName = useMemo(() => new Map(zones.map((z) => [z.id, z.name])), [zones]);
  const summaries = useMemo(() => new Map(map.zones.map((s) => [s.zoneId, s])), [map.zones]);

  // The colour range follows measured values only: an over-range bound (e.g. a sun patch) would wash out the rest.
  const lux = useMemo(() => luxColourScale(map.readings.filter((r) => r.lux !== null && r.luxBound === 'exact' && r.role === 'task').map((r) => r.lux as number)), [map.readings]);
  const difference = useMemo(() => {
    if (!compareWith) return null;
    const d = diffByLabel(compareWith.readings, map.readings);
    const byPoint = new Map(d.points.map((p) => [p.point, p]));
    return { ...d, byPoint, scale: differenceColourScale(d.points.map((p) => p.deltaLux).filter((x): x is number => x !== null)) };
  }, [compareWith, map.readings]);

  const colourOf = useCallback((r: MapReading) => {
    if (difference) return difference.scale.colour(difference.byPoint.get(r.point)?.deltaLux ?? null);
    return lux.colour(r.lux);
  }, [difference, lux]);

  const detailsOf = useCallback((r: MapReading) => {
    const p = difference?.byPoint.get(r.point);
    const deltaText = difference
      ? p && p.deltaLux !== null ? `${p.deltaLux >= 0 ? '+' : '−'}${format(Math.abs(p.deltaLux))} (was ${format(p.beforeLux)})` : 'Not comparable (not in the earlier survey, a fault or a bound)'
      : null;
    return readingDetailsHtml(r, format, { zoneName: r.zoneId ? zoneName.get(r.zoneId) : null, deltaText, timeZone: map.siteTimeZone });
  }, [difference, format, zoneName, map.siteTimeZone]);

  const shown = useMemo(() => map.readings.filter((r) => (r.role === 'reference' ? layers.reference : layers.points)), [map.readings, layers.points, layers.reference]);
  // Labels (zone names, isolux levels) are placed where they hide none of the points shown.
  const pointPositions = useMemo(() => shown.map((r) => [r.xM, r.yM] as [number, number]), [shown]);

  const isolux = useMemo(() => {
    if (!layers.isolux) return [];
    const out: { zoneId: number; result: IsoluxResult }[] = [];
    for (const z of zones) {
      const pts = map.readings.filter((r) => r.zoneId === z.id && r.role === 'task' && r.lux !== null && r.luxBound === 'exact' && r.flag !== 'fault');
      if (pts.length >= 3) out.push({ zoneId: z.id, result: isoluxLines(pts.map((r) => ({ x: r.xM, y: r.yM, lux: r.lux as number })), z.polygon) });
    }
    return out;
  }, [layers.isolux, zones, map.readings]);

  const defaultFill = useCallback((z: Zone): ZoneFill | null => {
    const s = summaries.get(z.id);
    if (!s || s.eavg === null) return null;
    const bound = s.eavgBound === 'lower' || s.eavgBound === 'upper' ? s.eavgBound : 'exact';
    return { colour: lux.colour(s.eavg), opacity: 0.28, label: `Eavg ${format(s.eavg, { bound })}` };
  }, [summaries, lux, format]);
  const fillOf = useCallback((z: Zone) => (zoneFill ? zoneFill(z, summaries.get(z.id)) : defaultFill(z)), [zoneFill, summaries, defaultFill]);

  const shapesPresent = useMemo(() => [...new Set(map.readings.map(shapeOf))] as MarkerShape[], [map.readings]);
  const safetyZones = zones.filter((z) => isSafetyRelevant(z.useType));
  const sortedPoints = useMemo(() => [...map.readings].sort((a, b) => a.point.localeCompare(b.point, undefined, { numeric: true }) || a.timestamp.localeCompare(b.timestamp)), [map.readings]);
  // A label measured more than once (e.g. a reference probe logging all walk) is told apart by its time.
  const repeated = useMemo(() => {
    const seen = new Map<string, number>();
    for (const r of map.readings) seen.set(r.point, (seen.get(r.point) ?? 0) + 1);
    return seen;
  }, [map.readings]);

  const toggle = (k: keyof Layers) => setLayers((l) => ({ ...l, [k]: !l[k] }));
  const LAYER_LABELS: [keyof Layers, string][] = [['points', 'Task points'], ['reference', 'Reference points'], ['zones', 'Zones'], ['isolux', 'Isolux lines']];

  return (
    <div className={cx('grid gap-4 lg:grid-cols-[1fr_18rem]', className)}>
      <div className="min-w-0">
        <PlanMap plan={plan} label={`Plan ${plan.name} with the readings of ${map.surveyName}`} className="h-[60vh] min-h-[20rem]" testId="survey-map">
          {layers.zones && <ZonesLayer zones={zones} fillOf={fillOf} points={pointPositions} />}
          {layers.isolux && <IsoluxLayer results={isolux} formatLevel={format} points={pointPositions} />}
          <ReadingsLayer readings={shown} colourOf={colourOf} detailsOf={detailsOf} focusedId={focusedId} onPainted={onPainted} />
          {extraLayers}
        </PlanMap>
        {layers.isolux && (
          <p className="mt-2 text-xs text-ink-600">Isolux lines are interpolated linearly between measured points and are not extrapolated beyond the measured points (dotted outline: the area they cover). They show where the survey found the EN 12464-1 steps, not a lighting calculation.</p>
        )}
      </div>
      <aside className="space-y-4 text-sm" aria-label="Map layers and legend">
        <fieldset>
          <legend className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-500">Layers</legend>
          <div className="grid grid-cols-2 gap-1 lg:grid-cols-1">
            {LAYER_LABELS.map(([k, label]) => (
              <label key={k} className="flex items-center gap-2"><input type="checkbox" checked={layers[k]} onChange={() => toggle(k)} className="h-4 w-4 accent-amber-600" />{label}</label>
            ))}
          </div>
        </fieldset>
        {difference ? <DifferenceLegend gradient={difference.scale.gradient} maxAbs={difference.scale.maxAbs} /> : <LuxLegend gradient={lux.gradient} ticks={lux.ticks} position={lux.position} />}
        <ShapeLegend shapes={shapesPresent.length ? shapesPresent : undefined} />
        {zoneLegend ?? <p className="text-xs text-ink-600">Zones are shaded by their average illuminance over task points outside the wall band.</p>}
        <div>
          <label htmlFor="map-point-finder" className="mb-1 block text-xs font-semibold uppercase tracking-wide text-ink-500">Find a point</label>
          <select id="map-point-finder" className="block w-full rounded-lg bg-white px-2 py-1.5 text-sm ring-1 ring-ink-200" value={focusedId ?? ''} onChange={(e) => setFocusedId(e.target.value ? Number(e.target.value) : null)}>
            <option value="">Choose a point to show its details</option>
            {sortedPoints.map((r) => (
              <option key={r.id} value={r.id}>
                {r.point}{(repeated.get(r.point) ?? 0) > 1 ? ` · ${formatClock(r.timestamp, map.siteTimeZone, { seconds: true })}` : ''} · {r.lux === null ? 'no value' : format(r.lux, { bound: r.luxBound })}
              </option>
            ))}
          </select>
        </div>
        <ul className="space-y-1 text-xs text-ink-600">
          {map.sampledFrom === null
            ? <li>{map.readings.length} point(s) on this plan.</li>
            : <li>{map.sampledFrom.toLocaleString('en-GB')} points on this plan; the map draws an even sample of {map.readings.length.toLocaleString('en-GB')} of them in time order (the zone figures use every point).</li>}
          {map.withoutPosition > 0 && <li>{map.withoutPosition} reading(s) have no position yet: place them from the list of readings without a place.</li>}
          {map.withoutPlan > 0 && <li>{map.withoutPlan} reading(s) could not be placed: their log names no plan and this site has several (give logs a plan column, or choose the plan when uploading).</li>}
          {map.outsidePlan > 0 && map.notice === null && <li>{map.outsidePlan} reading(s) of this plan lie beyond its edge and are not shown.</li>}
          {difference && <li>{difference.points.length} point(s) matched by label; {difference.onlyAfter.length} new, {difference.onlyBefore.length} no longer measured.</li>}
        </ul>
        {safetyZones.length > 0 && (
          <div role="note" className="flex gap-2 rounded-lg bg-lamp-50 p-3 text-xs text-lamp-900 ring-1 ring-lamp-200">
            <TriangleAlert className="h-4 w-4 shrink-0 text-lamp-600" aria-hidden />
            <p>{safetyZones.map((z) => z.name).join(', ')}: stairs and exit routes are safety-relevant. This survey supports a check; it does not certify emergency lighting. Local codes and a qualified lighting professional take precedence.</p>
          </div>
        )}
      </aside>
    </div>
  );
}

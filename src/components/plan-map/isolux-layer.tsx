import { Fragment, useMemo } from 'react';
import { Polygon, Polyline, Tooltip } from 'react-leaflet';
import type { IsoluxResult } from '@shared/spatial/isolux';
import type { PlanPoint } from '@shared/spatial/polygon';
import { placeLineLabel, type LabelBox } from '@shared/spatial/label-placement';
import { toLatLng } from './plan-frame';
import { labelSizeM, usePxPerMetre } from './use-px-per-metre';

type Props = {
  results: readonly { zoneId: number; result: IsoluxResult }[];
  formatLevel: (lux: number) => string;
  showHull?: boolean;
  /** Measurement points the level labels must not hide (plan metres). */
  points?: readonly PlanPoint[];
};

/**
 * Isolux lines of each zone with their level labelled where the label hides no measurement point
 * and no other level's label (a level with no free place is left unlabelled on the map; the
 * colours of the lines are the same for every level, so the legend's steps name them).
 */
export function IsoluxLayer({ results, formatLevel, showHull = true, points = NO_POINTS }: Props) {
  const pxPerM = usePxPerMetre();
  const labels = useMemo(() => {
    const taken: LabelBox[] = [];
    const out = new Map<string, LabelBox>();
    for (const { zoneId, result } of results) {
      for (const level of result.levels) {
        const at = placeLineLabel(level.lines, points, { ...labelSizeM(formatLevel(level.lux), pxPerM, 10), taken });
        if (at) { taken.push(at); out.set(`${zoneId}:${level.lux}`, at); }
      }
    }
    return out;
  }, [results, points, formatLevel, pxPerM]);
  return (
    <>
      {results.map(({ zoneId, result }) => (
        <Fragment key={zoneId}>
          {showHull && result.hull && (
            <Polygon positions={result.hull.map(toLatLng)} interactive={false} pathOptions={{ color: '#6b7280', weight: 1, dashArray: '2 4', fill: false }} />
          )}
          {result.levels.map((level) => {
            const at = labels.get(`${zoneId}:${level.lux}`);
            return (
              <Fragment key={level.lux}>
                {level.lines.map((line, i) => (
                  <Polyline key={i} positions={line.map(toLatLng)} interactive={false} pathOptions={{ color: '#b45309', weight: 1.6, opacity: 0.9 }} />
                ))}
                {at && (
                  <Polyline positions={[toLatLng([at.x, at.y]), toLatLng([at.x, at.y])]} interactive={false} pathOptions={{ opacity: 0 }}>
                    <Tooltip permanent direction="center" className="isolux-label !rounded !border-0 !bg-amber-50/90 !px-1 !py-0 !text-[10px] !font-semibold !text-amber-900 !shadow-none">
                      {formatLevel(level.lux)}
                    </Tooltip>
                  </Polyline>
                )}
              </Fragment>
            );
          })}
        </Fragment>
      ))}
    </>
  );
}

const NO_POINTS: readonly PlanPoint[] = [];

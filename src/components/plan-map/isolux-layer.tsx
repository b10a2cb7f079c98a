import { Fragment } from 'react';
import { Polygon, Polyline, Tooltip } from 'react-leaflet';
import type { IsoluxResult } from '@shared/spatial/isolux';
import { toLatLng } from './plan-frame';

/** Isolux lines of each zone with their level labelled, and the measured hull faintly outlined. */
export function IsoluxLayer({ results, formatLevel, showHull = true }: { results: readonly { zoneId: number; result: IsoluxResult }[]; formatLevel: (lux: number) => string; showHull?: boolean }) {
  return (
    <>
      {results.map(({ zoneId, result }) => (
        <Fragment key={zoneId}>
          {showHull && result.hull && (
            <Polygon positions={result.hull.map(toLatLng)} interactive={false} pathOptions={{ color: '#6b7280', weight: 1, dashArray: '2 4', fill: false }} />
          )}
          {result.levels.map((level) => (
            <Fragment key={level.lux}>
              {level.lines.map((line, i) => (
                <Polyline key={i} positions={line.map(toLatLng)} interactive={false} pathOptions={{ color: '#b45309', weight: 1.6, opacity: 0.9 }} />
              ))}
              <Polyline positions={[toLatLng(level.labelAt), toLatLng(level.labelAt)]} interactive={false} pathOptions={{ opacity: 0 }}>
                <Tooltip permanent direction="center" className="!rounded !border-0 !bg-amber-50/90 !px-1 !py-0 !text-[10px] !font-semibold !text-amber-900 !shadow-none">
                  {formatLevel(level.lux)}
                </Tooltip>
              </Polyline>
            </Fragment>
          ))}
        </Fragment>
      ))}
    </>
  );
}

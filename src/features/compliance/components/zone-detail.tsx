import { CHECK_LABELS, type ZoneDetailResponse } from '@shared/schemas/compliance';
import { CONFIDENCE_LABELS } from '@shared/schemas/targets';
import { Badge } from '@/components/ui/badge';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { formatNumber, useUnits } from '@/lib/units';
import { VerdictBadge } from './verdict-badge';
import { labelOfUseType } from '@shared/schemas/zones';

const asBound = (b: string | null) => (b === 'lower' || b === 'upper' ? b : 'exact') as 'exact' | 'lower' | 'upper';

/** A zone's statistics, its target and where that target comes from, and why the verdict is what it is. */
export function ZoneSummaryCards({ detail }: { detail: ZoneDetailResponse }) {
  const { format } = useUnits();
  const z = detail.zone;
  const stats: [string, string][] = [
    ['Eavg', z.eavg === null ? '–' : `${format(z.eavg, { bound: asBound(z.bounds.eavg) })}${z.uEavg !== null ? ` ± ${format(z.uEavg, { withUnit: false })}` : ''}`],
    ['Emin', format(z.emin, { bound: asBound(z.bounds.emin) })],
    ['Emax', format(z.emax)],
    ['U0 = Emin / Eavg', z.u0 === null ? '–' : z.u0.toFixed(2)],
    ['Points used', `${z.points} of ${z.requiredPoints} required`],
    ['Wall band', `${z.wallBandPoints} point(s) left out`],
    ['Working plane', `${z.planeHeightM.toFixed(2)} m`],
    ...(z.dfAvg !== undefined ? [['Daylight factor', `${formatNumber(z.dfAvg)} %${z.dfTargetPercent ? ` (target ${z.dfTargetPercent} %)` : ''}`] as [string, string]] : []),
  ];
  return (
    <div className="grid gap-4 lg:grid-cols-3">
      <Card className="lg:col-span-2">
        <CardHeader title="Statistics" description={`Expanded uncertainty U with k = 2. Grid rule: ${detail.gridRule}.`} actions={<VerdictBadge verdict={z.verdict} />} />
        <CardBody>
          <dl className="grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-3">
            {stats.map(([k, v]) => (
              <div key={k}><dt className="text-xs font-medium text-ink-500">{k}</dt><dd className="num text-base font-semibold text-ink-900">{v}</dd></div>
            ))}
          </dl>
          {z.dfWarning && <p role="status" className="mt-3 rounded-lg bg-lamp-50 p-2 text-sm text-lamp-900 ring-1 ring-lamp-200">{z.dfWarning}</p>}
          <h3 className="mt-4 text-sm font-semibold text-ink-900">Why this verdict</h3>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm text-ink-700">
            {z.reasons.map((r, i) => <li key={i}>{r}</li>)}
          </ul>
        </CardBody>
      </Card>
      <Card>
        <CardHeader title="Target" />
        <CardBody className="space-y-2 text-sm">
          {z.targetName ? (
            <>
              <p className="font-medium text-ink-900">{z.targetName}</p>
              <p className="num">Ēm {format(z.targetLux)}{z.targetU0 !== null ? `, U0 ≥ ${z.targetU0.toFixed(2)}` : ''}</p>
              {z.requiredLux != null && <p className="num text-ink-700">Required {format(z.requiredLux)}{z.modifiedLux != null ? `, modified ${format(z.modifiedLux)}` : ''}</p>}
              {z.design && <p className="text-ink-700">{z.design.explanation}</p>}
              {z.limitLux != null && z.limitLux !== z.targetLux && <p className="num font-medium text-ink-900">Compared with {format(z.limitLux)} (new installation: Ēm / MF)</p>}
              <p className="text-ink-600">{z.targetSource}</p>
              {z.targetConfidence && <Badge tone={z.targetConfidence === 'published' ? 'info' : 'warn'}>{CONFIDENCE_LABELS[z.targetConfidence]}</Badge>}
              {z.info && (z.info.ra !== null || z.info.rugl !== null) && (
                <p className="text-ink-600">Ra {z.info.ra ?? '–'}, RUGL {z.info.rugl ?? '–'}. <span className="text-xs">{z.info.note}</span></p>
              )}
              {z.modelling && (
                <p className="text-ink-700">Modelling Ēz / Ēh = {z.modelling.ratio.toFixed(2)} ({z.modelling.withinRecommendation ? 'within' : 'outside'} 0.30 to 0.60; {z.modelling.source}, informative).</p>
              )}
            </>
          ) : <p className="text-ink-600">No library entry for “{labelOfUseType(z.useType)}”.</p>}
        </CardBody>
      </Card>
    </div>
  );
}

/** Walls, ceiling, cylindrical illuminance and the areas around a task: each judged on its own. */
export function ZoneChecksCard({ detail }: { detail: ZoneDetailResponse }) {
  const { format } = useUnits();
  const checks = detail.zone.checks ?? [];
  if (checks.length === 0) return null;
  return (
    <Card>
      <CardHeader title="Further checks" description="Each judged on its own against its maintained value (or Ēm / MF for a new installation), under the same decision rule." />
      <CardBody>
        <ul className="divide-y divide-ink-100">
          {checks.map((k) => (
            <li key={k.kind} className="py-3">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <h3 className="text-sm font-semibold text-ink-900">{CHECK_LABELS[k.kind]}</h3>
                <VerdictBadge verdict={k.verdict} />
              </div>
              <p className="num mt-1 text-sm text-ink-700">
                {k.targetLux === null ? 'No value in the entry' : `Ēm ${format(k.targetLux)}${k.limitLux !== null && k.limitLux !== k.targetLux ? ` (compared with ${format(k.limitLux)})` : ''}`}
                {k.u0Min !== null ? `, U0 ≥ ${k.u0Min.toFixed(2)}` : ''}
                {' · '}Eavg {k.eavg === null ? '–' : `${format(k.eavg, { bound: asBound(k.bounds.eavg) })}${k.uEavg !== null ? ` ± ${format(k.uEavg, { withUnit: false })}` : ''}`}
                {k.u0 !== null ? `, U0 ${k.u0.toFixed(2)}` : ''} · {k.points} point(s){k.areaM2 !== undefined ? ` · ${k.areaM2.toFixed(1)} m²` : ''}
              </p>
              <ul className="mt-1 list-disc pl-5 text-sm text-ink-600">{k.reasons.map((r, i) => <li key={i}>{r}</li>)}</ul>
              <p className="mt-1 text-xs text-ink-500">{k.source} · {CONFIDENCE_LABELS[k.confidence]}</p>
            </li>
          ))}
        </ul>
      </CardBody>
    </Card>
  );
}

/** Every point of the zone, wall-band points marked as left out. */
export function ZonePointsTable({ detail }: { detail: ZoneDetailResponse }) {
  const { format } = useUnits();
  const withDf = detail.points.some((p) => p.dfPercent !== undefined);
  const withPlane = detail.points.some((p) => p.plane !== undefined && p.plane !== 'horizontal');
  return (
    <div className="max-h-[28rem] overflow-auto">
      <table className="min-w-full text-sm">
        <caption className="sr-only">Points of the zone</caption>
        <thead className="sticky top-0 bg-ink-50 text-left text-xs font-semibold uppercase tracking-wide text-ink-600">
          <tr>
            <th scope="col" className="px-4 py-2">Point</th>
            <th scope="col" className="px-3 py-2 text-right">x, y (m)</th>
            {withPlane && <th scope="col" className="px-3 py-2">Plane</th>}
            <th scope="col" className="px-3 py-2 text-right">E ± U</th>
            {withDf && <th scope="col" className="px-3 py-2 text-right"><abbr title="Daylight factor: indoor over simultaneous outdoor illuminance">DF</abbr></th>}
            <th scope="col" className="px-3 py-2">Flag</th>
            <th scope="col" className="px-3 py-2">Used</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {detail.points.map((p) => (
            <tr key={p.readingId}>
              <th scope="row" className="px-4 py-1.5 text-left font-medium text-ink-900">{p.point}</th>
              <td className="num px-3 py-1.5 text-right">{p.xM.toFixed(2)}, {p.yM.toFixed(2)}</td>
              {withPlane && <td className="px-3 py-1.5">{p.plane ?? 'horizontal'}{p.azimuthDeg != null ? ` ${p.azimuthDeg}°` : ''}</td>}
              <td className="num px-3 py-1.5 text-right">{p.lux === null ? 'fault' : `${format(p.lux, { bound: p.luxBound })}${p.uLux !== null ? ` ± ${format(p.uLux, { withUnit: false })}` : ''}`}</td>
              {withDf && <td className="num px-3 py-1.5 text-right">{p.dfPercent === undefined ? '–' : `${p.dfPercent.toFixed(1)} %`}</td>}
              <td className="px-3 py-1.5">{p.flag === 'ok' ? '–' : <Badge tone={p.flag === 'fault' ? 'bad' : 'warn'}>{p.flag.replace('_', ' ')}</Badge>}</td>
              <td className="px-3 py-1.5">{p.plane !== undefined && p.plane !== 'horizontal' ? 'in its check' : p.inWallBand ? <Badge>wall band</Badge> : p.lux === null ? <Badge tone="bad">excluded</Badge> : 'yes'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

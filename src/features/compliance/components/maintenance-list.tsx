import { Link } from 'react-router';
import { max, min } from 'simple-statistics';
import { MAINTENANCE_LABELS, type MaintenanceZone } from '@shared/schemas/compliance';
import { paths } from '@shared/paths';
import { Badge } from '@/components/ui/badge';
import { useUnits } from '@/lib/units';

const TONE = { due: 'bad', due_soon: 'warn', ok: 'good', unknown: 'neutral' } as const;

/** The signed-off Eavg values over time against Em: a small chart, with the same values in words for screen readers. */
function Trend({ zone }: { zone: MaintenanceZone }) {
  const { format } = useUnits();
  const w = 160;
  const h = 44;
  const values = zone.trend.map((p) => p.eavg);
  const lo = min([zone.targetLux, ...values]) * 0.9;
  const hi = max([zone.targetLux, ...values]) * 1.05;
  const x = (i: number) => (zone.trend.length === 1 ? w / 2 : 6 + (i * (w - 12)) / (zone.trend.length - 1));
  const y = (v: number) => h - 4 - ((v - lo) / (hi - lo || 1)) * (h - 8);
  const words = zone.trend.map((p) => `${p.date}: ${format(p.eavg)}`).join('; ');
  return (
    <figure className="flex flex-col gap-1">
      <svg width={w} height={h} role="img" aria-label={`Signed-off Eavg against Em ${format(zone.targetLux)}: ${words}`} className="overflow-visible">
        <line x1={0} x2={w} y1={y(zone.targetLux)} y2={y(zone.targetLux)} className="stroke-short-500" strokeDasharray="4 3" />
        <polyline fill="none" className="stroke-ink-700" strokeWidth={1.5} points={zone.trend.map((p, i) => `${x(i)},${y(p.eavg)}`).join(' ')} />
        {zone.trend.map((p, i) => <circle key={p.surveyId} cx={x(i)} cy={y(p.eavg)} r={3} className="fill-ink-800" />)}
      </svg>
      <figcaption className="num text-xs text-ink-500">{words}</figcaption>
    </figure>
  );
}

/** Zones due for maintenance first, each with the trend of its signed-off values. */
export function MaintenanceList({ items }: { items: MaintenanceZone[] }) {
  const { format } = useUnits();
  return (
    <ul className="divide-y divide-ink-100 rounded-xl bg-white shadow-card ring-1 ring-ink-100" aria-label="Zones and their maintenance state">
      {items.map((z) => {
        const latest = z.trend[z.trend.length - 1];
        return (
          <li key={`${z.siteId}-${z.zoneId}`} className="grid gap-3 p-4 md:grid-cols-[1fr_auto] md:items-center">
            <div className="min-w-0 space-y-1">
              <div className="flex flex-wrap items-center gap-2">
                <h2 className="font-semibold text-ink-900">{z.zoneName}</h2>
                <Badge tone={TONE[z.state]}>{MAINTENANCE_LABELS[z.state]}</Badge>
              </div>
              <p className="text-sm text-ink-500">{z.siteName} · {z.planName}</p>
              <p className="num text-sm text-ink-700">
                Latest Eavg {format(latest.eavg)} against Em {format(z.targetLux)}
                {z.slopeLuxPerYear !== null ? ` · ${z.slopeLuxPerYear < 0 ? 'falling' : 'rising'} ${format(Math.abs(z.slopeLuxPerYear))} a year` : ''}
                {z.reachesTargetOn ? ` · reaches Em about ${z.reachesTargetOn}` : ''}
              </p>
              <p className="text-sm text-ink-600">{z.reason}</p>
              <p className="text-sm"><Link className="text-lamp-700 hover:underline" to={paths.zoneCompliance.to(latest.surveyId, z.zoneId)}>Latest signed-off survey: {latest.surveyName}</Link></p>
            </div>
            <Trend zone={z} />
          </li>
        );
      })}
    </ul>
  );
}

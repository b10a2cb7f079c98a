import { Link } from 'react-router';
import { ArrowDownRight, ArrowUpRight, TriangleAlert } from 'lucide-react';
import type { ZoneCompliance } from '@shared/schemas/compliance';
import { VERDICT_LABELS } from '@shared/schemas/compliance';
import { useUnits } from '@/lib/units';
import { formatNumber } from '@/lib/units';
import { VerdictBadge } from './verdict-badge';
import { paths } from '@shared/paths';
import { labelOfUseType } from '@shared/schemas/zones';

/** The survey's zones, worst first as the server orders them, with the change since the last signed-off survey. */
export function ZoneTable({ surveyId, zones, showChange }: { surveyId: number; zones: ZoneCompliance[]; showChange: boolean }) {
  const { format } = useUnits();
  return (
    <div className="scroll-x">
      <table className="stack-table min-w-full text-sm" data-testid="zone-table">
        <caption className="sr-only">Zones with their target, statistics and verdict, worst first</caption>
        <thead className="bg-ink-50 text-left text-xs font-semibold uppercase tracking-wide text-ink-600">
          <tr>
            <th scope="col" className="px-4 py-2">Zone</th>
            <th scope="col" className="px-3 py-2">Verdict</th>
            <th scope="col" className="px-3 py-2 text-right">Target Em / U0</th>
            <th scope="col" className="px-3 py-2 text-right">Eavg ± U</th>
            <th scope="col" className="px-3 py-2 text-right">Emin</th>
            <th scope="col" className="px-3 py-2 text-right">U0</th>
            <th scope="col" className="px-3 py-2 text-right">Points</th>
            <th scope="col" className="px-3 py-2 text-right">DF</th>
            {showChange && <th scope="col" className="px-3 py-2">Since last sign-off</th>}
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {zones.map((z) => (
            <tr key={z.zoneId} className="align-top hover:bg-ink-50/60">
              <th scope="row" data-lead className="px-4 py-2 text-left font-medium">
                <Link to={paths.zoneCompliance.to(surveyId, z.zoneId)} className="text-ink-900 underline decoration-ink-200 underline-offset-2 hover:decoration-lamp-500">{z.name}</Link>
                <span className="block text-xs font-normal text-ink-500">{z.planName} · {labelOfUseType(z.useType)}</span>
              </th>
              <td data-key className="px-3 py-2"><VerdictBadge verdict={z.verdict} /></td>
              <td data-label="Target" className="num px-3 py-2 text-right">{z.targetLux === null ? '–' : format(z.targetLux)}{z.targetU0 !== null ? ` / ${z.targetU0.toFixed(2)}` : ''}</td>
              <td data-key data-testid="zone-eavg" className="num whitespace-nowrap px-3 py-2 text-right"><span className="font-normal text-ink-500 sm:hidden">Eavg </span>{z.eavg === null ? '–' : `${format(z.eavg, { bound: bound(z.bounds.eavg) })}${z.uEavg !== null ? ` ± ${format(z.uEavg, { withUnit: false })}` : ''}`}</td>
              <td data-label="Emin" className="num px-3 py-2 text-right">{format(z.emin, { bound: bound(z.bounds.emin) })}</td>
              <td data-label="U0" className="num px-3 py-2 text-right">{z.u0 === null ? '–' : `${z.bounds.u0 === 'upper' ? '≤ ' : z.bounds.u0 === 'lower' ? '≥ ' : ''}${formatNumber(z.u0)}`}</td>
              <td data-label="Points" className={`num px-3 py-2 text-right ${z.gridAdequate ? '' : 'text-unsure-700'}`} title={z.gridAdequate ? undefined : 'Fewer points than the grid rule asks for'}>{z.gridRuleApplies === false ? `${z.points} (outdoor: no indoor grid rule)` : `${z.points} / ${z.requiredPoints}`}</td>
              <td data-label="DF" data-empty={z.dfAvg === undefined || undefined} className="num px-3 py-2 text-right">
                {z.dfAvg === undefined ? '–' : `${formatNumber(z.dfAvg)} %`}
                {z.dfWarning && <TriangleAlert className="ml-1 inline h-3.5 w-3.5 text-lamp-600" aria-label={z.dfWarning} />}
              </td>
              {showChange && <td data-label="Since last sign-off" className="px-3 py-2 text-xs text-ink-700">{z.change ? <Change change={z.change} /> : '–'}</td>}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

const bound = (b: string | null) => (b === 'lower' ? 'lower' : b === 'upper' ? 'upper' : 'exact') as 'exact' | 'lower' | 'upper';

function Change({ change }: { change: NonNullable<ZoneCompliance['change']> }) {
  const { format } = useUnits();
  const d = change.deltaEavg;
  return (
    <span className="inline-flex flex-col gap-0.5">
      {d !== null && (
        <span className="num inline-flex items-center gap-1">
          {d >= 0 ? <ArrowUpRight className="h-3.5 w-3.5 text-meets-600" aria-hidden /> : <ArrowDownRight className="h-3.5 w-3.5 text-short-600" aria-hidden />}
          {d >= 0 ? '+' : '−'}{format(Math.abs(d))}
        </span>
      )}
      <span className="text-ink-500">{change.verdictChanged ? `was ${VERDICT_LABELS[change.previousVerdict].toLowerCase()}` : 'same verdict'}</span>
    </span>
  );
}

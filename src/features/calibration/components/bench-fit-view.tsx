import { max } from 'simple-statistics';
import { useState } from 'react';
import { CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import { AlertTriangle, CheckCircle2 } from 'lucide-react';
import type { BenchRunDto, GainFitDto } from '@shared/schemas/bench-runs';
import { Badge } from '@/components/ui/badge';
import { cx } from '@/components/ui/cx';
import { useUnits } from '@/lib/units';
import { percent, sig, symmetricTicks } from './format';

/** The core's fit per gain code: coefficients with standard uncertainties (k = 1), linearity and gain-ratio flags. */
export function BenchFitTable({ run }: { run: BenchRunDto }) {
  const { convert, label } = useUnits();
  return (
    <div className="scroll-x">
      <table className="min-w-full text-sm" aria-label="Fit per gain code">
        <thead className="bg-ink-50 text-left text-xs font-semibold uppercase tracking-wide text-ink-600">
          <tr>
            <th scope="col" className="px-3 py-2">Code</th><th scope="col" className="px-3 py-2">Nominal gain</th><th scope="col" className="px-3 py-2">Rows</th>
            <th scope="col" className="px-3 py-2">{label} per count ± u</th><th scope="col" className="px-3 py-2">Dark (counts) ± u</th>
            <th scope="col" className="px-3 py-2">R²</th><th scope="col" className="px-3 py-2">Linearity</th><th scope="col" className="px-3 py-2">Gain ratio</th><th scope="col" className="px-3 py-2">Suggested u<sub>rel</sub></th>
          </tr>
        </thead>
        <tbody className="num divide-y divide-ink-100">
          {run.gains.map((g) => {
            const linFlag = g.linearity > run.linearityLimit;
            return (
              <tr key={g.code}>
                <td className="px-3 py-2 font-semibold">{g.code}</td>
                <td className="px-3 py-2">{g.nominalGain ?? '–'}</td>
                <td className="px-3 py-2">{g.n}</td>
                <td className="px-3 py-2">{sig(convert(g.luxPerCount))} ± {sig(convert(g.uLuxPerCount), 2)}</td>
                <td className="px-3 py-2">{sig(g.darkCounts, 4)} ± {sig(g.uDarkCounts, 2)}</td>
                <td className="px-3 py-2">{g.rSquared.toFixed(6)}</td>
                <td className="px-3 py-2">
                  <span className={cx(linFlag && 'font-semibold text-short-700')}>{percent(g.linearity)}</span>
                  {linFlag && <Badge tone="bad" className="ml-1" icon={<AlertTriangle className="h-3 w-3" aria-hidden />}>over {percent(run.linearityLimit, 0)}</Badge>}
                </td>
                <td className="px-3 py-2">
                  {g.ratio ? (
                    <span className="inline-flex items-center gap-1">
                      {sig(g.ratio.measured, 5)} vs {sig(g.ratio.nominal, 5)} ({g.ratio.deviation >= 0 ? '+' : ''}{percent(g.ratio.deviation)})
                      {g.ratio.mismatch
                        ? <Badge tone="bad" icon={<AlertTriangle className="h-3 w-3" aria-hidden />}>mismatch</Badge>
                        : <CheckCircle2 className="h-4 w-4 text-meets-600" aria-label="within tolerance" />}
                    </span>
                  ) : '–'}
                </td>
                <td className="px-3 py-2">{percent(g.suggestedURel)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

type TipRow = { x: number; counts?: number; fitted?: number; residual?: number };

/** One tooltip for both charts: the reference illuminance, then each quantity named with its unit. */
function BenchTip({ active, payload, unitLabel }: { active?: boolean; payload?: readonly { payload?: TipRow }[]; unitLabel: string }) {
  const row = payload?.[0]?.payload;
  if (!active || !row) return null;
  return (
    <div className="rounded-md bg-white px-2 py-1 text-xs shadow ring-1 ring-ink-200">
      <div className="font-medium">Reference {sig(row.x, 6)} {unitLabel}</div>
      {row.counts !== undefined && <div>Measured: {sig(row.counts, 6)} counts</div>}
      {row.fitted !== undefined && <div>Fitted line: {sig(row.fitted, 6)} counts</div>}
      {row.residual !== undefined && <div>Residual: {sig(row.residual, 4)} counts</div>}
    </div>
  );
}

function CodeCharts({ g }: { g: GainFitDto }) {
  const { convert, label, format } = useUnits();
  const points = g.points.map((p) => ({ x: convert(p.referenceLux), counts: p.counts, fitted: p.fitted, residual: p.residual, line: p.line }));
  const line = [...points].sort((a, b) => a.x - b.x);
  const xLabel = `Reference illuminance (${label})`;
  const maxRes = points.length ? max(points.map((p) => Math.abs(p.residual))) : -Infinity;
  const resTicks = symmetricTicks(maxRes);
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <figure role="img" aria-label={`Counts against reference illuminance, gain code ${g.code}: ${g.n} points from ${format(g.points[0]?.referenceLux)} with the fitted line`} className="min-w-0">
        <figcaption className="mb-2 text-sm font-medium text-ink-800">Counts against reference illuminance (code {g.code})</figcaption>
        <div className="h-72">
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart data={line} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#e6eaf4" />
              <XAxis dataKey="x" type="number" domain={['auto', 'auto']} tickFormatter={(v: number) => sig(v, 3)} label={{ value: xLabel, position: 'insideBottom', offset: -12, fontSize: 12 }} />
              <YAxis type="number" width={84} tickFormatter={(v: number) => sig(v, 3)} label={{ value: 'Counts', angle: -90, position: 'insideLeft', offset: 0, fontSize: 12, style: { textAnchor: 'middle' } }} />
              <Tooltip content={(p) => <BenchTip active={p.active} payload={p.payload as never} unitLabel={label} />} />
              <Legend verticalAlign="top" height={24} />
              <Line name="Fitted line" dataKey="fitted" stroke="#e29a1c" strokeWidth={2} dot={false} isAnimationActive={false} />
              <Scatter name="Measured" dataKey="counts" fill="#141b2d" isAnimationActive={false} />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      </figure>
      <figure role="img" aria-label={`Residuals for gain code ${g.code}: largest ${sig(maxRes, 3)} counts`} className="min-w-0">
        <figcaption className="mb-2 text-sm font-medium text-ink-800">Residuals, counts − fitted (code {g.code})</figcaption>
        <div className="h-72">
          <ResponsiveContainer width="100%" height="100%">
            <ScatterChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#e6eaf4" />
              <XAxis dataKey="x" type="number" domain={['auto', 'auto']} tickFormatter={(v: number) => sig(v, 3)} label={{ value: xLabel, position: 'insideBottom', offset: -12, fontSize: 12 }} />
              <YAxis dataKey="residual" type="number" width={84} domain={[resTicks[0], resTicks[resTicks.length - 1]]} ticks={resTicks} interval={0} tickFormatter={(v: number) => sig(v, 3)} label={{ value: 'Residual (counts)', angle: -90, position: 'insideLeft', offset: 0, fontSize: 12, style: { textAnchor: 'middle' } }} />
              <ReferenceLine y={0} stroke="#9eabcb" />
              <Tooltip content={(p) => <BenchTip active={p.active} payload={p.payload as never} unitLabel={label} />} />
              <Scatter name="Residual" data={points} fill="#6a51a3" isAnimationActive={false} />
            </ScatterChart>
          </ResponsiveContainer>
        </div>
      </figure>
    </div>
  );
}

/** Charts per gain code, one code at a time (their ranges differ by the gain ratio). */
export function BenchFitCharts({ run }: { run: BenchRunDto }) {
  const [code, setCode] = useState(run.gains[0]?.code ?? 0);
  const g = run.gains.find((x) => x.code === code) ?? run.gains[0];
  if (!g) return null;
  return (
    <div className="space-y-4">
      <div role="radiogroup" aria-label="Gain code shown" className="flex flex-wrap gap-1.5">
        {run.gains.map((x) => (
          <button key={x.code} type="button" role="radio" aria-checked={x.code === g.code} onClick={() => setCode(x.code)}
            className={cx('rounded-full px-3 py-1 text-sm ring-1 ring-inset', x.code === g.code ? 'bg-ink-900 text-white ring-ink-900' : 'bg-white text-ink-700 ring-ink-200 hover:bg-ink-50')}>
            Code {x.code}{x.nominalGain ? ` (×${x.nominalGain})` : ''}
          </button>
        ))}
      </div>
      <CodeCharts g={g} />
    </div>
  );
}

import { max, min } from 'simple-statistics';
import { CartesianGrid, Line, LineChart, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import { formatClock, zoneLabel } from '@shared/datetime';
import { formatDisplayNumber } from '@shared/display-number';
import { useReadingSeries } from '../api/get-reading-series';
import { useUnits } from '@/lib/units';
import { EmptyState, QueryState } from '@/components/ui/states';

/** Mark colours, used by the chart and by its legend alike. */
export const WALK_MARKS = {
  task: { colour: '#d97706', symbol: '●', label: 'task readings' },
  reference: { colour: '#64748b', symbol: '◆', label: 'outdoor reference' },
  over: { colour: '#dc2626', symbol: '▲', label: 'over range (at least)' },
  under: { colour: '#7c3aed', symbol: '▼', label: 'under range (at most)' },
} as const;

/** A downward triangle (Recharts has only the upward one): the reading is at most this. */
const down = (props: unknown) => {
  const { cx = 0, cy = 0 } = props as { cx?: number; cy?: number };
  return <path d={`M${cx - 5},${cy - 4}L${cx + 5},${cy - 4}L${cx},${cy + 5}Z`} fill={WALK_MARKS.under.colour} />;
};

/** A log axis's domain padded by a fifth of a decade each side, so marks at the extremes are drawn whole. */
export function paddedLogDomain(values: number[]): [number, number] {
  const positive = values.filter((v) => v > 0);
  if (positive.length === 0) return [1, 10];
  const lo = Math.log10(min(positive));
  const hi = Math.log10(max(positive));
  return [10 ** (lo - 0.2), 10 ** (hi + 0.2)];
}

/**
 * The walk over time: illuminance on a log axis (task points, the outdoor reference, over- and
 * under-range bounds), and beneath it the gain code each reading used, so the meter's
 * auto-ranging is visible. Times are in the site's zone, as in the readings table.
 */
export function WalkChart({ surveyId, timeZone }: { surveyId: number; timeZone: string }) {
  const series = useReadingSeries(surveyId);
  const units = useUnits();
  const time = (t: number) => formatClock(t, timeZone);
  return (
    <QueryState query={series} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No readings to chart yet" />}>
      {(d) => {
        // Recharts copies a datum's fields onto its SVG shape, so a field named `role` would become
        // an ARIA role: the plotted points carry only time, value and label.
        const valued = d.items.filter((p) => p.lux !== null && p.lux > 0);
        const plot = (keep: (p: (typeof valued)[number]) => boolean) => valued.filter(keep).map((p) => ({ t: p.t, v: units.convert(p.lux!), point: p.point }));
        const task = plot((p) => p.role === 'task' && p.flag !== 'over_range' && p.flag !== 'under_range');
        const over = plot((p) => p.flag === 'over_range');
        const under = plot((p) => p.flag === 'under_range');
        const reference = plot((p) => p.role === 'reference' && p.flag !== 'over_range' && p.flag !== 'under_range');
        const gains = d.items.filter((p) => p.role === 'task' && p.gainCode !== null).map((p) => ({ t: p.t, g: p.gainCode }));
        const codes = [...new Set(gains.map((g) => g.g as number))].sort((a, b) => a - b);
        const domain: [number, number] = [d.items[0].t, d.items[d.items.length - 1].t];
        const yDomain = paddedLogDomain([...task, ...over, ...under, ...reference].map((p) => p.v));
        const zone = `${timeZone}, ${zoneLabel(domain[0], timeZone)}`;
        return (
          <figure aria-label={`Illuminance over the walk in ${units.label}, and gain code; times in ${zone}`}>
            <figcaption className="mb-1 text-xs text-ink-500">
              <span data-testid="walk-span">From {time(domain[0])} to {time(domain[1])} ({zone})</span>
              {d.items.length < d.total && <> · showing {d.items.length.toLocaleString('en-GB')} of {d.total.toLocaleString('en-GB')} readings (every flagged one kept)</>}
            </figcaption>
            <div className="h-64">
              <ResponsiveContainer width="100%" height="100%">
                <ScatterChart margin={{ top: 12, right: 16, bottom: 0, left: 8 }}>
                  <CartesianGrid strokeDasharray="3 3" stroke="#e5e7eb" />
                  <XAxis type="number" dataKey="t" domain={domain} tickFormatter={time} hide />
                  <YAxis type="number" dataKey="v" scale="log" domain={yDomain} allowDataOverflow tickFormatter={(v: number) => v.toLocaleString('en-GB', { maximumSignificantDigits: 2 })} label={{ value: units.label, angle: -90, position: 'insideLeft' }} width={64} />
                  <Tooltip formatter={(v) => `${formatDisplayNumber(Number(v))} ${units.label}`} labelFormatter={(t) => time(Number(t))} />
                  <Scatter name="Task readings" data={task} fill={WALK_MARKS.task.colour} shape="circle" isAnimationActive={false} />
                  <Scatter name="Outdoor reference" data={reference} fill={WALK_MARKS.reference.colour} shape="diamond" isAnimationActive={false} />
                  <Scatter name="Over range (at least)" data={over} fill={WALK_MARKS.over.colour} shape="triangle" isAnimationActive={false} />
                  <Scatter name="Under range (at most)" data={under} fill={WALK_MARKS.under.colour} shape={down} isAnimationActive={false} />
                </ScatterChart>
              </ResponsiveContainer>
            </div>
            <div className="h-28">
              <ResponsiveContainer width="100%" height="100%">
                <LineChart data={gains} margin={{ top: 4, right: 16, bottom: 16, left: 8 }}>
                  <XAxis type="number" dataKey="t" domain={domain} tickFormatter={time} label={{ value: `Time (${zone})`, position: 'insideBottom', offset: -12, fontSize: 12 }} />
                  <YAxis dataKey="g" allowDecimals={false} ticks={codes} interval={0} domain={[codes[0] ?? 0, codes[codes.length - 1] ?? 1]} label={{ value: 'gain', angle: -90, position: 'insideLeft' }} width={64} />
                  <Line type="stepAfter" dataKey="g" stroke="#334155" dot={false} isAnimationActive={false} />
                </LineChart>
              </ResponsiveContainer>
            </div>
            <ul className="mt-1 flex flex-wrap gap-4 text-xs text-ink-600" aria-label="Chart legend">
              {Object.entries(WALK_MARKS).map(([k, m]) => <li key={k}><span aria-hidden style={{ color: m.colour }}>{m.symbol}</span> {m.label}</li>)}
              <li>lower panel: gain code used</li>
            </ul>
          </figure>
        );
      }}
    </QueryState>
  );
}

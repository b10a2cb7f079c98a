import { CartesianGrid, Line, LineChart, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import { useReadingSeries } from '../api/get-reading-series';
import { useUnits } from '@/lib/units';
import { EmptyState, QueryState } from '@/components/ui/states';

const time = (t: number) => new Date(t).toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit' });

/**
 * The walk over time: illuminance on a log axis (task points and the outdoor reference), and
 * beneath it the gain code each reading used, so the meter's auto-ranging is visible.
 */
export function WalkChart({ surveyId }: { surveyId: number }) {
  const series = useReadingSeries(surveyId);
  const units = useUnits();
  return (
    <QueryState query={series} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No readings to chart yet" />}>
      {(d) => {
        // Recharts copies a datum's fields onto its SVG shape, so a field named `role` would become
        // an ARIA role: the plotted points carry only time, value and label.
        const valued = d.items.filter((p) => p.lux !== null && p.lux > 0);
        const plot = (keep: (p: (typeof valued)[number]) => boolean) => valued.filter(keep).map((p) => ({ t: p.t, v: units.convert(p.lux!), point: p.point }));
        const task = plot((p) => p.role === 'task' && p.flag !== 'over_range');
        const over = plot((p) => p.flag === 'over_range');
        const reference = plot((p) => p.role === 'reference');
        const gains = d.items.filter((p) => p.role === 'task' && p.gainCode !== null).map((p) => ({ t: p.t, g: p.gainCode }));
        const domain: [number, number] = [d.items[0].t, d.items[d.items.length - 1].t];
        return (
          <figure aria-label={`Illuminance over the walk in ${units.label}, and gain code`}>
            {d.items.length < d.total && <figcaption className="mb-1 text-xs text-ink-500">Showing {d.items.length.toLocaleString('en-GB')} of {d.total.toLocaleString('en-GB')} readings (every flagged one kept).</figcaption>}
            <div className="h-64">
              <ResponsiveContainer width="100%" height="100%">
                <ScatterChart margin={{ top: 8, right: 16, bottom: 0, left: 8 }}>
                  <CartesianGrid strokeDasharray="3 3" stroke="#e5e7eb" />
                  <XAxis type="number" dataKey="t" domain={domain} tickFormatter={time} hide />
                  <YAxis type="number" dataKey="v" scale="log" domain={['auto', 'auto']} allowDataOverflow tickFormatter={(v: number) => v.toLocaleString('en-GB', { maximumSignificantDigits: 2 })} label={{ value: units.label, angle: -90, position: 'insideLeft' }} width={64} />
                  <Tooltip formatter={(v) => `${Number(v).toLocaleString('en-GB', { maximumSignificantDigits: 3 })} ${units.label}`} labelFormatter={(t) => time(Number(t))} />
                  <Scatter name="Task readings" data={task} fill="#d97706" shape="circle" isAnimationActive={false} />
                  <Scatter name="Outdoor reference" data={reference} fill="#64748b" shape="diamond" isAnimationActive={false} />
                  <Scatter name="Over range (lower bound)" data={over} fill="#dc2626" shape="triangle" isAnimationActive={false} />
                </ScatterChart>
              </ResponsiveContainer>
            </div>
            <div className="h-24">
              <ResponsiveContainer width="100%" height="100%">
                <LineChart data={gains} margin={{ top: 4, right: 16, bottom: 0, left: 8 }}>
                  <XAxis type="number" dataKey="t" domain={domain} tickFormatter={time} />
                  <YAxis dataKey="g" allowDecimals={false} domain={[0, 'dataMax']} label={{ value: 'gain', angle: -90, position: 'insideLeft' }} width={64} />
                  <Line type="stepAfter" dataKey="g" stroke="#334155" dot={false} isAnimationActive={false} />
                </LineChart>
              </ResponsiveContainer>
            </div>
            <p className="mt-1 flex flex-wrap gap-4 text-xs text-ink-600">
              <span>● task readings</span><span>◆ outdoor reference</span><span>▲ over range (lower bound)</span><span>lower panel: gain code used</span>
            </p>
          </figure>
        );
      }}
    </QueryState>
  );
}

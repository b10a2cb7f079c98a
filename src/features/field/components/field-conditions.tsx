import { useState } from 'react';
import type { FieldState } from '@shared/schemas/field';
import { cx } from '@/components/ui/cx';
import { newKey, type OutboxItem } from '../offline/field-db';

const INPUT = 'mt-1 block w-full min-h-11 rounded-xl border-0 bg-white px-3 text-base text-ink-950 ring-2 ring-inset ring-ink-400 focus:ring-4 focus:ring-lamp-500';

/** Local datetime-input value for now. */
function nowLocal(): string {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
}

/**
 * The session's measurement conditions: who measured, when the lights went on, supply voltage,
 * temperature, sky, blinds, lamp burn-in and whether daylight is excluded. Saved to the outbox
 * like any record; readings of the session are warned about against them.
 */
export function FieldConditions({ state, defaultName, onSaved, onAdd }: {
  state: FieldState;
  defaultName: string;
  onSaved: (sessionKey: string) => void;
  onAdd: (item: OutboxItem) => Promise<void>;
}) {
  const [f, setF] = useState({ measuredBy: defaultName, lightsOnAt: '', supplyVoltageV: '', ambientTempC: '', sky: '', blinds: '', lampBurnInHours: '', daylightExcluded: state.survey.daylightExcluded });
  const [problem, setProblem] = useState<string | null>(null);
  const set = (k: keyof typeof f) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => setF((x) => ({ ...x, [k]: e.target.type === 'checkbox' ? (e.target as HTMLInputElement).checked : e.target.value }));
  const num = (s: string) => (s.trim() === '' ? null : Number(s.replace(',', '.')));

  const save = async () => {
    if (!f.measuredBy.trim()) { setProblem('Say who measured'); return; }
    for (const [k, label] of [['supplyVoltageV', 'Supply voltage'], ['ambientTempC', 'Temperature'], ['lampBurnInHours', 'Burn-in hours']] as const) {
      const v = num(f[k]);
      if (v !== null && !Number.isFinite(v)) { setProblem(`${label} is not a number`); return; }
    }
    const key = newKey();
    await onAdd({
      key, surveyId: state.survey.id, kind: 'session', state: 'waiting', reason: null, createdAt: Date.now(),
      body: {
        idempotencyKey: key, measuredBy: f.measuredBy.trim(), startedAt: new Date().toISOString(),
        lightsOnAt: f.lightsOnAt ? new Date(f.lightsOnAt).toISOString() : null,
        supplyVoltageV: num(f.supplyVoltageV), ambientTempC: num(f.ambientTempC), lampBurnInHours: num(f.lampBurnInHours),
        sky: (f.sky || null) as 'overcast' | null, blinds: (f.blinds || null) as 'open' | null, daylightExcluded: f.daylightExcluded,
      },
    });
    setProblem(null);
    onSaved(key);
  };

  return (
    <section aria-labelledby="conditions-title" className="rounded-2xl bg-white p-4 ring-2 ring-ink-300">
      <h2 id="conditions-title" className="text-lg font-bold text-ink-950">Conditions of this visit</h2>
      <p className="text-sm text-ink-700">Readings taken less than {state.warmUpMinutes} min after the lights went on are warned about (common practice for discharge lamps).</p>
      <div className="mt-3 grid gap-3 sm:grid-cols-2">
        <label className="text-sm font-semibold text-ink-900">Who measured<input className={INPUT} value={f.measuredBy} onChange={set('measuredBy')} /></label>
        <label className="text-sm font-semibold text-ink-900">Lights switched on at
          <input type="datetime-local" className={INPUT} value={f.lightsOnAt} onChange={set('lightsOnAt')} max={nowLocal()} />
        </label>
        <label className="text-sm font-semibold text-ink-900">Supply voltage (V)<input inputMode="decimal" className={INPUT} value={f.supplyVoltageV} onChange={set('supplyVoltageV')} /></label>
        <label className="text-sm font-semibold text-ink-900">Ambient temperature (°C)<input inputMode="decimal" className={INPUT} value={f.ambientTempC} onChange={set('ambientTempC')} /></label>
        <label className="text-sm font-semibold text-ink-900">Sky
          <select className={INPUT} value={f.sky} onChange={set('sky')}><option value="">Not recorded</option><option value="overcast">Overcast</option><option value="clear">Clear</option><option value="night">Night</option></select>
        </label>
        <label className="text-sm font-semibold text-ink-900">Blinds
          <select className={INPUT} value={f.blinds} onChange={set('blinds')}><option value="">Not recorded</option><option value="closed">Closed</option><option value="open">Open</option><option value="none">No blinds</option></select>
        </label>
        <label className="text-sm font-semibold text-ink-900">Lamp burn-in (hours)<input inputMode="decimal" className={INPUT} value={f.lampBurnInHours} onChange={set('lampBurnInHours')} /></label>
        <label className="flex min-h-11 items-center gap-3 text-sm font-semibold text-ink-900">
          <input type="checkbox" className="h-6 w-6" checked={f.daylightExcluded} onChange={set('daylightExcluded')} />Daylight excluded
        </label>
      </div>
      {problem && <p role="alert" className="mt-3 rounded-lg bg-short-50 p-3 text-sm font-semibold text-short-700">{problem}</p>}
      <button type="button" onClick={() => void save()} className={cx('mt-4 min-h-11 w-full rounded-xl bg-ink-950 px-4 text-base font-semibold text-white')}>Start the visit with these conditions</button>
    </section>
  );
}

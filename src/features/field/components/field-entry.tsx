import { useState } from 'react';
import { Check, MapPin, Plus, SkipForward, X } from 'lucide-react';
import type { FieldState } from '@shared/schemas/field';
import { typedValueProblem } from '@shared/core/typed-readings';
import { footcandlesToLux } from '@shared/core/units';
import { useUnits, formatNumber } from '@/lib/units';
import { cx } from '@/components/ui/cx';
import type { OutboxItem } from '../offline/field-db';
import { newKey, outboxRecord } from '../offline/field-db';
import { PhotoPicker } from './photo-picker';
import { formatClock } from '@shared/datetime';

const BIG = 'min-h-11 rounded-xl px-4 text-base font-semibold';
const INPUT = 'block w-full min-h-11 rounded-xl border-0 bg-white px-3 text-base text-ink-950 ring-2 ring-inset ring-ink-400 focus:ring-4 focus:ring-lamp-500';

export type PointTarget = { label: string; plannedPointId: number | null; planId: number | null; xM: number | null; yM: number | null };

type Mode = 'typed' | 'mark' | 'skip';

/**
 * Recording at one point: typed values (several allowed, big numeric entry in lux or fc), a
 * "measured here now" mark for a logging meter, or a skip with its reason; and a photo. Each
 * action goes to the phone's outbox first, so it answers at once with the network off.
 */
export function FieldEntry({ state, target, sessionKey, onAdd }: {
  state: FieldState;
  target: PointTarget;
  sessionKey: string | null;
  onAdd: (item: OutboxItem) => Promise<void>;
}) {
  const { unit, label: unitLabel } = useUnits();
  const manual = state.probes.filter((p) => p.kind === 'manual');
  const logging = state.probes.filter((p) => p.kind !== 'manual');
  const [mode, setMode] = useState<Mode>(manual.length ? 'typed' : 'mark');
  const [probeId, setProbeId] = useState<number | ''>(manual[0]?.id ?? '');
  const [markProbeId, setMarkProbeId] = useState<number | ''>('');
  const [draft, setDraft] = useState('');
  const [values, setValues] = useState<number[]>([]);
  const [lights, setLights] = useState<'' | 'on' | 'off'>('');
  const [note, setNote] = useState('');
  const [reason, setReason] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [keepLocation, setKeepLocation] = useState(false);

  const meter = manual.find((p) => p.id === probeId) ?? null;
  const place = { point: target.label, plannedPointId: target.plannedPointId, planId: target.planId, xM: target.xM, yM: target.yM, sessionKey };

  /** Checks a typed value with the same rule the server uses (shared core), in lux. */
  const check = (v: number) => {
    if (!meter) return 'Choose the meter first';
    const lux = unit === 'fc' ? footcandlesToLux(v) : v;
    const p = typedValueProblem(lux, { rangeLowLux: meter.rangeLowLux, rangeHighLux: meter.rangeHighLux });
    return p ? `${formatNumber(v)} ${unitLabel} ${p}` : null;
  };

  const addValue = () => {
    const v = Number(draft.replace(',', '.'));
    const p = draft.trim() === '' ? 'Type a value' : check(v);
    setProblem(p);
    if (p) return;
    setValues((vs) => [...vs, v]);
    setDraft('');
  };

  const done = (what: string) => {
    setSaved(what);
    setValues([]);
    setDraft('');
    setNote('');
    setReason('');
    setProblem(null);
  };

  const saveTyped = async () => {
    let all = values;
    if (draft.trim() !== '') {
      const v = Number(draft.replace(',', '.'));
      const p = check(v);
      if (p) { setProblem(p); return; }
      all = [...values, v];
    }
    if (all.length === 0) { setProblem('Type at least one value'); return; }
    if (!meter) { setProblem('Choose the meter first'); return; }
    await onAdd(outboxRecord(state.survey.id, { kind: 'typed', ...place, probeId: meter.id, values: all, unit, lights: lights || null, recordedAt: new Date().toISOString(), ...(note ? { note } : {}) }));
    done(`Saved ${all.length} value${all.length > 1 ? 's' : ''} at ${target.label}`);
  };

  const saveMark = async () => {
    const recordedAt = new Date().toISOString();
    await onAdd(outboxRecord(state.survey.id, { kind: 'mark', ...place, probeId: markProbeId === '' ? null : markProbeId, recordedAt, ...(note ? { note } : {}) }));
    done(`Marked ${target.label} at ${formatClock(recordedAt, state.survey.siteTimeZone, { seconds: true })}`);
  };

  const saveSkip = async () => {
    if (!reason.trim()) { setProblem('Say why the point is skipped'); return; }
    await onAdd(outboxRecord(state.survey.id, { kind: 'skip', ...place, reason: reason.trim(), recordedAt: new Date().toISOString() }));
    done(`Skipped ${target.label}`);
  };

  const addPhoto = async (file: File) => {
    const key = newKey();
    await onAdd({
      key, surveyId: state.survey.id, kind: 'photo', state: 'waiting', reason: null, createdAt: Date.now(), blob: file,
      body: { idempotencyKey: key, takenAt: new Date().toISOString(), point: target.label, ...(target.plannedPointId ? { plannedPointId: target.plannedPointId } : {}), keepLocation, filename: file.name || 'photo.jpg' },
    });
    setSaved(`Photo kept for ${target.label}`);
  };

  return (
    <section aria-labelledby="entry-title" className="rounded-2xl bg-white p-4 ring-2 ring-ink-900">
      <h2 id="entry-title" className="text-lg font-bold text-ink-950">Point {target.label}</h2>
      {target.xM !== null && <p className="text-sm text-ink-700">At x {formatNumber(target.xM)} m, y {formatNumber(target.yM!)} m</p>}

      <div role="tablist" aria-label="How to record" className="mt-3 grid grid-cols-3 gap-1 rounded-xl bg-ink-100 p-1">
        {([['typed', 'Type values'], ['mark', 'Here now'], ['skip', 'Skip']] as const).map(([m, text]) => (
          <button key={m} type="button" role="tab" aria-selected={mode === m} onClick={() => { setMode(m); setProblem(null); setSaved(null); }}
            className={cx('min-h-11 rounded-lg text-sm font-semibold', mode === m ? 'bg-ink-950 text-white' : 'text-ink-900')}>{text}</button>
        ))}
      </div>

      {mode === 'typed' && (
        <div className="mt-4 flex flex-col gap-3">
          {manual.length === 0 ? (
            <p className="rounded-lg bg-unsure-50 p-3 text-sm text-ink-900">No hand-held meter is registered. Calibration staff add one in the calibration workspace (kind "Hand-held meter, values typed").</p>
          ) : (
            <label className="block text-sm font-semibold text-ink-900">Meter
              <select className={cx(INPUT, 'mt-1')} value={probeId} onChange={(e) => setProbeId(Number(e.target.value))}>
                {manual.map((p) => <option key={p.id} value={p.id}>{p.serial}{p.meterClass ? ` · class ${p.meterClass}` : p.certificateURel !== null ? ` · certificate ${formatNumber(p.certificateURel * 100)} %` : ''}{p.calibrationState === 'overdue' ? ' · calibration overdue' : ''}</option>)}
              </select>
            </label>
          )}
          <label className="block text-sm font-semibold text-ink-900">Value ({unitLabel})
            <div className="mt-1 flex gap-2">
              <input
                className={cx(INPUT, 'h-16 text-3xl font-bold tabular-nums')}
                inputMode="decimal"
                enterKeyHint="done"
                autoComplete="off"
                value={draft}
                onChange={(e) => setDraft(e.target.value)}
                onKeyDown={(e) => { if (e.key === 'Enter') { e.preventDefault(); addValue(); } }}
                aria-describedby="typed-help"
              />
              <button type="button" onClick={addValue} className={cx(BIG, 'bg-ink-200 text-ink-950')} aria-label="Add another value at this point"><Plus className="h-6 w-6" aria-hidden /></button>
            </div>
          </label>
          <p id="typed-help" className="text-sm text-ink-700">Several values at one point are kept; the reading is their mean, with their spread in its uncertainty.</p>
          {values.length > 0 && (
            <ul aria-label="Values typed at this point" className="flex flex-wrap gap-2">
              {values.map((v, i) => (
                <li key={i} className="flex items-center gap-1 rounded-lg bg-ink-100 px-3 py-2 text-base font-semibold tabular-nums">
                  {formatNumber(v)} {unitLabel}
                  <button type="button" className="ml-1 grid h-11 w-11 place-items-center" aria-label={`Remove ${formatNumber(v)} ${unitLabel}`} onClick={() => setValues((vs) => vs.filter((_, j) => j !== i))}><X className="h-4 w-4" aria-hidden /></button>
                </li>
              ))}
            </ul>
          )}
          <fieldset>
            <legend className="text-sm font-semibold text-ink-900">Lights</legend>
            <div className="mt-1 grid grid-cols-3 gap-1">
              {([['', 'As found'], ['on', 'On (pair)'], ['off', 'Off (pair)']] as const).map(([v, text]) => (
                <label key={v} className={cx('flex min-h-11 items-center justify-center rounded-lg text-sm font-semibold ring-2 ring-inset', lights === v ? 'bg-ink-950 text-white ring-ink-950' : 'ring-ink-300 text-ink-900')}>
                  <input type="radio" name="lights" className="sr-only" checked={lights === v} onChange={() => setLights(v)} />{text}
                </label>
              ))}
            </div>
            <p className="mt-1 text-xs text-ink-700">A pair: lights on, then off, back to back (at most {Math.round(state.maxPairGapS / 60)} min apart); the electric light is on − off.</p>
          </fieldset>
          <label className="block text-sm font-semibold text-ink-900">Note (optional)
            <input className={cx(INPUT, 'mt-1')} value={note} onChange={(e) => setNote(e.target.value)} maxLength={1000} />
          </label>
          <button type="button" onClick={() => void saveTyped()} disabled={manual.length === 0} className={cx(BIG, 'flex items-center justify-center gap-2 bg-meets-700 text-white disabled:opacity-50')}>
            <Check className="h-5 w-5" aria-hidden />Save reading
          </button>
        </div>
      )}

      {mode === 'mark' && (
        <div className="mt-4 flex flex-col gap-3">
          <p className="text-sm text-ink-800">Take the reading with the logging meter, then tap at once. Its log, uploaded later, is placed by time.</p>
          <label className="block text-sm font-semibold text-ink-900">Logging meter (optional)
            <select className={cx(INPUT, 'mt-1')} value={markProbeId} onChange={(e) => setMarkProbeId(e.target.value === '' ? '' : Number(e.target.value))}>
              <option value="">Any meter</option>
              {logging.map((p) => <option key={p.id} value={p.id}>{p.serial}</option>)}
            </select>
          </label>
          <button type="button" onClick={() => void saveMark()} className={cx(BIG, 'flex h-16 items-center justify-center gap-2 bg-lamp-400 text-lg text-ink-950')}>
            <MapPin className="h-6 w-6" aria-hidden />Measured here now
          </button>
        </div>
      )}

      {mode === 'skip' && (
        <div className="mt-4 flex flex-col gap-3">
          <label className="block text-sm font-semibold text-ink-900">Why is this point skipped?
            <input className={cx(INPUT, 'mt-1')} value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} placeholder="e.g. blocked by shelving" />
          </label>
          <button type="button" onClick={() => void saveSkip()} className={cx(BIG, 'flex items-center justify-center gap-2 bg-ink-800 text-white')}>
            <SkipForward className="h-5 w-5" aria-hidden />Skip this point
          </button>
        </div>
      )}

      <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-ink-200 pt-3">
        <PhotoPicker label="Photo" keepLocation={keepLocation} onKeepLocation={setKeepLocation} onFile={(f) => void addPhoto(f)} />
      </div>

      {problem && <p role="alert" className="mt-3 rounded-lg bg-short-50 p-3 text-sm font-semibold text-short-700">{problem}</p>}
      {saved && !problem && <p role="status" className="mt-3 rounded-lg bg-meets-50 p-3 text-sm font-semibold text-meets-700">{saved}</p>}
    </section>
  );
}

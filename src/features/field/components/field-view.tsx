import { useMemo, useState } from 'react';
import { AlertTriangle, CloudOff, Download, RefreshCw, Wifi } from 'lucide-react';
import { useUnits, formatNumber } from '@/lib/units';
import { cx } from '@/components/ui/cx';
import { formatClock, formatDateTime } from '@shared/datetime';
import { ApiRequestError } from '@/lib/api-client';
import { useFieldSurvey } from '../offline/use-field-survey';
import { fieldEntries, fieldPoints, nextPoint, zoneItems, zoneProgress, type FieldEntry as Entry, type FieldPoint } from '../field-model';
import { FieldPlan } from './field-plan';
import { FieldEntry, type PointTarget } from './field-entry';
import { FieldConditions } from './field-conditions';
import { FieldZoneNotes } from './field-zone-notes';

const STATE_LABEL = { todo: 'To do', measured: 'Measured', skipped: 'Skipped' } as const;
const SYNC_LABEL = { synced: 'Synced', waiting: 'Waiting to sync', refused: 'Refused' } as const;

function sessionStorageKey(surveyId: number) {
  return `luxtrail.field.session.${surveyId}`;
}

/** The field view of one survey: phone first, usable with the network off. */
export function FieldView({ surveyId, userName }: { surveyId: number; userName: string }) {
  const f = useFieldSurvey(surveyId);
  const { format } = useUnits();
  const [planId, setPlanId] = useState<number | null>(null);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [free, setFree] = useState<{ xM: number; yM: number } | null>(null);
  const [freeLabel, setFreeLabel] = useState('');
  const [sessionKey, setSessionKey] = useState<string | null>(() => localStorage.getItem(sessionStorageKey(surveyId)));
  const [showConditions, setShowConditions] = useState(false);
  const [offlineError, setOfflineError] = useState<string | null>(null);
  const [zoneChoice, setZoneChoice] = useState<{ zoneId: number; forPoint: string | null } | null>(null);

  const entries = useMemo(() => fieldEntries(f.state, f.outbox), [f.state, f.outbox]);
  const points = useMemo(() => fieldPoints(f.state, entries), [f.state, entries]);
  const next = useMemo(() => nextPoint(points, entries), [points, entries]);
  const progress = useMemo(() => zoneProgress(f.state, points), [f.state, points]);
  // Until the surveyor picks a plan, show the one the next point is on.
  const shownPlanId = planId ?? next?.planId ?? null;
  const plan = f.state?.plans.find((p) => p.id === shownPlanId) ?? f.state?.plans[0] ?? null;

  if (f.loading) return <p role="status" className="p-6 text-base">Loading the survey…</p>;
  if (!f.state) {
    const offline = f.server.error instanceof ApiRequestError && f.server.error.status === 0;
    return (
      <div role="alert" className="m-4 rounded-2xl bg-short-50 p-4 text-base text-ink-950">
        <p className="font-bold">{offline ? 'This survey was not taken offline on this phone' : 'The survey could not be loaded'}</p>
        <p className="mt-1">{f.server.error instanceof Error ? f.server.error.message : ''}</p>
      </div>
    );
  }
  const state = f.state;
  const waiting = f.outbox.filter((i) => i.state === 'waiting').length;
  const refused = f.outbox.filter((i) => i.state === 'refused');
  const selected: FieldPoint | null = points.find((p) => p.id === selectedId) ?? null;
  const target: PointTarget | null = selected
    ? { label: selected.label, plannedPointId: selected.plannedPointId, planId: selected.planId, xM: selected.xM, yM: selected.yM }
    : free && freeLabel.trim() ? { label: freeLabel.trim(), plannedPointId: null, planId: plan?.id ?? null, xM: free.xM, yM: free.yM } : null;

  // The current zone: the one the surveyor chose, else the selected point's, else the next point's, else the shown plan's first.
  const zoneId = (zoneChoice && zoneChoice.forPoint === selectedId ? zoneChoice.zoneId : null) ?? selected?.zoneId ?? next?.zoneId ?? state.zones.find((z) => z.planId === plan?.id)?.id ?? state.zones[0]?.id ?? null;

  const takeOffline = async () => {
    setOfflineError(null);
    try { await f.takeOffline(); } catch (e) { setOfflineError(e instanceof Error ? e.message : String(e)); }
  };

  return (
    <div className="mx-auto flex w-full max-w-3xl flex-col gap-4 p-3 sm:p-4">
      <header className="flex flex-col gap-2">
        <div>
          <p className="text-sm font-semibold text-ink-700">{state.survey.siteName}</p>
          <h1 className="text-xl font-bold text-ink-950">{state.survey.name}</h1>
        </div>
        <div className="flex flex-wrap items-center gap-2" aria-live="polite">
          <span className={cx('inline-flex min-h-11 items-center gap-2 rounded-xl px-3 text-sm font-bold', f.online ? 'bg-meets-50 text-meets-700' : 'bg-ink-900 text-white')}>
            {f.online ? <Wifi className="h-5 w-5" aria-hidden /> : <CloudOff className="h-5 w-5" aria-hidden />}{f.online ? 'Online' : 'Offline'}
          </span>
          <span data-testid="waiting-count" className="inline-flex min-h-11 items-center rounded-xl bg-ink-100 px-3 text-sm font-bold text-ink-950">
            {waiting === 0 ? 'Nothing waiting to sync' : `${waiting} waiting to sync`}
          </span>
          {f.online && waiting > 0 && (
            <button type="button" onClick={() => void f.sync()} className="inline-flex min-h-11 items-center gap-2 rounded-xl bg-ink-950 px-3 text-sm font-semibold text-white" aria-busy={f.syncing}>
              <RefreshCw className={cx('h-4 w-4', f.syncing && 'animate-spin')} aria-hidden />Sync now
            </button>
          )}
          <button type="button" onClick={() => void takeOffline()} disabled={!f.online || f.takingOffline} className="inline-flex min-h-11 items-center gap-2 rounded-xl bg-white px-3 text-sm font-semibold text-ink-950 ring-2 ring-inset ring-ink-400 disabled:opacity-50">
            <Download className="h-4 w-4" aria-hidden />{f.takingOffline ? 'Taking offline…' : f.snapshot ? 'Refresh offline copy' : 'Take offline'}
          </button>
        </div>
        {f.snapshot && <p className="text-sm text-ink-700" data-testid="offline-copy">On this phone since {formatDateTime(f.snapshot.savedAt, state.survey.siteTimeZone)} (site time)</p>}
        {f.retryAt !== null && waiting > 0 && <p className="text-sm text-ink-700" data-testid="sync-retry">{f.online ? 'The server did not take everything' : 'The server cannot be reached'}; trying again at {formatClock(f.retryAt, state.survey.siteTimeZone, { seconds: true })} (site time).</p>}
        {offlineError && <p role="alert" className="rounded-lg bg-short-50 p-3 text-sm font-semibold text-short-700">{offlineError}</p>}
        {f.fromPhone && <p className="rounded-lg bg-ink-900 p-3 text-sm font-semibold text-white">Showing the copy on this phone. New records wait here and sync when the connection returns.</p>}
        {state.survey.refusal && <p role="alert" className="rounded-lg bg-short-50 p-3 text-sm font-semibold text-short-700">{state.survey.refusal}</p>}
      </header>

      {refused.length > 0 && (
        <section aria-labelledby="refused-title" className="rounded-2xl bg-short-50 p-4 ring-2 ring-short-600">
          <h2 id="refused-title" className="flex items-center gap-2 text-base font-bold text-short-700"><AlertTriangle className="h-5 w-5" aria-hidden />Refused by the server ({refused.length})</h2>
          <ul className="mt-2 flex flex-col gap-2">
            {refused.map((i) => (
              <li key={i.key} className="flex flex-wrap items-center justify-between gap-2 rounded-lg bg-white p-3 text-sm text-ink-950">
                <span><strong>{i.kind === 'session' ? 'Conditions' : i.kind === 'photo' ? `Photo ${i.body.point ?? ''}` : i.body.kind === 'zone_note' ? 'Zone note' : `${i.body.kind === 'typed' ? 'Reading' : i.body.kind === 'mark' ? 'Mark' : 'Skip'} at ${i.body.point}`}</strong>: {i.reason}</span>
                <button type="button" className="min-h-11 rounded-lg px-3 font-semibold text-short-700 ring-2 ring-inset ring-short-600" onClick={() => void f.discard(i.key)}>Discard</button>
              </li>
            ))}
          </ul>
        </section>
      )}

      {!sessionKey || showConditions ? (
        <FieldConditions state={state} defaultName={userName} onAdd={f.add} onSaved={(k) => { localStorage.setItem(sessionStorageKey(surveyId), k); setSessionKey(k); setShowConditions(false); }} />
      ) : (
        <button type="button" onClick={() => setShowConditions(true)} className="min-h-11 self-start rounded-xl px-3 text-sm font-semibold text-ink-950 ring-2 ring-inset ring-ink-300">Conditions recorded · start a new visit</button>
      )}

      {progress.length > 0 && (
        <section aria-labelledby="progress-title">
          <h2 id="progress-title" className="text-base font-bold text-ink-950">Progress</h2>
          <ul className="mt-2 grid gap-2 sm:grid-cols-2">
            {progress.map((z) => (
              <li key={z.zoneId} className="flex min-h-11 items-center justify-between rounded-xl bg-white px-3 text-base ring-1 ring-ink-300">
                <span className="font-semibold">{z.name}</span>
                <span className="tabular-nums" data-testid={`progress-${z.zoneId}`}>{z.done} of {z.total}{z.skipped ? ` (${z.skipped} skipped)` : ''}</span>
              </li>
            ))}
          </ul>
        </section>
      )}

      {state.plans.length > 1 && (
        <div role="tablist" aria-label="Plans" className="flex gap-2 scroll-x">
          {state.plans.map((p) => (
            <button key={p.id} type="button" role="tab" aria-selected={plan?.id === p.id} onClick={() => { setPlanId(p.id); setFree(null); }}
              className={cx('min-h-11 shrink-0 rounded-xl px-3 text-sm font-semibold', plan?.id === p.id ? 'bg-ink-950 text-white' : 'bg-white text-ink-950 ring-2 ring-inset ring-ink-300')}>{p.name}</button>
          ))}
        </div>
      )}

      {plan ? (
        <FieldPlan
          plan={plan}
          image={f.snapshot?.images[plan.id] ?? null}
          points={points}
          nextId={next?.id ?? null}
          selectedId={selectedId}
          onSelect={(id) => { setSelectedId(id); setFree(null); }}
          onPlace={(xM, yM) => { setSelectedId(null); setFree({ xM, yM }); }}
          placed={free}
        />
      ) : (
        <p className="rounded-xl bg-white p-4 text-base ring-1 ring-ink-300">This site has no plan yet: record points by label below.</p>
      )}
      {next && !selected && (
        <button type="button" onClick={() => { setSelectedId(next.id); setFree(null); }} className="min-h-11 rounded-xl bg-lamp-400 px-4 text-base font-bold text-ink-950">
          Next point: {next.label}
        </button>
      )}

      {!selected && (
        <section aria-labelledby="free-title" className="rounded-2xl bg-white p-4 ring-1 ring-ink-300">
          <h2 id="free-title" className="text-base font-bold text-ink-950">A point not on the plan's list</h2>
          <p className="text-sm text-ink-700">{free ? `At x ${formatNumber(free.xM)} m, y ${formatNumber(free.yM)} m on ${plan?.name}.` : plan?.widthM ? 'Tap the plan where you are, then name the point.' : 'Name the point.'}</p>
          <label className="mt-2 block text-sm font-semibold text-ink-900">Point label
            <input className="mt-1 block w-full min-h-11 rounded-xl border-0 px-3 text-base ring-2 ring-inset ring-ink-400 focus:ring-4 focus:ring-lamp-500" value={freeLabel} onChange={(e) => setFreeLabel(e.target.value)} maxLength={120} />
          </label>
        </section>
      )}

      {target && state.survey.acceptsRecords && <FieldEntry key={`${target.label}-${target.xM}-${target.yM}`} state={state} target={target} sessionKey={sessionKey} onAdd={f.add} />}

      {zoneId !== null && (
        <FieldZoneNotes state={state} zoneId={zoneId} onZone={(id) => setZoneChoice({ zoneId: id, forPoint: selectedId })} items={zoneItems(state, f.outbox, zoneId)} sessionKey={sessionKey} onAdd={f.add} />
      )}

      {selected && <PointHistory point={selected} format={format} timeZone={state.survey.siteTimeZone} onClose={() => setSelectedId(null)} />}

      <section aria-labelledby="points-title">
        <h2 id="points-title" className="text-base font-bold text-ink-950">Points</h2>
        {points.length === 0 ? <p className="text-base text-ink-700">No points yet.</p> : (
          <ul className="mt-2 flex flex-col gap-1">
            {points.map((p) => (
              <li key={p.id}>
                <button type="button" onClick={() => { setSelectedId(p.id); setFree(null); if (p.planId) setPlanId(p.planId); }}
                  className={cx('flex min-h-11 w-full items-center justify-between rounded-xl px-3 text-left text-base ring-1 ring-inset', p.id === selectedId ? 'bg-ink-950 text-white ring-ink-950' : 'bg-white text-ink-950 ring-ink-300')}>
                  <span className="font-semibold">{p.label}{p.id === next?.id ? ' · next' : ''}</span>
                  <span data-testid={`point-state-${p.label}`}>{STATE_LABEL[p.state]}{p.entries.some((e) => e.sync === 'waiting') ? ' · waiting' : ''}</span>
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}

function PointHistory({ point, format, timeZone, onClose }: { point: FieldPoint; format: (lux: number) => string; timeZone: string; onClose: () => void }) {
  return (
    <section aria-labelledby="history-title" className="rounded-2xl bg-white p-4 ring-1 ring-ink-300">
      <div className="flex items-center justify-between">
        <h2 id="history-title" className="text-base font-bold text-ink-950">Recorded at {point.label}</h2>
        <button type="button" onClick={onClose} className="min-h-11 rounded-lg px-3 text-sm font-semibold ring-2 ring-inset ring-ink-300">Close</button>
      </div>
      {point.entries.length === 0 ? <p className="text-sm text-ink-700">Nothing yet.</p> : (
        <ul className="mt-2 flex flex-col gap-2">
          {point.entries.map((e: Entry) => (
            <li key={e.key} className="rounded-lg bg-ink-50 p-3 text-sm text-ink-950">
              <div className="flex flex-wrap justify-between gap-2">
                <strong>
                  {e.kind === 'typed' ? `${e.values?.map((v) => formatNumber(v)).join(', ')} ${e.unit}${e.lights ? ` (lights ${e.lights})` : ''}` : e.kind === 'mark' ? `Measured here (logging meter) at ${formatClock(e.recordedAt, timeZone, { seconds: true })}` : `Skipped: ${e.skipReason}`}
                </strong>
                <span className={cx('font-semibold', e.sync === 'refused' ? 'text-short-700' : e.sync === 'waiting' ? 'text-unsure-700' : 'text-meets-700')}>{SYNC_LABEL[e.sync]}</span>
              </div>
              {e.reading && <p>Reading {format(e.reading.lux)} ± {format(e.reading.uLux)} (k = 2){e.reading.paired ? ', lights on − off' : ''}</p>}
              {e.reason && <p className="font-semibold text-short-700">{e.reason}</p>}
              {e.warnings.map((w) => <p key={w.code} className="text-unsure-700">⚠ {w.message}</p>)}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

import { useEffect, useRef, useState } from 'react';
import { useQueryClient, type UseQueryResult } from '@tanstack/react-query';
import type { PlanListResponse } from '@shared/schemas/plans';
import { CheckCircle2, Upload } from 'lucide-react';
import { useUploadLog } from '../api/upload-log';
import { useImport } from '../api/get-import';
import { ImportErrorsTable, ImportWarningsList } from './import-errors-table';
import { Button } from '@/components/ui/button';
import { ProgressBar } from '@/components/ui/progress-bar';
import { FormError } from '@/components/ui/form-error';
import { SelectField, TextField } from '@/components/ui/field';
import { formatClock } from '@shared/datetime';
import type { MarkMatchingResult } from '@shared/schemas/imports';
import { clockOffsetFromAlignment } from '@shared/core/mark-matching';
import { probeKeys, siteKeys, surveyKeys } from '@/lib/query-keys';

/**
 * Upload of one log: the plan its rows were taken on (the log's plan column by default), the
 * transfer's progress (XHR upload events), then the server's processing (polling the import),
 * then the outcome: readings refreshed, or the file's problems as a table. The site's plans come
 * from the plans feature, handed down by the page that composes both.
 */
export function LogUpload({ surveyId, plans, timeZone }: { surveyId: number; plans: UseQueryResult<PlanListResponse>; timeZone?: string }) {
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [transfer, setTransfer] = useState(0);
  const [importId, setImportId] = useState<number | null>(null);
  const [planId, setPlanId] = useState<number | null>(null);
  const [windowS, setWindowS] = useState('20');
  const [offsetS, setOffsetS] = useState('0');
  const [timingProblem, setTimingProblem] = useState<string | null>(null);
  const planCount = plans.data?.items.length ?? 0;
  const upload = useUploadLog();
  const imp = useImport(importId);
  const qc = useQueryClient();
  const status = imp.data?.status;

  useEffect(() => {
    if (status === 'done' || status === 'failed') {
      // Accepted: new readings change the survey's readings, map and verdicts; refused: only its import list.
      void qc.invalidateQueries({ queryKey: surveyKeys.detail(surveyId), exact: status !== 'done' });
      if (status === 'done') void Promise.all([qc.invalidateQueries({ queryKey: surveyKeys.lists() }), qc.invalidateQueries({ queryKey: siteKeys.overview() }), qc.invalidateQueries({ queryKey: probeKeys.details() })]);
    }
  }, [status, surveyId, qc]);

  const start = () => {
    if (!file) return;
    const matchWindowS = windowS.trim() === '' ? null : Number(windowS.replace(',', '.'));
    const clockOffsetS = offsetS.trim() === '' ? null : Number(offsetS.replace(',', '.'));
    if (matchWindowS !== null && !(Number.isFinite(matchWindowS) && matchWindowS >= 0 && matchWindowS <= 600)) { setTimingProblem('Window: a number of seconds from 0 to 600'); return; }
    if (clockOffsetS !== null && !(Number.isFinite(clockOffsetS) && Math.abs(clockOffsetS) <= 86_400)) { setTimingProblem('Clock offset: a number of seconds within ±86400 (one day)'); return; }
    setTimingProblem(null);
    setImportId(null);
    setTransfer(0);
    upload.mutate({ surveyId, file, planId, matchWindowS, clockOffsetS, onProgress: (p) => setTransfer(p.fraction) }, { onSuccess: (r) => { setTransfer(1); setImportId(r.importId); } });
  };

  return (
    <div className="flex flex-col gap-4">
      <SelectField
        label="Plan of the readings" className="max-w-sm" value={planId ?? ''} onChange={(e) => setPlanId(e.target.value ? Number(e.target.value) : null)}
        disabled={plans.isPending || plans.isError}
        hint={plans.isError ? 'The site\'s plans could not be loaded; the log\'s plan column decides.'
          : planId !== null ? 'For rows whose plan column is empty.'
          : planCount === 1 ? 'Positioned rows with no plan go on the site\'s only plan.'
          : planCount === 0 ? 'This site has no plans yet: positions cannot be placed.'
          : 'Rows with a position but no plan are kept but not placed on any plan.'}
      >
        <option value="">{plans.isPending ? 'Loading plans…' : 'From the log\'s plan column'}</option>
        {plans.data?.items.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
      </SelectField>
      <fieldset className="flex flex-wrap items-end gap-3">
        <legend className="mb-1 text-sm font-medium text-ink-800">Bursts without a place go to the marks taken with the field view ("measured here now"), nearest in time</legend>
        <TextField label="Window (± s)" className="w-32" inputMode="decimal" value={windowS} onChange={(e) => setWindowS(e.target.value)} />
        <TextField label="Clock offset (s)" className="w-36" inputMode="decimal" value={offsetS} onChange={(e) => setOffsetS(e.target.value)}
          hint="Added to the meter's times: a meter 90 s slow needs +90." />
      </fieldset>
      <OffsetFromOneMark onOffset={(s) => setOffsetS(String(s))} />
      {timingProblem && <p role="alert" className="text-sm font-medium text-short-700">{timingProblem}</p>}
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="log-file" className="mb-1 block text-sm font-medium text-ink-800">Meter log (CSV)</label>
          <input
            id="log-file" ref={input} type="file" accept=".csv,.txt,text/csv"
            className="block text-sm file:mr-3 file:rounded-lg file:border-0 file:bg-ink-100 file:px-3 file:py-2 file:text-sm file:font-medium hover:file:bg-ink-200"
            onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          />
        </div>
        <Button onClick={start} disabled={!file} busy={upload.isPending}><Upload className="h-4 w-4" aria-hidden />Upload log</Button>
        <a className="text-sm text-ink-600 underline underline-offset-2" href="/samples/library-walk.csv" download>Sample log</a>
      </div>
      {(upload.isPending || importId !== null) && (
        <div className="grid gap-3 sm:grid-cols-2">
          <ProgressBar label="Transfer" value={transfer} tone={transfer >= 1 ? 'good' : 'lamp'} />
          <ProgressBar
            label={status === 'done' ? 'Processing: done' : status === 'failed' ? 'Processing: rejected' : status === 'running' ? 'Processing' : 'Processing: waiting'}
            value={imp.data ? imp.data.progress : 0}
            tone={status === 'done' ? 'good' : status === 'failed' ? 'bad' : 'lamp'}
          />
        </div>
      )}
      <FormError error={upload.error ?? imp.error} />
      {imp.data && status === 'done' && (
        <p role="status" className="flex items-center gap-2 text-sm text-meets-700">
          <CheckCircle2 className="h-4 w-4" aria-hidden />
          {imp.data.filename}: {imp.data.rowsRead.toLocaleString('en-GB')} rows read, {imp.data.readings.toLocaleString('en-GB')} readings added.
        </p>
      )}
      {imp.data?.placement && status === 'done' && (
        <p className="text-sm text-ink-700" data-testid="import-placement">
          Placed by their coordinates: {imp.data.placement.byCoordinates.toLocaleString('en-GB')}; by a planned point's label: {imp.data.placement.byLabel.toLocaleString('en-GB')}; without a place: {imp.data.placement.none.toLocaleString('en-GB')}.
        </p>
      )}
      {imp.data?.markMatching && status === 'done' && <PlacedByTime result={imp.data.markMatching} timeZone={timeZone} />}
      {imp.data && <ImportWarningsList warnings={imp.data.warnings} />}
      {imp.data && status === 'failed' && <ImportErrorsTable errors={imp.data.errors} filename={imp.data.filename} />}
    </div>
  );
}

const signed = (s: number) => `${s >= 0 ? '+' : '−'}${Math.abs(s).toFixed(1)} s`;

/** Which bursts went to which mark, which stayed unplaced and why, and the marks no burst reached. */
function PlacedByTime({ result, timeZone }: { result: MarkMatchingResult; timeZone?: string }) {
  const at = (iso: string) => formatClock(iso, timeZone, { seconds: true });
  return (
    <section data-testid="placed-by-time" aria-label="Bursts placed by time" className="flex flex-col gap-3 rounded-lg bg-ink-50 p-3 text-sm text-ink-900">
      <p className="font-semibold">
        {result.matched.length} burst{result.matched.length === 1 ? '' : 's'} placed by time on marks (window ±{result.windowS} s, clock offset {signed(result.clockOffsetS)}); {result.unplaced.length} left without a place; {result.marksWithoutBurst.length} mark{result.marksWithoutBurst.length === 1 ? '' : 's'} without a burst.
      </p>
      {result.matched.length > 0 && (
        <div className="scroll-x">
          <table className="min-w-full text-left">
            <caption className="sr-only">Bursts placed on marks</caption>
            <thead><tr><th className="pr-3">Point</th><th className="pr-3">Mark</th><th className="pr-3">Burst (meter + offset)</th><th className="pr-3">Apart</th><th>Probe</th></tr></thead>
            <tbody>
              {result.matched.map((m) => (
                <tr key={m.readingId}><td className="pr-3 font-medium">{m.point}</td><td className="pr-3 tabular-nums">{at(m.markAt)}</td><td className="pr-3 tabular-nums">{at(new Date(Date.parse(m.burstAt) + result.clockOffsetS * 1000).toISOString())}</td><td className="pr-3 tabular-nums">{signed(m.deltaS)}</td><td>{m.probe}</td></tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {result.unplaced.length > 0 && (
        <div>
          <h4 className="font-semibold">Unplaced bursts (place them by hand under "Readings without a place")</h4>
          <ul className="list-disc pl-5">
            {result.unplaced.map((u) => <li key={u.readingId}>{u.probe} at {at(u.burstAt)} (meter clock): {u.message}{u.markPoints.length ? ` (${u.markPoints.join(', ')})` : ''}</li>)}
          </ul>
        </div>
      )}
      {result.marksWithoutBurst.length > 0 && (
        <div>
          <h4 className="font-semibold">Marks without a burst</h4>
          <ul className="list-disc pl-5">{result.marksWithoutBurst.map((m) => <li key={m.markId}>{m.point} at {at(m.markAt)}{m.probe ? ` (${m.probe})` : ''}</li>)}</ul>
        </div>
      )}
    </section>
  );
}

/** Seconds since midnight of an "HH:MM:SS" time input, or null. */
function secondsOfDay(v: string): number | null {
  const m = /^(\d{1,2}):(\d{2})(?::(\d{2}))?$/.exec(v);
  return m ? Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3] ?? 0) : null;
}

/**
 * Finding the clock offset by aligning one known mark: the time the field view recorded for a mark
 * and the meter's own time of the burst taken there (both read as clock times of the same day).
 */
function OffsetFromOneMark({ onOffset }: { onOffset: (seconds: number) => void }) {
  const [markAt, setMarkAt] = useState('');
  const [burstAt, setBurstAt] = useState('');
  const mark = secondsOfDay(markAt);
  const burst = secondsOfDay(burstAt);
  // Across midnight the nearer of the two days is meant: keep the offset within ±12 h.
  const raw = mark !== null && burst !== null ? clockOffsetFromAlignment(mark, burst) : null;
  const offset = raw === null ? null : ((raw + 43_200) % 86_400 + 86_400) % 86_400 - 43_200;
  return (
    <details className="text-sm text-ink-800">
      <summary className="cursor-pointer font-medium">Find the offset from one mark</summary>
      <div className="mt-2 flex flex-wrap items-end gap-3">
        <TextField label="Mark's time (field view)" type="time" step={1} className="w-44" value={markAt} onChange={(e) => setMarkAt(e.target.value)} />
        <TextField label="Meter's time of that burst" type="time" step={1} className="w-44" value={burstAt} onChange={(e) => setBurstAt(e.target.value)} />
        <Button variant="secondary" disabled={offset === null} onClick={() => offset !== null && onOffset(offset)}>
          {offset === null ? 'Use this offset' : `Use ${offset >= 0 ? '+' : ''}${offset} s`}
        </Button>
      </div>
    </details>
  );
}

import { useState } from 'react';
import { FileUp } from 'lucide-react';
import { BENCH_COLUMNS, BENCH_MAX_BYTES, type BenchRowError, type BenchRunDetailDto } from '@shared/schemas/bench-runs';
import { ApiRequestError, type UploadProgress } from '@/lib/api-client';
import { TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { ProgressBar } from '@/components/ui/progress-bar';
import { useUploadBenchRun } from '../api/upload-bench-run';

/** The row-level problems the server found; nothing was stored. */
function RowErrors({ errors, total }: { errors: BenchRowError[]; total: number }) {
  return (
    <div role="alert" className="rounded-lg bg-short-50 p-3 ring-1 ring-inset ring-short-100">
      <p className="text-sm font-semibold text-short-700">The file was not stored: {total} problem{total === 1 ? '' : 's'}{errors.length < total ? ` (first ${errors.length} shown)` : ''}.</p>
      <div className="mt-2 max-h-72 overflow-auto">
        <table className="min-w-full text-sm">
          <thead className="text-left text-xs uppercase text-short-700"><tr><th scope="col" className="pr-3">Line</th><th scope="col" className="pr-3">Column</th><th scope="col" className="pr-3">Value</th><th scope="col">Problem</th></tr></thead>
          <tbody className="text-ink-800">
            {errors.map((e, i) => (
              <tr key={i} className="border-t border-short-100"><td className="num pr-3">{e.line ?? '–'}</td><td className="pr-3">{e.column ?? '–'}</td><td className="pr-3 font-mono text-xs">{e.value === null ? '–' : e.value === '' ? '(empty)' : e.value}</td><td>{e.message}</td></tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** Upload a bench CSV for a counting probe; the server fits it per gain code with the measurement core. */
export function BenchUploadForm({ probeId, defaults, onUploaded }: { probeId: number; defaults: { tRefMs: number; alphaPerK: number; tCalC: number }; onUploaded: (r: BenchRunDetailDto) => void }) {
  const upload = useUploadBenchRun();
  const [file, setFile] = useState<File | null>(null);
  const [fields, setFields] = useState({ tRefMs: String(defaults.tRefMs), referenceURel: '0.01', alphaPerK: String(defaults.alphaPerK), tCalC: String(defaults.tCalC) });
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [localError, setLocalError] = useState<string | null>(null);
  const err = upload.error;
  const rowErrors = err instanceof ApiRequestError && err.status === 422 ? (err.details as { errors: BenchRowError[]; errorCount: number } | undefined) : undefined;

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    if (!file) { setLocalError('Choose the bench CSV file'); return; }
    if (file.size > BENCH_MAX_BYTES) { setLocalError(`The file is larger than ${BENCH_MAX_BYTES / 1024 / 1024} MB`); return; }
    setLocalError(null);
    upload.mutate({ probeId, file, fields, onProgress: setProgress }, { onSuccess: onUploaded, onSettled: () => setProgress(null) });
  };
  const field = (key: keyof typeof fields, label: string, hint?: string) => (
    <TextField label={label} type="number" step="any" hint={hint} value={fields[key]} onChange={(e) => setFields((f) => ({ ...f, [key]: e.target.value }))} />
  );
  return (
    <form noValidate aria-label="Upload a bench run" className="space-y-4" onSubmit={submit}>
      <div>
        <label htmlFor="bench-file" className="mb-1 block text-sm font-medium text-ink-800">Bench CSV</label>
        <input id="bench-file" type="file" accept=".csv,text/csv" onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          className="block w-full text-sm file:mr-3 file:rounded-lg file:border-0 file:bg-ink-100 file:px-3 file:py-2 file:text-sm file:font-medium hover:file:bg-ink-200" />
        <p className="mt-1 text-xs text-ink-500">Header row with {BENCH_COLUMNS.join(', ')} (temp_c may be empty); one row per reading, three or more per gain code. <a className="underline" href="/samples/bench-run-sample.csv" download>Sample file</a></p>
      </div>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        {field('tRefMs', 'Reference integration time (ms)', 'Counts are normalised to it')}
        {field('referenceURel', 'Reference meter u rel (fraction)', 'Its certificate value ÷ its k')}
        {field('alphaPerK', 'Temperature coefficient α (1/K)')}
        {field('tCalC', 'Calibration temperature (°C)')}
      </div>
      {progress && <ProgressBar value={progress.fraction} label="Uploading" />}
      {localError && <p role="alert" className="text-sm text-short-700">{localError}</p>}
      {rowErrors ? <RowErrors errors={rowErrors.errors} total={rowErrors.errorCount} /> : <FormError error={err} />}
      <Button type="submit" busy={upload.isPending}><FileUp className="h-4 w-4" aria-hidden />Upload and fit</Button>
    </form>
  );
}

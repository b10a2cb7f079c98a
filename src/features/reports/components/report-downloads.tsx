import { useEffect, useRef, useState } from 'react';
import { FileDown, FileSpreadsheet } from 'lucide-react';
import { useUnits } from '@/lib/units';
import { Button } from '@/components/ui/button';
import { ProgressBar } from '@/components/ui/progress-bar';
import { FormError } from '@/components/ui/form-error';
import { useReportJob, useStartReportJob } from '../api/report-job';
import { apiFiles } from '@shared/paths';

const LINK = 'inline-flex items-center gap-2 rounded-lg bg-white px-3 py-2 text-sm font-medium text-ink-900 ring-1 ring-inset ring-ink-200 hover:bg-ink-50 focus-visible:outline-2 focus-visible:outline-lamp-500';

/**
 * The PDF report (in the unit on screen), built on the server as a job with progress (a large
 * survey takes seconds) and downloaded when done, and the CSV exports.
 */
export function ReportDownloads({ surveyId }: { surveyId: number }) {
  const { unit } = useUnits();
  const start = useStartReportJob();
  const [jobId, setJobId] = useState<string | null>(null);
  const job = useReportJob(jobId);
  const downloaded = useRef<string | null>(null);
  const state = job.data;
  const unitName = unit === 'fc' ? 'foot-candles' : 'lux';

  // Download once when the job finishes.
  useEffect(() => {
    if (state?.status !== 'done' || downloaded.current === state.id) return;
    downloaded.current = state.id;
    const a = document.createElement('a');
    a.href = apiFiles.reportJobFile(state.id);
    a.download = state.filename;
    document.body.append(a);
    a.click();
    a.remove();
  }, [state]);

  const running = start.isPending || state?.status === 'running';
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" busy={running} disabled={running}
          onClick={() => start.mutate({ surveyId, unit }, { onSuccess: (j) => setJobId(j.id) })}>
          <FileDown className="h-4 w-4" aria-hidden />Report (PDF, {unitName})
        </Button>
        <a className={LINK} href={apiFiles.surveyZonesCsv(surveyId)} download><FileSpreadsheet className="h-4 w-4" aria-hidden />Zone table (CSV)</a>
        <a className={LINK} href={apiFiles.surveyVerdictReadingsCsv(surveyId)} download><FileSpreadsheet className="h-4 w-4" aria-hidden />Readings (CSV)</a>
      </div>
      <div aria-live="polite" className="max-w-md">
        {running && <ProgressBar value={state?.progress ?? null} label="Building the report" />}
        {state?.status === 'done' && (
          <p className="text-sm text-ink-600">
            Report ready ({Math.max(1, Math.round((state.size ?? 0) / 1024)).toLocaleString('en-GB')} KiB). If the download did not start,{' '}
            <a className="font-medium text-lamp-700 underline" href={apiFiles.reportJobFile(state.id)} download={state.filename}>download it here</a>.
          </p>
        )}
        {state?.status === 'failed' && <FormError error={new Error(state.error ?? 'The report could not be built.')} />}
        <FormError error={start.error ?? job.error} />
      </div>
    </div>
  );
}

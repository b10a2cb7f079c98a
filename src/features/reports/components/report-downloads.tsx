import { FileDown, FileSpreadsheet } from 'lucide-react';
import { useUnits } from '@/lib/units';
import { reportLinks } from '../api/report-links';

const LINK = 'inline-flex items-center gap-2 rounded-lg bg-white px-3 py-2 text-sm font-medium text-ink-900 ring-1 ring-inset ring-ink-200 hover:bg-ink-50 focus-visible:outline-2 focus-visible:outline-lamp-500';

/** The PDF report (in the unit on screen) and the CSV exports. */
export function ReportDownloads({ surveyId }: { surveyId: number }) {
  const { unit } = useUnits();
  const links = reportLinks(surveyId, unit);
  return (
    <div className="flex flex-wrap gap-2">
      <a className={LINK} href={links.pdf} download><FileDown className="h-4 w-4" aria-hidden />Report (PDF, {unit === 'fc' ? 'foot-candles' : 'lux'})</a>
      <a className={LINK} href={links.zonesCsv} download><FileSpreadsheet className="h-4 w-4" aria-hidden />Zone table (CSV)</a>
      <a className={LINK} href={links.readingsCsv} download><FileSpreadsheet className="h-4 w-4" aria-hidden />Readings (CSV)</a>
    </div>
  );
}

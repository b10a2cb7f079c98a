import { Link } from 'react-router';
import { formatCalendarDay } from '@shared/datetime';
import { Building2, ChevronRight } from 'lucide-react';
import type { SiteOverview } from '@shared/schemas/compliance';
import { SURVEY_STATUS_LABELS } from '@shared/schemas/surveys';
import { Badge } from '@/components/ui/badge';
import { VerdictBadge } from './verdict-badge';
import { paths } from '@shared/paths';

/** Each site with its latest survey and how many zones meet, fall short, are inconclusive or not assessed (always all four). */
export function SitesOverviewList({ sites }: { sites: SiteOverview[] }) {
  return (
    <ul className="grid gap-4 lg:grid-cols-2" aria-label="Sites">
      {sites.map((s) => (
        <li key={s.siteId} className="rounded-xl bg-white p-5 shadow-card ring-1 ring-ink-100">
          <div className="flex items-start gap-3">
            <span className="rounded-lg bg-lamp-50 p-2.5 text-lamp-700"><Building2 className="h-5 w-5" aria-hidden /></span>
            <div className="min-w-0 flex-1">
              <h2 className="font-semibold text-ink-900">{s.name}</h2>
              {s.address && <p className="text-sm text-ink-500">{s.address}</p>}
            </div>
          </div>
          {s.latestSurvey && s.counts ? (
            <Link to={paths.surveyCompliance.to(s.latestSurvey.id)} className="group mt-4 block rounded-lg p-3 ring-1 ring-ink-100 transition hover:bg-ink-50 hover:ring-lamp-300 focus-visible:outline-2 focus-visible:outline-lamp-500">
              <span className="flex items-center justify-between gap-2 text-sm">
                <span className="min-w-0">
                  <span className="block font-medium text-ink-900">{s.latestSurvey.name}</span>
                  <span className="block text-xs text-ink-500">{s.latestSurvey.startedOn ? formatCalendarDay(s.latestSurvey.startedOn) : 'No date'} · {SURVEY_STATUS_LABELS[s.latestSurvey.status]}</span>
                </span>
                <ChevronRight className="h-4 w-4 shrink-0 text-ink-300 group-hover:text-lamp-600" aria-hidden />
              </span>
              <span className="mt-3 flex flex-wrap gap-2" aria-label="Zones by verdict">
                <CountBadge n={s.counts.meets} verdict="meets" />
                <CountBadge n={s.counts.falls_short} verdict="falls_short" />
                <CountBadge n={s.counts.inconclusive} verdict="inconclusive" />
                <CountBadge n={s.counts.not_assessed} verdict="not_assessed" />
              </span>
            </Link>
          ) : (
            <p className="mt-4"><Badge>No survey yet</Badge></p>
          )}
        </li>
      ))}
    </ul>
  );
}

function CountBadge({ n, verdict }: { n: number; verdict: 'meets' | 'falls_short' | 'inconclusive' | 'not_assessed' }) {
  return <span className="inline-flex items-center gap-1.5 text-sm"><span className="num font-semibold text-ink-900">{n}</span><VerdictBadge verdict={verdict} /></span>;
}

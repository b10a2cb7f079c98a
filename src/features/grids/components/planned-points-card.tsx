import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { Download, FileText, MapPin } from 'lucide-react';
import { apiFiles, paths } from '@shared/paths';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { QueryState } from '@/components/ui/states';
import { usePlannedPoints } from '../api/get-planned-points';
import type { PlannedPoint } from '@shared/schemas/planned-points';

const LINK = 'inline-flex items-center gap-2 rounded-lg bg-white px-2.5 py-1.5 text-sm font-medium ring-1 ring-inset ring-ink-200 hover:bg-ink-50';

/** The survey page's view of its planned points: per plan how many have a reading, which do not, and the downloads. */
export function PlannedPointsCard({ surveyId, plans }: { surveyId: number; plans: readonly { id: number; name: string }[] }) {
  const query = usePlannedPoints(surveyId);
  return (
    <Card data-testid="planned-points-card">
      <CardHeader
        title="Planned points"
        description="The measurement grid of each zone (EN 12464-1), planned on the survey map."
        // The walk sheet and CSV exist once points are planned (409 before).
        actions={(query.data?.items.length ?? 0) > 0 && <>
          <a className={LINK} href={apiFiles.walkSheetPdf(surveyId)} download data-testid="walk-sheet-link"><FileText className="h-4 w-4" aria-hidden />Walk sheet (PDF)</a>
          <a className={LINK} href={apiFiles.plannedPointsCsv(surveyId)} download><Download className="h-4 w-4" aria-hidden />CSV</a>
        </>}
      />
      <CardBody>
        <QueryState query={query} isEmpty={(d) => d.items.length === 0}
          empty={<p className="text-sm text-ink-600">No points planned yet. Open a plan on the survey map to generate its grids{plans[0] ? <>: <Link className="font-medium underline" to={paths.surveyMap.to(surveyId, plans[0].id)}>{plans[0].name}</Link></> : ''}.</p>}>
          {(d) => (
            <ul className="space-y-3">
              {plans.map((plan) => {
                const pts = d.items.filter((p) => p.planId === plan.id);
                if (pts.length === 0) return null;
                return (
                  <li key={plan.id} className="text-sm">
                    <PlanVisits points={pts} title={<Link className="font-medium underline" to={paths.surveyMap.to(surveyId, plan.id)}>{plan.name}</Link>} />
                  </li>
                );
              })}
              {d.grids.filter((g) => g.changed || g.layout === 'centreline').map((g) => (
                <li key={g.id} className="text-sm text-ink-700">{g.zoneName}: {g.layout === 'centreline' ? 'centreline row' : 'changed grid'}{g.reason ? ` (${g.reason})` : g.changed ? ' without a reason yet' : ''}.</li>
              ))}
            </ul>
          )}
        </QueryState>
      </CardBody>
    </Card>
  );
}

/** One plan's planned points: how many have a reading, and the labels of those that have none. */
export function PlanVisits({ points, title }: { points: readonly PlannedPoint[]; title?: ReactNode }) {
  const missing = points.filter((p) => p.readingCount === 0);
  return (
    <div data-testid="plan-visits">
      <div className="flex flex-wrap items-center gap-2">
        <MapPin className="h-4 w-4 text-ink-500" aria-hidden />
        {title}
        <span className="text-ink-700">{points.length - missing.length} of {points.length} planned point(s) have a reading</span>
      </div>
      {missing.length > 0 && (
        <p className="mt-1 break-words text-ink-600">Not visited: {missing.slice(0, 40).map((p) => p.label).join(', ')}{missing.length > 40 ? ` and ${missing.length - 40} more` : ''}.</p>
      )}
    </div>
  );
}

import { useCallback } from 'react';
import { Link, useParams, useSearchParams } from 'react-router';
import { useSurveyMap } from '@/features/plans/api/get-survey-map';
import { useSitePlans } from '@/features/plans/api/get-site-plans';
import { useZones } from '@/features/plans/api/get-zones';
import { useSurveys } from '@/features/surveys/api/get-surveys';
import { SurveyMapView } from '@/components/plan-map/survey-map-view';
import { Page, PageHeader } from '@/components/ui/page';
import { SelectField } from '@/components/ui/field';
import { EmptyState, QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

/** A survey's readings on one of its site's plans, optionally as the change since another survey. */
export function SurveyMapRoute() {
  const surveyId = Number(useParams().surveyId);
  const [params, setParams] = useSearchParams();
  const planParam = Number(params.get('planId')) || undefined;
  const compareId = Number(params.get('compare')) || undefined;
  const map = useSurveyMap(surveyId, planParam);
  const planId = map.data?.planId;
  const plans = useSitePlans(map.data?.siteId);
  const zones = useZones(planId);
  const surveys = useSurveys(map.data?.siteId, { enabled: map.data?.siteId !== undefined });
  const compare = useSurveyMap(compareId, planId);
  const set = (k: string, v: string) => { const next = new URLSearchParams(params); if (v) next.set(k, v); else next.delete(k); setParams(next, { replace: true }); };
  const onPainted = useCallback((ms: number) => { document.querySelector('[data-testid="survey-map"]')?.setAttribute('data-painted-ms', ms.toFixed(1)); }, []);

  return (
    <Page>
      <QueryState query={map} loadingLabel="Loading the readings…">
        {(m) => {
          const plan = plans.data?.items.find((p) => p.id === m.planId);
          return (
            <>
              <PageHeader eyebrow={plan ? <Link to={paths.plan.to(plan.id)} className="hover:underline">Plan {plan.name}</Link> : 'Survey map'} title={m.surveyName}
                description={compareId ? 'Each point where it was measured, coloured by its change since the survey compared with; zones shaded by their average.' : 'Each point where it was measured, coloured by illuminance; zones shaded by their average.'} />
              <div className="mb-4 grid gap-3 sm:grid-cols-2 lg:max-w-3xl">
                <SelectField label="Plan" value={m.planId} onChange={(e) => set('planId', e.target.value)}>
                  {(plans.data?.items ?? []).map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
                </SelectField>
                <SelectField label="Compare with" value={compareId ?? ''} onChange={(e) => set('compare', e.target.value)} hint="Shows the lux change per point, matched by point label.">
                  <option value="">No comparison</option>
                  {(surveys.data?.items ?? []).filter((s) => s.id !== surveyId).map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
                </SelectField>
              </div>
              {m.notice && <p role="status" className="mb-3 rounded-lg bg-lamp-50 p-3 text-sm text-lamp-900 ring-1 ring-lamp-200">{m.notice}</p>}
              {compareId && compare.isError && <p role="alert" className="mb-3 text-sm text-short-700">The comparison could not be loaded: {compare.error.message}</p>}
              {!plan || zones.isPending ? <QueryState query={zones}>{() => null}</QueryState>
                : m.readings.length === 0 && !m.notice ? <EmptyState title="No readings with a position on this plan">Import the survey's log, or choose another plan.</EmptyState>
                  : <SurveyMapView plan={plan} zones={zones.data?.items ?? []} map={m} compareWith={compareId ? compare.data ?? null : null} onPainted={onPainted} />}
            </>
          );
        }}
      </QueryState>
    </Page>
  );
}

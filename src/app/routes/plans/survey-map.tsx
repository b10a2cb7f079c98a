import { useCallback, useState } from 'react';
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
import { FormError } from '@/components/ui/form-error';
import { useSurvey } from '@/features/surveys/api/get-survey';
import { usePlannedPoints } from '@/features/grids/api/get-planned-points';
import { useMovePlannedPoint } from '@/features/grids/api/edit-planned-points';
import { usePlaceReading } from '@/features/grids/api/place-reading';
import { PlannedPointsLayer, ReadingDropTarget } from '@/features/grids/components/planned-points-layer';
import { GridPanel } from '@/features/grids/components/grid-panel';
import { UnplacedPanel } from '@/features/grids/components/unplaced-panel';
import type { PlannedPoint } from '@shared/schemas/planned-points';

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
  const survey = useSurvey(surveyId);
  const planned = usePlannedPoints(surveyId, planId);
  const editable = survey.data?.abilities.edit ?? false;
  const [selected, setSelected] = useState<PlannedPoint | null>(null);
  const [reason, setReason] = useState('');
  const move = useMovePlannedPoint();
  const place = usePlaceReading();
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
              {m.readings.length === 0 && !m.notice && (planned.data?.items.length ?? 0) === 0 && !editable
                && <EmptyState title="No readings with a position on this plan">Import the survey's log, or choose another plan.</EmptyState>}
              {!plan || zones.isPending ? <QueryState query={zones}>{() => null}</QueryState>
                : (m.readings.length > 0 || m.notice || (planned.data?.items.length ?? 0) > 0 || editable) && (
                  <SurveyMapView
                    plan={plan} zones={zones.data?.items ?? []} map={m} compareWith={compareId ? compare.data ?? null : null} onPainted={onPainted}
                    extraLayers={(
                      <>
                        {planned.data && (
                          <PlannedPointsLayer
                            points={planned.data.items} draggable={editable} selectedId={selected?.id ?? null} onSelect={setSelected}
                            onMove={(p, [x, y]) => move.mutate({ surveyId, pointId: p.id, xM: x, yM: y, reason: reason.trim() || undefined })}
                          />
                        )}
                        {editable && <ReadingDropTarget onDrop={(readingId, [x, y]) => place.mutate({ surveyId, readingId, body: { planId: m.planId, xM: x, yM: y } })} />}
                      </>
                    )}
                  />
                )}
              {plan && (
                <div className="mt-4 grid gap-4 lg:grid-cols-2">
                  {move.isError && <div className="lg:col-span-2"><FormError error={move.error} /></div>}
                  <QueryState query={planned} loadingLabel="Loading the planned points…">
                    {(pp) => (
                      <GridPanel surveyId={surveyId} planId={m.planId} zones={zones.data?.items ?? []} data={pp} editable={editable}
                        selected={selected} onSelect={setSelected} reason={reason} onReason={setReason} />
                    )}
                  </QueryState>
                  <UnplacedPanel surveyId={surveyId} plans={[plan]} timeZone={survey.data?.siteTimeZone ?? 'UTC'} plannedPoints={planned.data?.items ?? []} editable={editable}
                    placeError={place.error} />
                </div>
              )}
            </>
          );
        }}
      </QueryState>
    </Page>
  );
}

import { useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import { PenLine, Plus, Trash2 } from 'lucide-react';
import { can } from '@shared/policy';
import type { Zone } from '@shared/schemas/zones';
import type { PlanPoint } from '@shared/spatial/polygon';
import { useCurrentUser } from '@/app/current-user';
import { usePlan } from '@/features/plans/api/get-plan';
import { useZones } from '@/features/plans/api/get-zones';
import { useDeletePlan } from '@/features/plans/api/delete-plan';
import { useSurveys } from '@/features/surveys/api/get-surveys';
import { PlanEditorMap, type EditorMode } from '@/features/plans/components/plan-editor-map';
import { ScaleForm, type ScalePick } from '@/features/plans/components/scale-form';
import { PlanImageForm } from '@/features/plans/components/plan-image-form';
import { ZoneForm } from '@/features/plans/components/zone-form';
import { ZoneList } from '@/features/plans/components/zone-list';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { EmptyState, QueryState } from '@/components/ui/states';
import { FormError } from '@/components/ui/form-error';
import { paths } from '@shared/paths';
import { SelectField } from '@/components/ui/field';
import { useSurvey } from '@/features/surveys/api/get-survey';
import { usePlannedPoints } from '@/features/grids/api/get-planned-points';
import { usePlaceReading } from '@/features/grids/api/place-reading';
import { PlannedPointsLayer, ReadingDropTarget } from '@/features/grids/components/planned-points-layer';
import { PlanVisits } from '@/features/grids/components/planned-points-card';
import { UnplacedPanel } from '@/features/grids/components/unplaced-panel';

/**
 * One plan: set its scale, draw and edit its zones, open a survey on it, and see a survey's planned
 * points on it (visited or not) with the readings that still have no place.
 */
export function PlanDetailRoute() {
  const planId = Number(useParams().planId);
  const user = useCurrentUser();
  const canEdit = can(user.role, 'plans.write');
  const plan = usePlan(planId);
  const zones = useZones(planId);
  const surveys = useSurveys(plan.data?.siteId, { enabled: plan.data?.siteId !== undefined && can(user.role, 'surveys.read') });
  // The survey whose planned points are shown: ?survey= or the site's newest survey.
  const [params, setParams] = useSearchParams();
  const shownSurveyId = Number(params.get('survey')) || surveys.data?.items[0]?.id;
  const shownSurvey = useSurvey(shownSurveyId);
  const planned = usePlannedPoints(shownSurveyId, planId);
  const place = usePlaceReading();
  const placeable = shownSurvey.data?.abilities.edit ?? false;
  const chooseSurvey = (id: string) => { const next = new URLSearchParams(params); if (id) next.set('survey', id); else next.delete('survey'); setParams(next, { replace: true }); };
  const [mode, setMode] = useState<EditorMode>({ kind: 'view' });
  const [scalePick, setScalePick] = useState<ScalePick>({ active: false, points: [] });
  const [editing, setEditing] = useState<{ zone: Zone | null; corners: PlanPoint[] | null } | null>(null);
  const removePlan = useDeletePlan();
  const navigate = useNavigate();
  const deleteThisPlan = (siteId: number, name: string) => {
    if (!window.confirm(`Delete the plan "${name}"? Only a plan with no zones and no readings on it can be deleted.`)) return;
    removePlan.mutate({ planId, siteId }, { onSuccess: () => navigate(paths.plans.to(siteId)) });
  };

  const startZone = () => { setEditing({ zone: null, corners: null }); setMode({ kind: 'draw' }); };
  const editZone = (z: Zone) => { setEditing({ zone: z, corners: z.polygon }); setMode({ kind: 'edit', zoneId: z.id }); };
  const finish = () => { setEditing(null); setMode({ kind: 'view' }); };
  const onScalePick = (p: ScalePick) => { setScalePick(p); setMode(p.active ? { kind: 'scale' } : { kind: 'view' }); };

  return (
    <Page>
      <QueryState query={plan}>
        {(p) => (
          <>
            <PageHeader eyebrow={<Link to={paths.plans.to(p.siteId)} className="hover:underline">Plans</Link>} title={p.name}
              description={p.widthM && p.heightM ? `${Math.round(p.widthM * 10) / 10} × ${Math.round(p.heightM * 10) / 10} m · ${p.widthPx} × ${p.heightPx} px` : 'The scale is not set yet: set it before drawing zones.'}
              actions={canEdit && !editing ? (
                <Button variant="ghost" busy={removePlan.isPending} onClick={() => deleteThisPlan(p.siteId, p.name)}><Trash2 className="h-4 w-4" aria-hidden />Delete plan</Button>
              ) : undefined} />
            {removePlan.error && <div className="mb-4"><FormError error={removePlan.error} /></div>}
            <div className="grid gap-6 xl:grid-cols-[1fr_24rem]">
              <div className="min-w-0 space-y-2">
                <PlanEditorMap plan={p} zones={zones.data?.items ?? []} mode={mode} scalePick={scalePick} onScalePick={onScalePick}
                  onOutline={(corners) => setEditing((e) => ({ zone: e?.zone ?? null, corners }))} editingCorners={editing?.corners ?? null}>
                  {mode.kind === 'view' && planned.data && <PlannedPointsLayer points={planned.data.items} />}
                  {mode.kind === 'view' && placeable && shownSurveyId !== undefined && (
                    <ReadingDropTarget onDrop={(readingId, [x, y]) => place.mutate({ surveyId: shownSurveyId, readingId, body: { planId: p.id, xM: x, yM: y } })} />
                  )}
                </PlanEditorMap>
                <p className="text-xs text-ink-600" aria-live="polite">
                  {mode.kind === 'draw' ? 'Click the corners of the zone on the plan; click the first corner again to close it. Or type the corners in the form.'
                    : mode.kind === 'edit' ? 'Drag the corners to move them; drag a middle handle to add a corner. Save in the form.'
                      : mode.kind === 'scale' ? 'Click two points on the plan whose distance you know.' : 'Plan coordinates: metres from the lower-left corner, y upwards.'}
                </p>
              </div>
              <div className="space-y-6">
                {canEdit && (
                  <Card>
                    <CardHeader title="Scale" description="Type the plan's width, or click two points and give the distance between them." />
                    <CardBody><ScaleForm plan={p} pick={scalePick} onPickChange={onScalePick} /></CardBody>
                  </Card>
                )}
                <Card>
                  <CardHeader title="Zones" description="Rooms, task areas and outdoor areas. Readings belong to the smallest zone that contains them."
                    actions={canEdit && p.widthM && !editing ? <Button size="sm" onClick={startZone}><Plus className="h-4 w-4" aria-hidden />Add zone</Button> : undefined} />
                  <CardBody className="space-y-4">
                    {editing && p.widthM && p.heightM && (
                      <ZoneForm key={editing.zone?.id ?? 'new'} planId={p.id} extent={{ widthM: p.widthM, heightM: p.heightM }} zone={editing.zone} corners={editing.corners} onDone={finish} />
                    )}
                    <QueryState query={zones} isEmpty={(d) => d.items.length === 0}
                      empty={<EmptyState title="No zones yet" icon={<PenLine className="h-6 w-6" aria-hidden />}>{canEdit ? (p.widthM ? 'Add a zone and draw it on the plan.' : 'Set the scale, then draw zones.') : 'A surveyor draws the zones.'}</EmptyState>}>
                      {(d) => <ZoneList zones={d.items} canEdit={canEdit && !editing} onEdit={editZone} />}
                    </QueryState>
                  </CardBody>
                </Card>
                {canEdit && (
                  <Card>
                    <CardHeader title="Image" description="A revised drawing of the same floor replaces the image; zones and readings stay where they are in metres." />
                    <CardBody><PlanImageForm plan={p} /></CardBody>
                  </Card>
                )}
                {can(user.role, 'surveys.read') && shownSurveyId !== undefined && (
                  <Card data-testid="plan-planned-points">
                    <CardHeader title="Planned points" description="A survey's measurement grid on this plan: a filled dot has a reading, a ring has none yet." />
                    <CardBody className="space-y-3">
                      <SelectField label="Survey" value={shownSurveyId} onChange={(e) => chooseSurvey(e.target.value)}>
                        {(surveys.data?.items ?? []).map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
                      </SelectField>
                      <QueryState query={planned} loadingLabel="Loading the planned points…" isEmpty={(d) => d.items.length === 0}
                        empty={<p className="text-sm text-ink-600">No points planned on this plan for this survey. <Link className="font-medium underline" to={paths.surveyMap.to(shownSurveyId, p.id)}>Plan its grid on the survey map</Link>.</p>}>
                        {(d) => (
                          <div className="space-y-2 text-sm">
                            <PlanVisits points={d.items} />
                            <p><Link className="font-medium text-lamp-800 underline" to={paths.surveyMap.to(shownSurveyId, p.id)}>Edit the grid on the survey map</Link></p>
                          </div>
                        )}
                      </QueryState>
                    </CardBody>
                  </Card>
                )}
                {can(user.role, 'surveys.read') && shownSurveyId !== undefined && shownSurvey.data && (
                  <UnplacedPanel surveyId={shownSurveyId} plans={[p]} timeZone={shownSurvey.data.siteTimeZone} plannedPoints={planned.data?.items ?? []}
                    editable={placeable} droppable={mode.kind === 'view'} placeError={place.error} />
                )}
                {can(user.role, 'surveys.read') && (
                  <Card>
                    <CardHeader title="Surveys on this plan" description="Open a survey's readings on this plan." />
                    <CardBody>
                      <QueryState query={surveys} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No survey of this site yet" />}>
                        {(d) => (
                          <ul className="space-y-1 text-sm">
                            {d.items.map((s) => (
                              <li key={s.id}><Link className="font-medium text-lamp-800 underline-offset-2 hover:underline" to={paths.surveyMap.to(s.id, p.id)}>{s.name}</Link> <span className="text-xs text-ink-500">· {s.readingCount} readings</span></li>
                            ))}
                          </ul>
                        )}
                      </QueryState>
                    </CardBody>
                  </Card>
                )}
              </div>
            </div>
          </>
        )}
      </QueryState>
    </Page>
  );
}

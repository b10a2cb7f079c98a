import { useState } from 'react';
import { paths } from '@shared/paths';
import { Link, useParams } from 'react-router';
import { can } from '@shared/policy';
import type { PlanPoint } from '@shared/spatial/polygon';
import type { EmergencyElement } from '@shared/schemas/emergency';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';
import { usePlan } from '@/features/plans/api/get-plan';
import { useZones } from '@/features/plans/api/get-zones';
import { useElements } from '@/features/emergency/api/get-elements';
import { EmergencyMap, type DrawShape } from '@/features/emergency/components/emergency-map';
import { ElementForm } from '@/features/emergency/components/element-form';
import { ElementList } from '@/features/emergency/components/element-list';
import { EmergencyCaution } from '@/features/emergency/components/emergency-caution';
import { useCurrentUser } from '../../current-user';

/** Drawing escape routes, open and high-risk areas and safety equipment on one plan (plans feature + emergency feature). */
export function EmergencyPlanRoute() {
  const planId = Number(useParams().planId);
  const me = useCurrentUser();
  const plan = usePlan(planId);
  const zones = useZones(planId);
  const elements = useElements(planId);
  const [shape, setShape] = useState<DrawShape | null>(null);
  const [drawn, setDrawn] = useState<PlanPoint[] | null>(null);
  const [editing, setEditing] = useState<EmergencyElement | null>(null);
  const stopEditing = () => { setEditing(null); setDrawn(null); setShape(null); };
  const canEdit = can(me.role, 'plans.write');
  return (
    <Page>
      <QueryState query={plan}>
        {(p) => (
          <>
            <PageHeader eyebrow={<Link to={paths.emergency.to()} className="underline">Emergency lighting</Link>} title={`Routes and areas: ${p.name}`}
              description="Escape routes as centre lines with a width, open and high-risk areas as outlines, safety equipment as points. Planned points follow from the spacing." />
            <div className="space-y-6">
              <EmergencyCaution />
              {p.metresPerPixel === null && <p className="rounded-lg bg-unsure-50 px-3 py-2 text-sm text-unsure-800">This plan has no scale yet: set it on the plan's page first.</p>}
              <div className="grid gap-6 xl:grid-cols-[1fr_26rem]">
                <EmergencyMap plan={p} elements={elements.data?.items ?? []} draw={shape ? { shape, onDrawn: (pts) => { setDrawn(pts); setShape(null); } } : null} />
                {canEdit && p.metresPerPixel !== null && (
                  <Card>
                    <CardHeader title={editing ? `Edit ${editing.code}` : 'Add'} description={editing ? 'Change its figures, type its points again or redraw it on the plan. Its planned points follow.' : undefined} />
                    <CardBody>
                      <ElementForm key={editing?.id ?? 'new'} planId={planId} zones={zones.data?.items ?? []} drawn={drawn} drawing={shape !== null} onDrawRequest={setShape}
                        editing={editing} onCancel={stopEditing} onSaved={() => (editing ? stopEditing() : setDrawn(null))} />
                    </CardBody>
                  </Card>
                )}
              </div>
              <Card>
                <CardHeader title="On this plan" />
                <CardBody>
                  <QueryState query={elements} isEmpty={(d) => d.items.length === 0} empty={<p className="text-sm text-ink-500">Nothing drawn yet.</p>}>
                    {(d) => <ElementList elements={d.items} canEdit={canEdit} onEdit={p.metresPerPixel !== null ? (e) => { setEditing(e); setDrawn(null); setShape(null); } : undefined} />}
                  </QueryState>
                </CardBody>
              </Card>
            </div>
          </>
        )}
      </QueryState>
    </Page>
  );
}

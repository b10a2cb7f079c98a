import { useState } from 'react';
import { Link } from 'react-router';
import { paths } from '@shared/paths';
import { can } from '@shared/policy';
import type { CriteriaSetDto } from '@shared/schemas/emergency';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';
import { useCriteriaSets } from '@/features/emergency/api/get-criteria-sets';
import { useTestSchedule } from '@/features/emergency/api/get-test-schedule';
import { CriteriaSetEditor, checkFigure, checkTitle } from '@/features/emergency/components/criteria-set-editor';
import { ScheduleForm } from '@/features/emergency/components/schedule-form';
import { EmergencyCaution } from '@/features/emergency/components/emergency-caution';
import { useCurrentUser } from '../../current-user';

type Editing = { base: CriteriaSetDto; editKey: string | null };

/** The criteria sets (built in and the organisation's own, made from a base) and the test schedule. */
export function EmergencyCriteriaRoute() {
  const me = useCurrentUser();
  const sets = useCriteriaSets();
  const schedule = useTestSchedule();
  const [editing, setEditing] = useState<Editing | null>(null);
  const canEdit = can(me.role, 'organization.settings');
  return (
    <Page>
      <PageHeader eyebrow={<Link to={paths.emergency.to()} className="underline">Emergency lighting</Link>} title="Criteria sets and test schedule"
        description="What emergency surveys are judged against, and how often each site's tests fall due. Signed-off surveys keep the set they were signed off with." />
      <div className="space-y-6">
        <EmergencyCaution />
        {editing && (
          <Card>
            <CardHeader title={editing.editKey ? `Edit: ${editing.base.name}` : `New set based on ${editing.base.name}`}
              description="Change each figure, the pass it is judged in and its source; remove checks your policy does not use. Each value keeps its source beside it." />
            <CardBody><CriteriaSetEditor key={`${editing.base.key}-${editing.editKey ?? 'new'}`} base={editing.base} editKey={editing.editKey} onDone={() => setEditing(null)} /></CardBody>
          </Card>
        )}
        <Card>
          <CardHeader title="Criteria sets" description={canEdit ? 'Base a set of your own on any set, e.g. the reported 2024 draft of EN 1838 (1 lx over the whole central band).' : 'An administrator can add your organisation\'s own sets.'} />
          <CardBody>
            <QueryState query={sets} isEmpty={(d) => d.items.length === 0}>
              {(d) => (
                <ul className="divide-y divide-ink-100" aria-label="Criteria sets">
                  {d.items.map((s) => (
                    <li key={s.key} className="space-y-2 py-3">
                      <div className="flex flex-wrap items-start justify-between gap-2">
                        <div className="min-w-0">
                          <p className="font-medium text-ink-900">{s.name} {s.builtIn ? <Badge>Built in</Badge> : <Badge tone="good">Your organisation's</Badge>}</p>
                          <p className="text-xs text-ink-500">{s.source}</p>
                        </div>
                        {canEdit && (
                          <div className="flex flex-wrap gap-2">
                            <Button size="sm" variant="secondary" onClick={() => setEditing({ base: s, editKey: null })} aria-label={`Base a new set on ${s.name}`}>Base a new set on this</Button>
                            {!s.builtIn && <Button size="sm" onClick={() => setEditing({ base: s, editKey: s.key })} aria-label={`Edit ${s.name}`}>Edit</Button>}
                          </div>
                        )}
                      </div>
                      <details className="text-sm">
                        <summary className="cursor-pointer text-ink-700">{s.checks.length} checks</summary>
                        <ul className="mt-2 space-y-1">
                          {s.checks.map((c) => (
                            <li key={c.id} className="text-ink-700"><span className="font-medium">{checkTitle(c)}: {checkFigure(c)}</span> <span className="block text-xs text-ink-500">{c.source}</span></li>
                          ))}
                        </ul>
                      </details>
                    </li>
                  ))}
                </ul>
              )}
            </QueryState>
          </CardBody>
        </Card>
        <Card>
          <CardHeader title="Test schedule" description="How often each site's functional and full-duration tests fall due; reminders and the overview follow it." />
          <CardBody>
            <QueryState query={schedule}>{(sc) => <ScheduleForm schedule={sc} canEdit={canEdit} />}</QueryState>
          </CardBody>
        </Card>
      </div>
    </Page>
  );
}

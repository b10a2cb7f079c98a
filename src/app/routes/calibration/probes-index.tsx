import { Link } from 'react-router';
import { Plus } from 'lucide-react';
import { can } from '@shared/policy';
import { PROBE_KIND_LABELS, PROBE_STATUS_LABELS } from '@shared/schemas/probes';
import { useCurrentUser } from '@/app/current-user';
import { useProbes } from '@/features/calibration/api/get-probes';
import { CalibrationStateBadge } from '@/features/calibration/components/calibration-state-badge';
import { formatDueDate } from '@/features/calibration/components/format';
import { Page, PageHeader } from '@/components/ui/page';
import { Card } from '@/components/ui/card';
import { EmptyState, QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

export function ProbesIndexRoute() {
  const user = useCurrentUser();
  const probes = useProbes();
  return (
    <Page>
      <PageHeader eyebrow="Calibration" title="Probes"
        description={can(user.role, 'probes.read_all') ? 'Every probe of the organisation, in service or not.' : 'The probes in service that you may use.'}
        actions={can(user.role, 'probes.write') ? <Link to={paths.probeNew.to()} className="inline-flex items-center gap-2 rounded-lg bg-ink-900 px-4 py-2 text-sm font-medium text-white hover:bg-ink-800"><Plus className="h-4 w-4" aria-hidden />New probe</Link> : undefined} />
      <Card>
        <QueryState query={probes} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No probes yet" />}>
          {(d) => (
            <ul className="divide-y divide-ink-100">
              {d.items.map((p) => (
                <li key={p.id} className="flex flex-wrap items-center justify-between gap-3 px-5 py-3">
                  <div>
                    <Link to={paths.probe.to(p.id)} className="font-semibold text-ink-900 underline-offset-2 hover:underline">{p.serial}</Link>
                    <div className="text-sm text-ink-600">{p.description || PROBE_KIND_LABELS[p.kind]}</div>
                    <div className="text-xs text-ink-500">{PROBE_KIND_LABELS[p.kind]} · {PROBE_STATUS_LABELS[p.status]}{p.currentSet ? ` · due ${formatDueDate(p.currentSet.dueDate)}` : ''}</div>
                  </div>
                  <CalibrationStateBadge state={p.calibrationState} />
                </li>
              ))}
            </ul>
          )}
        </QueryState>
      </Card>
    </Page>
  );
}

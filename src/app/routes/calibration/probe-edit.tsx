import { Link, useNavigate, useParams } from 'react-router';
import { useProbe } from '@/features/calibration/api/get-probe';
import { useUpdateProbe } from '@/features/calibration/api/update-probe';
import { ProbeForm } from '@/features/calibration/components/probe-form';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody } from '@/components/ui/card';
import { QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

export function ProbeEditRoute() {
  const probeId = Number(useParams().probeId);
  const probe = useProbe(probeId);
  const update = useUpdateProbe();
  const navigate = useNavigate();
  return (
    <Page>
      <QueryState query={probe}>
        {(p) => (
          <>
            <PageHeader eyebrow={<Link to={paths.probe.to(p.id)} className="hover:underline">{p.serial}</Link>} title={`Edit ${p.serial}`}
              description="Every change is recorded in the audit trail with its before and after." />
            <Card><CardBody>
              {p.status === 'retired'
                ? <p className="text-sm text-ink-700">This probe is retired; a retired probe is not changed.</p>
                : <ProbeForm probe={p} submitLabel="Save changes" busy={update.isPending} error={update.error}
                    onSubmit={(v) => update.mutate({ id: p.id, ...v }, { onSuccess: () => navigate(paths.probe.to(p.id)) })} />}
            </CardBody></Card>
          </>
        )}
      </QueryState>
    </Page>
  );
}

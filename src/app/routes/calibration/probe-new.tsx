import { Link, useNavigate } from 'react-router';
import { useCreateProbe } from '@/features/calibration/api/create-probe';
import { ProbeForm } from '@/features/calibration/components/probe-form';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody } from '@/components/ui/card';
import { paths } from '@shared/paths';

export function ProbeNewRoute() {
  const create = useCreateProbe();
  const navigate = useNavigate();
  return (
    <Page>
      <PageHeader eyebrow={<Link to={paths.probes.to()} className="hover:underline">Probes</Link>} title="New probe" description="A counting probe needs its ADC limits and gain steps; a transmitter needs its range and stated accuracy." />
      <Card><CardBody>
        <ProbeForm submitLabel="Register probe" busy={create.isPending} error={create.error}
          onSubmit={(v) => create.mutate(v, { onSuccess: (p) => navigate(paths.probe.to(p.id)) })} />
      </CardBody></Card>
    </Page>
  );
}

import { useState } from 'react';
import { Plus } from 'lucide-react';
import { can } from '@shared/policy';
import { useCurrentUser } from '@/app/current-user';
import { useTargets } from '@/features/targets/api/get-targets';
import { TargetLibrary } from '@/features/targets/components/target-library';
import { TargetForm } from '@/features/targets/components/target-form';
import { Button } from '@/components/ui/button';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';

/** The target library: what each use type must reach, and where the figure comes from. */
export function TargetsRoute() {
  const user = useCurrentUser();
  const targets = useTargets();
  const [adding, setAdding] = useState(false);
  const canEdit = can(user.role, 'targets.write');
  return (
    <Page>
      <PageHeader eyebrow="Lighting targets" title="Target library"
        description="Maintained illuminance Em and minimum uniformity U0 per use type. Shipped entries keep their source and how sure we are of it; local codes and your own specifications take precedence."
        actions={canEdit && !adding ? <Button onClick={() => setAdding(true)}><Plus className="h-4 w-4" aria-hidden />Add an entry</Button> : undefined} />
      {adding && (
        <Card className="mb-6">
          <CardHeader title="New entry" description="For example a client's stricter specification. Zones with this use type are judged against it." />
          <CardBody><TargetForm onDone={() => setAdding(false)} /></CardBody>
        </Card>
      )}
      <Card>
        <QueryState query={targets} isEmpty={(d) => d.items.length === 0}>
          {(d) => <TargetLibrary items={d.items} canEdit={canEdit} />}
        </QueryState>
      </Card>
    </Page>
  );
}

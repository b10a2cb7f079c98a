import { useOrganization } from '@/features/compliance/api/get-organization';
import { DecisionRuleForm } from '@/features/compliance/components/decision-rule-form';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';

/** Organisation settings: the decision rule every verdict is printed with. */
export function SettingsRoute() {
  const org = useOrganization();
  return (
    <Page>
      <QueryState query={org}>
        {(o) => (
          <>
            <PageHeader eyebrow="Organisation" title={`${o.name}: settings`} />
            <Card className="max-w-3xl">
              <CardHeader title="How verdicts are decided" description="ILAC-G8:2019 decision rules: take the measurement as it is, or keep a guard band of the expanded uncertainty U." />
              <CardBody><DecisionRuleForm organization={o} /></CardBody>
            </Card>
          </>
        )}
      </QueryState>
    </Page>
  );
}

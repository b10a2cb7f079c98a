import { useSearchParams } from 'react-router';
import { Map as MapIcon } from 'lucide-react';
import { can } from '@shared/policy';
import { useCurrentUser } from '@/app/current-user';
import { useSites } from '@/features/surveys/api/get-sites';
import { useSitePlans } from '@/features/plans/api/get-site-plans';
import { PlanList } from '@/features/plans/components/plan-list';
import { PlanUploadForm } from '@/features/plans/components/plan-upload-form';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { SelectField } from '@/components/ui/field';
import { EmptyState, QueryState } from '@/components/ui/states';

/** Plans of a site: choose the site, see its plans, upload another. */
export function PlansIndexRoute() {
  const user = useCurrentUser();
  const sites = useSites();
  const [params, setParams] = useSearchParams();
  const chosen = Number(params.get('site')) || sites.data?.items[0]?.id;
  const plans = useSitePlans(chosen);
  return (
    <Page>
      <PageHeader eyebrow="Sites" title="Plans" description="Floor plans and site plans to scale: zones are drawn on them and survey points shown on them." />
      <QueryState query={sites} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No site yet">Create a site first; its plans are kept here.</EmptyState>}>
        {(d) => (
          <div className="space-y-6">
            {d.items.length > 1 && (
              <SelectField label="Site" value={chosen ?? ''} onChange={(e) => setParams({ site: e.target.value })} className="max-w-sm">
                {d.items.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
              </SelectField>
            )}
            <QueryState query={plans} isEmpty={(p) => p.items.length === 0}
              empty={<Card><EmptyState title="No plan for this site yet" icon={<MapIcon className="h-6 w-6" aria-hidden />}>Upload a floor plan or site plan image below.</EmptyState></Card>}>
              {(p) => <PlanList plans={p.items} />}
            </QueryState>
            {chosen && can(user.role, 'plans.write') && (
              <Card>
                <CardHeader title="Upload a plan" description="One image per floor or outdoor area. Set its scale after uploading if you do not know its width." />
                <CardBody><PlanUploadForm siteId={chosen} /></CardBody>
              </Card>
            )}
          </div>
        )}
      </QueryState>
    </Page>
  );
}

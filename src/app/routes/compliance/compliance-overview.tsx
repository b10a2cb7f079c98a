import { Building2 } from 'lucide-react';
import { useSitesOverview } from '@/features/compliance/api/get-sites-overview';
import { SitesOverviewList } from '@/features/compliance/components/sites-overview';
import { RuleNote } from '@/features/compliance/components/rule-note';
import { SafetyCaution } from '@/features/compliance/components/safety-caution';
import { Page, PageHeader } from '@/components/ui/page';
import { EmptyState, QueryState } from '@/components/ui/states';

/** The facility manager's start: each site's latest survey and how its zones stand. */
export function ComplianceOverviewRoute() {
  const overview = useSitesOverview();
  return (
    <Page>
      <PageHeader eyebrow="Lighting targets" title="Sites and verdicts" description="Each site's latest survey with readings, and how many of its zones meet their targets, fall short or are inconclusive." />
      <QueryState query={overview} loadingLabel="Judging the latest surveys…" isEmpty={(d) => d.items.length === 0}
        empty={<EmptyState title="No site you can see yet" icon={<Building2 className="h-6 w-6" aria-hidden />}>Sites appear here once a surveyor has created them (or once an admin gives you access to them).</EmptyState>}>
        {(d) => (
          <div className="space-y-6">
            <RuleNote rule={d.rule} ruleText={d.ruleText} />
            <SitesOverviewList sites={d.items} />
            <SafetyCaution />
          </div>
        )}
      </QueryState>
    </Page>
  );
}

import { useState } from 'react';
import { SitesPanel } from '@/features/surveys/components/sites-panel';
import { SurveysPanel } from '@/features/surveys/components/surveys-panel';
import { Page, PageHeader } from '@/components/ui/page';
import { useCurrentUser } from '../../current-user';

export function SurveysIndexRoute() {
  const me = useCurrentUser();
  const [siteId, setSiteId] = useState<number | null>(null);
  return (
    <Page>
      <PageHeader eyebrow="Field work" title="Surveys" description="Sites, their walk-throughs, and the meter logs behind every reading." />
      <div className="grid gap-6 lg:grid-cols-[22rem_1fr]">
        <SitesPanel role={me.role} siteId={siteId} onSelect={setSiteId} />
        <SurveysPanel role={me.role} siteId={siteId} />
      </div>
    </Page>
  );
}

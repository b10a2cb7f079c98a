import { Link, useParams } from 'react-router';
import { paths } from '@shared/paths';
import { can } from '@shared/policy';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';
import { useLogbook } from '@/features/emergency/api/get-logbook';
import { DueList } from '@/features/emergency/components/tests-due';
import { LogbookEntries, LogbookEntryForm } from '@/features/emergency/components/logbook';
import { EmergencyCaution } from '@/features/emergency/components/emergency-caution';
import { useCurrentUser } from '../../current-user';

/** A site's emergency lighting test logbook: what is due, recording a test, and the record. */
export function LogbookRoute() {
  const siteId = Number(useParams().siteId);
  const me = useCurrentUser();
  const book = useLogbook(siteId);
  return (
    <Page>
      <QueryState query={book}>
        {(b) => (
          <>
            <PageHeader eyebrow={<Link to={paths.emergency.to()} className="underline">Emergency lighting</Link>} title={`Test logbook: ${b.siteName}`}
              description={`Functional test every ${b.schedule.functionalEveryDays} days, full-duration test every ${b.schedule.fullDurationEveryMonths} months. Dates are in ${b.siteTimeZone}.`} />
            <div className="space-y-6">
              <Card><CardHeader title="Next tests" /><CardBody><DueList due={b.due} /></CardBody></Card>
              {can(me.role, 'logbook.write') && <Card><CardHeader title="Record a test" /><CardBody><LogbookEntryForm book={b} /></CardBody></Card>}
              <Card><CardHeader title="Record" /><CardBody><LogbookEntries entries={b.entries} total={b.total} /></CardBody></Card>
              <EmergencyCaution />
            </div>
          </>
        )}
      </QueryState>
    </Page>
  );
}

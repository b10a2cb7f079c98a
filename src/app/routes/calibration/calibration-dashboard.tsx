import { Link } from 'react-router';
import { BellRing, List, Plus } from 'lucide-react';
import { can } from '@shared/policy';
import { useCurrentUser } from '@/app/current-user';
import { useCalibrationDashboard } from '@/features/calibration/api/get-calibration-dashboard';
import { useRunReminders } from '@/features/calibration/api/run-reminders';
import { DashboardTable } from '@/features/calibration/components/dashboard-table';
import { Page, PageHeader } from '@/components/ui/page';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { EmptyState, QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

/** Due dates of every probe: what is overdue, what comes due in 30 days, what has no approved set. */
export function CalibrationDashboardRoute() {
  const user = useCurrentUser();
  const dashboard = useCalibrationDashboard();
  const reminders = useRunReminders();
  return (
    <Page>
      <PageHeader eyebrow="Calibration" title="Calibration due dates"
        description="A reading taken after its set's due date is flagged as calibration lapsed. Reminders go to calibration staff for probes due within 14 days or overdue, at most once a week per probe."
        actions={(
          <>
            <Link to={paths.probes.to()} className="inline-flex items-center gap-2 rounded-lg bg-white px-4 py-2 text-sm font-medium text-ink-900 ring-1 ring-inset ring-ink-200 hover:bg-ink-50"><List className="h-4 w-4" aria-hidden />Probe list</Link>
            {can(user.role, 'reminders.run') && (
              <Button variant="secondary" busy={reminders.isPending} onClick={() => reminders.mutate()}><BellRing className="h-4 w-4" aria-hidden />Send reminders now</Button>
            )}
            {can(user.role, 'probes.write') && (
              <Link to={paths.probeNew.to()} className="inline-flex items-center gap-2 rounded-lg bg-ink-900 px-4 py-2 text-sm font-medium text-white hover:bg-ink-800"><Plus className="h-4 w-4" aria-hidden />New probe</Link>
            )}
          </>
        )} />
      {reminders.isSuccess && (
        <p role="status" className="mb-4 text-sm text-ink-700">
          {reminders.data.messagesSent ? `Reminder sent for ${reminders.data.reminded.map((r) => r.serial).join(', ')}.` : 'No reminder was due.'}
          {reminders.data.skippedRecentlyReminded.length ? ` Already reminded this week: ${reminders.data.skippedRecentlyReminded.join(', ')}.` : ''}
        </p>
      )}
      <div className="mb-4"><FormError error={reminders.error} /></div>
      <Card>
        <QueryState query={dashboard} isEmpty={(d) => d.items.length === 0}
          empty={<EmptyState title="No probes yet">Register the organisation's probes to track their calibration.</EmptyState>}>
          {(d) => <DashboardTable rows={d.items} dueSoonDays={d.dueSoonDays} showRetired={false} />}
        </QueryState>
      </Card>
    </Page>
  );
}

import { useState } from 'react';
import { Mail } from 'lucide-react';
import type { OutboxStatus } from '@shared/schemas/users';
import { useOutbox } from '@/features/outbox/api/get-outbox';
import { OutboxList } from '@/features/outbox/components/outbox-list';
import { Page, PageHeader } from '@/components/ui/page';
import { Card } from '@/components/ui/card';
import { cx } from '@/components/ui/cx';
import { EmptyState, QueryState } from '@/components/ui/states';

const FILTERS: { value: OutboxStatus | undefined; label: string }[] = [
  { value: undefined, label: 'All' },
  { value: 'queued', label: 'Queued' },
  { value: 'sent', label: 'Sent' },
  { value: 'failed', label: 'Failed' },
];

export function OutboxRoute() {
  const [status, setStatus] = useState<OutboxStatus | undefined>(undefined);
  const outbox = useOutbox(status);
  const delivery = outbox.data?.delivery;
  return (
    <Page>
      <PageHeader
        eyebrow="Administration"
        title="Outbox"
        description={delivery !== 'outbox'
          ? 'Every e-mail Luxtrail sends: invitations, resets, reviews, reminders and reports. Each is queued with the change that caused it and handed to the mail server, with retries when the server does not answer.'
          : 'No mail server is configured, so e-mail is kept here instead of being sent: invitations, resets, reviews, reminders and reports.'}
      />
      <div role="group" aria-label="Show messages" className="mb-3 flex flex-wrap gap-2">
        {FILTERS.map((f) => {
          const count = f.value && outbox.data ? outbox.data.counts[f.value] : null;
          return (
            <button key={f.label} type="button" aria-pressed={status === f.value} onClick={() => setStatus(f.value)}
              className={cx('rounded-full px-3 py-1 text-sm font-medium ring-1 ring-inset', status === f.value ? 'bg-ink-900 text-white ring-ink-900' : 'bg-white text-ink-700 ring-ink-200 hover:bg-ink-50')}>
              {f.label}{count !== null ? ` (${count})` : ''}
            </button>
          );
        })}
      </div>
      <Card>
        <QueryState query={outbox} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title={status ? `No ${status} mail` : 'No mail yet'} icon={<Mail className="h-6 w-6" />}>Invitations and reports you send will appear here.</EmptyState>}>
          {(d) => <OutboxList messages={d.items} />}
        </QueryState>
      </Card>
    </Page>
  );
}

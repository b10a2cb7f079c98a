import { Mail } from 'lucide-react';
import { useOutbox } from '@/features/outbox/api/get-outbox';
import { OutboxList } from '@/features/outbox/components/outbox-list';
import { Page, PageHeader } from '@/components/ui/page';
import { Card } from '@/components/ui/card';
import { EmptyState, QueryState } from '@/components/ui/states';

export function OutboxRoute() {
  const outbox = useOutbox();
  return (
    <Page>
      <PageHeader eyebrow="Administration" title="Outbox" description="With no mail server configured, Luxtrail delivers e-mail here: invitations, resets, reminders and reports." />
      <Card>
        <QueryState query={outbox} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No mail yet" icon={<Mail className="h-6 w-6" />}>Invitations and reports you send will appear here.</EmptyState>}>
          {(d) => <OutboxList messages={d.items} />}
        </QueryState>
      </Card>
    </Page>
  );
}

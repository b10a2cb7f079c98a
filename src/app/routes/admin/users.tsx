import { Users } from 'lucide-react';
import { useUsers } from '@/features/users/api/get-users';
import { InviteForm } from '@/features/users/components/invite-form';
import { UsersTable } from '@/features/users/components/users-table';
import { useSites } from '@/features/surveys/api/get-sites';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { EmptyState, QueryState } from '@/components/ui/states';
import { useCurrentUser } from '../../current-user';

export function UsersRoute() {
  const users = useUsers();
  const me = useCurrentUser();
  const sites = useSites();
  const siteOptions = sites.data?.items.map((s) => ({ id: s.id, name: s.name })) ?? [];
  return (
    <Page>
      <PageHeader eyebrow="Administration" title="Users" description="Everyone in your organisation, their role, and invitations still open." />
      <div className="flex flex-col gap-6">
        <Card>
          <CardHeader title="Invite someone" description="They receive a link that works once and expires after 7 days." />
          <CardBody><InviteForm sites={siteOptions} /></CardBody>
        </Card>
        <Card>
          <CardHeader title="People" />
          <QueryState query={users} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No users yet" icon={<Users className="h-6 w-6" />} />}>
            {(d) => <UsersTable users={d.items} currentUserId={me.id} sites={siteOptions} />}
          </QueryState>
        </Card>
      </div>
    </Page>
  );
}

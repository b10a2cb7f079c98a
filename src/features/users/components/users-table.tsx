import { ROLE_LABELS, ROLES, type Role } from '@shared/roles';
import type { User } from '@shared/schemas/users';
import { useResendInvitation, useUpdateUser } from '../api/update-user';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';

const STATUS_TONE = { active: 'good', invited: 'warn', disabled: 'neutral' } as const;

export function UsersTable({ users, currentUserId, sites }: { users: User[]; currentUserId: number; sites: { id: number; name: string }[] }) {
  const update = useUpdateUser();
  const resend = useResendInvitation();
  return (
    <div className="scroll-x">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Users of your organisation</caption>
        <thead className="border-b border-ink-100 text-xs uppercase tracking-wide text-ink-500">
          <tr><th className="px-5 py-2 font-medium">Name</th><th className="px-5 py-2 font-medium">E-mail</th><th className="px-5 py-2 font-medium">Role</th><th className="px-5 py-2 font-medium">Status</th><th className="px-5 py-2 font-medium"><span className="sr-only">Actions</span></th></tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {users.map((u) => (
            <tr key={u.id}>
              <td className="px-5 py-3 font-medium text-ink-900">{u.name}</td>
              <td className="px-5 py-3 text-ink-600">{u.email}</td>
              <td className="px-5 py-3">
                <label className="sr-only" htmlFor={`role-${u.id}`}>Role of {u.name}</label>
                <select
                  id={`role-${u.id}`}
                  className="rounded-md border-0 bg-transparent py-1 pl-1 pr-7 text-sm ring-1 ring-inset ring-ink-200 disabled:opacity-60"
                  value={u.role}
                  disabled={u.id === currentUserId || update.isPending}
                  onChange={(e) => update.mutate({ id: u.id, role: e.target.value as Role })}
                >
                  {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
                </select>
              </td>
              <td className="px-5 py-3">
                <Badge tone={STATUS_TONE[u.status]}>{u.status}</Badge>
                {u.role === 'facility_manager' && u.siteIds.length > 0 && (
                  <div className="mt-1 text-xs text-ink-500">Sites: {u.siteIds.map((id) => sites.find((s) => s.id === id)?.name ?? `#${id}`).join(', ')}</div>
                )}
              </td>
              <td className="px-5 py-3 text-right">
                {u.status === 'invited' && <Button size="sm" variant="ghost" onClick={() => resend.mutate(u.id)} busy={resend.isPending && resend.variables === u.id}>Resend link</Button>}
                {u.status === 'active' && u.id !== currentUserId && <Button size="sm" variant="ghost" onClick={() => update.mutate({ id: u.id, status: 'disabled' })}>Disable</Button>}
                {u.status === 'disabled' && <Button size="sm" variant="ghost" onClick={() => update.mutate({ id: u.id, status: 'active' })}>Enable</Button>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {update.isError && <p role="alert" className="px-5 py-2 text-sm text-short-600">{update.error.message}</p>}
    </div>
  );
}

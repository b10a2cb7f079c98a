import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { CheckCircle2 } from 'lucide-react';
import { inviteBodySchema, type InviteBody } from '@shared/schemas/users';
import { ROLES, ROLE_LABELS } from '@shared/roles';
import { useInviteUser } from '../api/invite-user';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';

export type SiteOption = { id: number; name: string };

/** `sites`: the organisation's sites, offered when a facility manager is limited to some of them. */
export function InviteForm({ sites }: { sites: SiteOption[] }) {
  const invite = useInviteUser();
  const form = useForm<z.input<typeof inviteBodySchema>, unknown, z.output<typeof inviteBodySchema>>({ resolver: zodResolver(inviteBodySchema), defaultValues: { email: '', name: '', role: 'surveyor', siteIds: [] } });
  const role = useWatch({ control: form.control, name: 'role' });
  const chosenSites = useWatch({ control: form.control, name: 'siteIds' });
  const submit = (values: InviteBody) => invite.mutate(values, { onSuccess: () => form.reset({ email: '', name: '', role: values.role, siteIds: [] }) });
  return (
    <form noValidate aria-label="Invite a user" className="grid gap-4 sm:grid-cols-2" onSubmit={form.handleSubmit(submit)}>
      <TextField label="Name" autoComplete="off" {...form.register('name')} error={form.formState.errors.name?.message} />
      <TextField label="E-mail" type="email" autoComplete="off" {...form.register('email')} error={form.formState.errors.email?.message} />
      <SelectField label="Role" {...form.register('role')} error={form.formState.errors.role?.message}>
        {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
      </SelectField>
      {role === 'facility_manager' && sites.length > 0 && (
        <fieldset className="sm:col-span-2">
          <legend className="mb-1 text-sm font-medium text-ink-800">Limit to these sites</legend>
          <p className="mb-2 text-xs text-ink-500">Leave all unticked to let them see every site of the organisation.</p>
          <div className="flex flex-wrap gap-x-5 gap-y-2">
            {sites.map((site) => (
              <label key={site.id} className="flex items-center gap-2 text-sm text-ink-800">
                <input
                  type="checkbox"
                  className="h-4 w-4 rounded border-ink-300 text-lamp-600 focus:ring-lamp-500"
                  checked={(chosenSites ?? []).includes(site.id)}
                  onChange={(e) => {
                    const current = form.getValues('siteIds') ?? [];
                    form.setValue('siteIds', e.target.checked ? [...current, site.id] : current.filter((id) => id !== site.id));
                  }}
                />
                {site.name}
              </label>
            ))}
          </div>
        </fieldset>
      )}
      <div className="flex items-end">
        <Button type="submit" busy={invite.isPending} className="w-full sm:w-auto">Send invitation</Button>
      </div>
      <div className="sm:col-span-2">
        <FormError error={invite.error} />
        {invite.isSuccess && (
          <p role="status" className="flex items-center gap-2 text-sm text-meets-700"><CheckCircle2 className="h-4 w-4" aria-hidden />Invitation sent to {invite.data.email}.</p>
        )}
      </div>
    </form>
  );
}

import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { CheckCircle2 } from 'lucide-react';
import { inviteBodySchema, type InviteBody } from '@shared/schemas/users';
import { ROLES, ROLE_LABELS } from '@shared/roles';
import { useInviteUser } from '../api/invite-user';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';

export function InviteForm() {
  const invite = useInviteUser();
  const form = useForm<z.input<typeof inviteBodySchema>, unknown, z.output<typeof inviteBodySchema>>({ resolver: zodResolver(inviteBodySchema), defaultValues: { email: '', name: '', role: 'surveyor', siteIds: [] } });
  const submit = (values: InviteBody) => invite.mutate(values, { onSuccess: () => form.reset({ email: '', name: '', role: values.role, siteIds: [] }) });
  return (
    <form noValidate aria-label="Invite a user" className="grid gap-4 sm:grid-cols-2" onSubmit={form.handleSubmit(submit)}>
      <TextField label="Name" autoComplete="off" {...form.register('name')} error={form.formState.errors.name?.message} />
      <TextField label="E-mail" type="email" autoComplete="off" {...form.register('email')} error={form.formState.errors.email?.message} />
      <SelectField label="Role" {...form.register('role')} error={form.formState.errors.role?.message}>
        {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
      </SelectField>
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

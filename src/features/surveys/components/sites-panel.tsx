import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Building2 } from 'lucide-react';
import { createSiteBodySchema } from '@shared/schemas/sites';
import { can } from '@shared/policy';
import { useSites } from '../api/get-sites';
import { useCreateSite } from '../api/create-site';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { EmptyState, QueryState } from '@/components/ui/states';
import { viewerTimeZone } from '@shared/datetime';

const ZONES: string[] = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : ['UTC', 'Europe/London'];
const HERE = viewerTimeZone();

function CreateSiteForm() {
  const create = useCreateSite();
  const form = useForm<z.input<typeof createSiteBodySchema>, unknown, z.output<typeof createSiteBodySchema>>({ resolver: zodResolver(createSiteBodySchema), defaultValues: { name: '', address: '', timeZone: HERE } });
  return (
    <form noValidate aria-label="Add a site" className="grid gap-3 sm:grid-cols-3" onSubmit={form.handleSubmit((v) => create.mutate(v, { onSuccess: () => form.reset({ name: '', address: '', timeZone: v.timeZone }) }))}>
      <TextField label="Site name" {...form.register('name')} error={form.formState.errors.name?.message} />
      <TextField label="Address (optional)" {...form.register('address')} error={form.formState.errors.address?.message} />
      <SelectField label="Time zone" hint="Log times without an offset are read in this zone." {...form.register('timeZone')} error={form.formState.errors.timeZone?.message}>
        {(ZONES.includes(HERE) ? ZONES : [HERE, ...ZONES]).map((z) => <option key={z} value={z}>{z}</option>)}
      </SelectField>
      <div className="sm:col-span-3 flex flex-wrap items-center gap-3">
        <Button type="submit" busy={create.isPending}>Add site</Button>
        <FormError error={create.error} />
      </div>
    </form>
  );
}

export function SitesPanel({ role, siteId, onSelect }: { role: Parameters<typeof can>[0]; siteId: number | null; onSelect: (id: number | null) => void }) {
  const sites = useSites();
  return (
    <Card>
      <CardHeader title="Sites" description="Buildings and outdoor areas you survey." />
      <QueryState query={sites} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No sites yet" icon={<Building2 className="h-6 w-6" />}>Add the first site below.</EmptyState>}>
        {(d) => (
          <ul className="divide-y divide-ink-100" aria-label="Sites">
            <li>
              <button type="button" onClick={() => onSelect(null)} aria-pressed={siteId === null} className="w-full px-5 py-2 text-left text-sm hover:bg-ink-50 aria-pressed:bg-lamp-50 aria-pressed:font-semibold">All sites</button>
            </li>
            {d.items.map((s) => (
              <li key={s.id}>
                <button type="button" onClick={() => onSelect(s.id)} aria-pressed={siteId === s.id} className="w-full px-5 py-2 text-left hover:bg-ink-50 aria-pressed:bg-lamp-50">
                  <span className="block text-sm font-medium text-ink-900">{s.name}</span>
                  <span className="block text-xs text-ink-500">{[s.address, s.timeZone, `${s.surveyCount} survey${s.surveyCount === 1 ? '' : 's'}`].filter(Boolean).join(' · ')}</span>
                </button>
              </li>
            ))}
          </ul>
        )}
      </QueryState>
      {can(role, 'sites.write') && <CardBody className="border-t border-ink-100"><CreateSiteForm /></CardBody>}
    </Card>
  );
}

import { useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router';
import { ClipboardList } from 'lucide-react';
import { createSurveyBodySchema } from '@shared/schemas/surveys';
import { can } from '@shared/policy';
import { formatCalendarDay } from '@shared/datetime';
import { useSites } from '../api/get-sites';
import { useSurveys } from '../api/get-surveys';
import { useCreateSurvey } from '../api/create-survey';
import { SurveyStatusBadge } from './status-badge';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { EmptyState, QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

type SurveyFormValues = { siteId: string; name: string; startedOn: string; daylightExcluded: boolean };

function CreateSurveyForm({ siteId }: { siteId: number | null }) {
  const sites = useSites();
  const create = useCreateSurvey();
  const navigate = useNavigate();
  const form = useForm<SurveyFormValues>({ values: { siteId: String(siteId ?? sites.data?.items[0]?.id ?? ''), name: '', startedOn: '', daylightExcluded: false } });
  // The shared schema validates, as the server will.
  const submit = form.handleSubmit((v) => {
    const parsed = createSurveyBodySchema.safeParse({ siteId: Number(v.siteId), name: v.name, startedOn: v.startedOn || undefined, conditions: { daylightExcluded: v.daylightExcluded } });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) form.setError(String(issue.path[0]) as keyof SurveyFormValues, { message: issue.path[0] === 'siteId' ? 'Choose a site' : issue.message });
      return;
    }
    create.mutate(parsed.data, { onSuccess: (s) => navigate(paths.survey.to(s.id)) });
  });
  return (
    <form noValidate aria-label="Start a survey" className="grid gap-3 sm:grid-cols-2" onSubmit={submit}>
      <SelectField label="Site" {...form.register('siteId')} error={form.formState.errors.siteId?.message}>
        {(sites.data?.items ?? []).map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
      </SelectField>
      <TextField label="Survey name" placeholder="e.g. Winter walk-through" {...form.register('name')} error={form.formState.errors.name?.message} />
      <TextField label="Started on (optional)" type="date" {...form.register('startedOn')} error={form.formState.errors.startedOn?.message} />
      <label className="flex items-center gap-2 self-end pb-2 text-sm text-ink-800">
        <input type="checkbox" className="h-4 w-4 rounded border-ink-300" {...form.register('daylightExcluded')} />
        Daylight excluded (blinds down or after dark)
      </label>
      <div className="sm:col-span-2 flex flex-wrap items-center gap-3">
        <Button type="submit" busy={create.isPending}>Start survey</Button>
        <FormError error={create.error} />
      </div>
    </form>
  );
}

export function SurveysPanel({ role, siteId }: { role: Parameters<typeof can>[0]; siteId: number | null }) {
  const surveys = useSurveys(siteId ?? undefined);
  return (
    <div className="flex flex-col gap-6">
      <Card>
        <CardHeader title="Surveys" description="Newest first by start date. Open one to upload logs and see its readings." />
        <QueryState query={surveys} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No surveys yet" icon={<ClipboardList className="h-6 w-6" />}>Start one below.</EmptyState>}>
          {(d) => (
            <div className="scroll-x">
              <table className="stack-table min-w-full text-sm">
                <thead className="bg-ink-50 text-left text-xs uppercase tracking-wide text-ink-500">
                  <tr><th className="px-5 py-2">Survey</th><th className="px-3 py-2">Site</th><th className="px-3 py-2">Status</th><th className="px-3 py-2 text-right">Readings</th><th className="px-3 py-2">Started</th></tr>
                </thead>
                <tbody className="divide-y divide-ink-100">
                  {d.items.map((s) => (
                    <tr key={s.id} className="hover:bg-ink-50">
                      <td data-lead className="px-5 py-2"><Link className="font-medium text-ink-900 underline-offset-2 hover:underline focus-visible:underline" to={paths.survey.to(s.id)}>{s.name}</Link></td>
                      <td data-label="Site" className="px-3 py-2 text-ink-600">{s.siteName}</td>
                      <td data-key className="px-3 py-2"><SurveyStatusBadge status={s.status} /></td>
                      <td data-label="Readings" className="num px-3 py-2 text-right">{s.readingCount.toLocaleString('en-GB')}</td>
                      <td data-key data-label="Started" className="px-3 py-2 text-ink-600">{s.startedOn ? formatCalendarDay(s.startedOn) : '–'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </QueryState>
      </Card>
      {can(role, 'surveys.write') && (
        <Card>
          <CardHeader title="Start a survey" description="A survey collects the logs of one walk-through of a site." />
          <CardBody><CreateSurveyForm siteId={siteId} /></CardBody>
        </Card>
      )}
    </div>
  );
}

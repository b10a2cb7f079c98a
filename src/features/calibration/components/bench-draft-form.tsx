import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import type { CoefficientSetDto } from '@shared/schemas/coefficient-sets';
import { useCreateCoefficientSet } from '../api/create-coefficient-set';
import { DraftHeaderFields, draftHeaderDefaults, draftHeaderToBody, useDraftCheck, type DraftHeaderValues } from './draft-fields';

/** "Draft a coefficient set from this fit": the fit's coefficients, reference conditions and suggested uncertainties. */
export function BenchDraftForm({ probeId, benchRunId, disabledReason, onDrafted }: { probeId: number; benchRunId: number; disabledReason: string | null; onDrafted: (s: CoefficientSetDto) => void }) {
  const create = useCreateCoefficientSet();
  const { check, messageFor, problems } = useDraftCheck();
  const form = useForm<DraftHeaderValues>({ defaultValues: draftHeaderDefaults() });
  const submit = (v: DraftHeaderValues) => {
    const body = { source: 'bench_run' as const, benchRunId, ...draftHeaderToBody(v) };
    if (check(body)) create.mutate({ probeId, body }, { onSuccess: onDrafted });
  };
  return (
    <form noValidate aria-label="Draft a coefficient set from this fit" className="space-y-4" onSubmit={form.handleSubmit(submit)}>
      <DraftHeaderFields register={form.register} errors={form.formState.errors} messageFor={messageFor} />
      {problems.length > 0 && <p role="alert" className="text-sm text-short-700">{problems[0].message}</p>}
      {disabledReason && <p className="text-sm text-short-700">{disabledReason}</p>}
      <FormError error={create.error} />
      <Button type="submit" busy={create.isPending} disabled={disabledReason !== null}>Draft a coefficient set from this fit</Button>
      <p className="text-xs text-ink-500">The draft decodes nothing until a second person approves it.</p>
    </form>
  );
}

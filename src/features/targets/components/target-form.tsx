import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { CONFIDENCE_LABELS, createTargetBodySchema, TARGET_CONFIDENCE, type TargetEntry } from '@shared/schemas/targets';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useCreateTarget } from '../api/create-target';
import { useUpdateTarget } from '../api/update-target';

// Number inputs arrive as text: empty means "none" for the optional figures; the ranges are the API's.
const blankIsNull = (schema: z.ZodNumber) => z.union([z.literal(''), z.coerce.number().pipe(schema)]).transform((v) => (v === '' ? null : v));
const formSchema = createTargetBodySchema.extend({
  emValue: z.coerce.number({ message: 'Enter Em as a number' }).pipe(createTargetBodySchema.shape.emValue),
  u0Min: blankIsNull(z.number().min(0, 'U0 is between 0 and 1').max(1, 'U0 is between 0 and 1')),
  dfTargetPercent: blankIsNull(z.number().positive('The daylight factor target must be above 0 %').max(100, 'A daylight factor is at most 100 %')),
});
type FormInput = z.input<typeof formSchema>;
type FormOutput = z.output<typeof formSchema>;

/** Adds an organisation entry, or edits one (shipped entries are read-only). */
export function TargetForm({ entry, onDone }: { entry?: TargetEntry; onDone: () => void }) {
  const create = useCreateTarget();
  const update = useUpdateTarget();
  const mutation = entry ? update : create;
  const form = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(formSchema),
    defaultValues: entry
      ? { useType: entry.useType, name: entry.name, emValue: entry.emSourceValue, sourceUnit: entry.sourceUnit, u0Min: entry.u0Min ?? '', dfTargetPercent: entry.dfTargetPercent ?? '', source: entry.source, confidence: entry.confidence }
      : { useType: '', name: '', emValue: '', sourceUnit: 'lx', u0Min: '', dfTargetPercent: '', source: '', confidence: 'published' },
  });
  const err = form.formState.errors;
  const onSubmit = form.handleSubmit(async (body) => {
    if (entry) await update.mutateAsync({ id: entry.id, ...body });
    else await create.mutateAsync(body);
    onDone();
  });
  return (
    <form className="grid gap-3 sm:grid-cols-2" onSubmit={(e) => { onSubmit(e).catch(() => undefined); }} noValidate>
      <TextField label="Use type" hint="Zones name this, e.g. client_office" error={err.useType?.message} {...form.register('useType')} />
      <TextField label="Name" error={err.name?.message} {...form.register('name')} />
      <TextField label="Maintained illuminance Em" inputMode="decimal" error={err.emValue?.message} {...form.register('emValue')} />
      <SelectField label="Unit the source uses" error={err.sourceUnit?.message} {...form.register('sourceUnit')}>
        <option value="lx">lux</option>
        <option value="fc">foot-candles</option>
      </SelectField>
      <TextField label="Minimum uniformity U0 (optional)" inputMode="decimal" placeholder="e.g. 0.6" error={err.u0Min?.message} {...form.register('u0Min')} />
      <TextField label="Daylight factor target, % (optional)" inputMode="decimal" error={err.dfTargetPercent?.message} {...form.register('dfTargetPercent')} />
      <TextField className="sm:col-span-2" label="Source (document, clause or table)" error={err.source?.message} {...form.register('source')} />
      <SelectField label="Confidence" error={err.confidence?.message} {...form.register('confidence')}>
        {TARGET_CONFIDENCE.map((c) => <option key={c} value={c}>{CONFIDENCE_LABELS[c]}</option>)}
      </SelectField>
      <div className="sm:col-span-2 space-y-2">
        <FormError error={mutation.error} />
        <div className="flex gap-2">
          <Button type="submit" busy={mutation.isPending}>{entry ? 'Save entry' : 'Add entry'}</Button>
          <Button type="button" variant="ghost" onClick={onDone}>Cancel</Button>
        </div>
      </div>
    </form>
  );
}

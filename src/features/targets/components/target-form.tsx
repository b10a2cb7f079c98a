import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { CONFIDENCE_LABELS, TARGET_CONFIDENCE, TARGET_MODIFIED_CHECK, targetFieldsSchema, type TargetEntry } from '@shared/schemas/targets';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useCreateTarget } from '../api/create-target';
import { useUpdateTarget } from '../api/update-target';

// Number inputs arrive as text: empty means "none" for the optional figures; the ranges are the API's.
const blankIsNull = (schema: z.ZodNumber) => z.union([z.literal(''), z.coerce.number().pipe(schema)]).transform((v) => (v === '' ? null : v));
const lux = (what: string) => blankIsNull(z.number().positive(`${what} must be above 0 lx`).max(200_000, `${what} above 200,000 lx is not an illuminance target`));
const formSchema = targetFieldsSchema.extend({
  emValue: z.coerce.number({ message: 'Enter Em as a number' }).pipe(targetFieldsSchema.shape.emValue),
  u0Min: blankIsNull(z.number().min(0, 'U0 is between 0 and 1').max(1, 'U0 is between 0 and 1')),
  dfTargetPercent: blankIsNull(z.number().positive('The daylight factor target must be above 0 %').max(100, 'A daylight factor is at most 100 %')),
  emModifiedLux: lux('The modified value'),
  ezLux: lux('Ez'),
  emWallLux: lux('The wall illuminance'),
  emCeilingLux: lux('The ceiling illuminance'),
  ra: blankIsNull(z.number().int('Ra is a whole number').min(0, 'Ra is between 0 and 100').max(100, 'Ra is between 0 and 100')),
  rugl: blankIsNull(z.number().int('RUGL is a whole number').min(5, 'RUGL is between 5 and 40').max(40, 'RUGL is between 5 and 40')),
}).refine(...TARGET_MODIFIED_CHECK);
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
      ? {
        useType: entry.useType, name: entry.name, emValue: entry.emSourceValue, sourceUnit: entry.sourceUnit, u0Min: entry.u0Min ?? '', dfTargetPercent: entry.dfTargetPercent ?? '', source: entry.source, confidence: entry.confidence,
        emModifiedLux: entry.emModifiedLux ?? '', ezLux: entry.ezLux ?? '', emWallLux: entry.emWallLux ?? '', emCeilingLux: entry.emCeilingLux ?? '', ra: entry.ra ?? '', rugl: entry.rugl ?? '',
      }
      : { useType: '', name: '', emValue: '', sourceUnit: 'lx', u0Min: '', dfTargetPercent: '', source: '', confidence: 'published', emModifiedLux: '', ezLux: '', emWallLux: '', emCeilingLux: '', ra: '', rugl: '' },
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
      <TextField label="Modified value, lx (optional)" hint="EN 12464-1:2021: the most context modifiers lead to" inputMode="decimal" error={err.emModifiedLux?.message} {...form.register('emModifiedLux')} />
      <TextField label="Cylindrical illuminance Ez, lx (optional)" inputMode="decimal" error={err.ezLux?.message} {...form.register('ezLux')} />
      <TextField label="Walls Em,wall, lx (optional)" hint="Judged with U0 ≥ 0.10" inputMode="decimal" error={err.emWallLux?.message} {...form.register('emWallLux')} />
      <TextField label="Ceiling Em,ceiling, lx (optional)" hint="Judged with U0 ≥ 0.10" inputMode="decimal" error={err.emCeilingLux?.message} {...form.register('emCeilingLux')} />
      <TextField label="Ra (optional, information only)" hint="A meter cannot measure colour rendering" inputMode="numeric" error={err.ra?.message} {...form.register('ra')} />
      <TextField label="RUGL (optional, information only)" hint="A meter cannot measure glare" inputMode="numeric" error={err.rugl?.message} {...form.register('rugl')} />
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

import { max } from 'simple-statistics';
import { useFieldArray, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Plus, Trash2 } from 'lucide-react';
import {
  ANALOG_SCALES, MAX_GAIN_STEPS, PROBE_KINDS, PROBE_KIND_LABELS, PROBE_STATUSES, PROBE_STATUS_LABELS, createProbeBodySchema, type ProbeDto,
} from '@shared/schemas/probes';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { useUnits } from '@/lib/units';

type FormIn = z.input<typeof createProbeBodySchema>;
type FormOut = z.output<typeof createProbeBodySchema>;

const num = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) };

const EMPTY: FormIn = {
  serial: '', kind: 'counts', description: '', status: 'in_service', fullScaleCounts: 65535, saturationCounts: 65000, floorCounts: 200,
  gains: [{ code: 0, nominalGain: 1 }, { code: 1, nominalGain: 8 }], rangeLowLux: null, rangeHighLux: null, scale: 'linear', accuracyPercent: null,
};

function fromProbe(p: ProbeDto): FormIn {
  return {
    serial: p.serial, kind: p.kind, description: p.description, status: p.status, fullScaleCounts: p.fullScaleCounts, saturationCounts: p.saturationCounts,
    floorCounts: p.floorCounts, gains: p.gains ?? [], rangeLowLux: p.rangeLowLux, rangeHighLux: p.rangeHighLux, scale: p.scale ?? 'linear', accuracyPercent: p.accuracyPercent,
  };
}

/** Create or edit a probe; the same zod schema as the server checks it. Analog ranges are entered in lux. */
export function ProbeForm({ probe, onSubmit, busy, error, submitLabel }: {
  probe?: ProbeDto; onSubmit: (values: FormOut) => void; busy: boolean; error: unknown; submitLabel: string;
}) {
  const { label } = useUnits();
  const form = useForm<FormIn, unknown, FormOut>({ resolver: zodResolver(createProbeBodySchema), defaultValues: probe ? fromProbe(probe) : EMPTY });
  const gains = useFieldArray({ control: form.control, name: 'gains' as 'gains' & never });
  const kind = useWatch({ control: form.control, name: 'kind' });
  const e = form.formState.errors;
  const hasSets = probe ? probe.currentSet !== null || probe.draftCount > 0 : false;
  const gainRows = gains.fields as unknown as { id: string }[];

  const submit = (v: FormOut) => onSubmit(v.kind === 'counts'
    ? { ...v, rangeLowLux: null, rangeHighLux: null, scale: null, accuracyPercent: null }
    : { ...v, fullScaleCounts: null, saturationCounts: null, floorCounts: null, gains: null });

  return (
    <form noValidate aria-label={probe ? 'Edit probe' : 'New probe'} className="space-y-6" onSubmit={form.handleSubmit(submit)}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Serial number" autoComplete="off" {...form.register('serial')} error={e.serial?.message} />
        {hasSets ? (
          <>
            <TextField label="Kind" readOnly value={PROBE_KIND_LABELS[kind]} hint="Fixed once the probe has coefficient sets" />
            <input type="hidden" {...form.register('kind')} />
          </>
        ) : (
          <SelectField label="Kind" {...form.register('kind')} error={e.kind?.message}>
            {PROBE_KINDS.map((k) => <option key={k} value={k}>{PROBE_KIND_LABELS[k]}</option>)}
          </SelectField>
        )}
        <TextAreaField label="Description" rows={2} className="sm:col-span-2" {...form.register('description')} error={e.description?.message} />
        <SelectField label="Status" {...form.register('status')} error={e.status?.message}
          hint={probe ? 'Retiring a probe is final: it can no longer be changed or take new sets.' : undefined}>
          {PROBE_STATUSES.filter((s) => probe || s !== 'retired').map((s) => <option key={s} value={s}>{PROBE_STATUS_LABELS[s]}</option>)}
        </SelectField>
      </div>

      {kind === 'counts' ? (
        <fieldset className="space-y-4">
          <legend className="text-sm font-semibold text-ink-900">ADC and gain steps</legend>
          <div className="grid gap-4 sm:grid-cols-3">
            <TextField label="ADC full scale (counts)" type="number" inputMode="numeric" {...form.register('fullScaleCounts', num)} error={e.fullScaleCounts?.message} />
            <TextField label="Saturation (counts)" type="number" inputMode="numeric" hint="A sample at or above this carries no value" {...form.register('saturationCounts', num)} error={e.saturationCounts?.message} />
            <TextField label="Low-signal floor (net counts)" type="number" inputMode="numeric" hint="Net counts below this are under the usable range" {...form.register('floorCounts', num)} error={e.floorCounts?.message} />
          </div>
          <div>
            <p className="mb-2 text-sm text-ink-700">Gain steps: the code the probe logs and its nominal gain (2 to {MAX_GAIN_STEPS}).{hasSets ? ' Codes are fixed once the probe has coefficient sets; nominal gains may change.' : ''}</p>
            <div className="space-y-2">
              {gainRows.map((f, i) => (
                <div key={f.id} className="flex flex-wrap items-end gap-3" role="group" aria-label={`Gain step ${i + 1}`}>
                  <TextField label={`Code (step ${i + 1})`} type="number" inputMode="numeric" className="w-36" readOnly={hasSets} {...form.register(`gains.${i}.code` as const, { valueAsNumber: true })} error={e.gains?.[i]?.code?.message} />
                  <TextField label={`Nominal gain (step ${i + 1})`} type="number" step="any" className="w-44" {...form.register(`gains.${i}.nominalGain` as const, { valueAsNumber: true })} error={e.gains?.[i]?.nominalGain?.message} />
                  {!hasSets && (
                    <Button type="button" variant="ghost" size="sm" onClick={() => gains.remove(i)} aria-label={`Remove gain step ${i + 1}`}><Trash2 className="h-4 w-4" aria-hidden /></Button>
                  )}
                </div>
              ))}
            </div>
            {e.gains?.message && <p role="alert" className="mt-1 text-xs font-medium text-short-600">{e.gains.message}</p>}
            {!hasSets && gainRows.length < MAX_GAIN_STEPS && (
              <Button type="button" variant="secondary" size="sm" className="mt-2"
                onClick={() => { const codes = (form.getValues('gains') ?? []).map((g) => Number(g.code)); const next = codes.length ? max(codes) + 1 : 0; gains.append({ code: next, nominalGain: 8 ** next } as never); }}>
                <Plus className="h-4 w-4" aria-hidden />Add gain step
              </Button>
            )}
          </div>
        </fieldset>
      ) : (
        <fieldset className="space-y-4">
          <legend className="text-sm font-semibold text-ink-900">Transmitter range</legend>
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            <TextField label="Range low (lx)" type="number" step="any" hint={label === 'fc' ? 'Entered in lux, as the transmitter is specified' : undefined} {...form.register('rangeLowLux', num)} error={e.rangeLowLux?.message} />
            <TextField label="Range high (lx)" type="number" step="any" {...form.register('rangeHighLux', num)} error={e.rangeHighLux?.message} />
            <SelectField label="Scale" {...form.register('scale')} error={e.scale?.message}>
              {ANALOG_SCALES.map((s) => <option key={s} value={s}>{s === 'linear' ? 'Linear' : 'log10 of lux'}</option>)}
            </SelectField>
            <TextField label="Stated accuracy (% of span)" type="number" step="any" {...form.register('accuracyPercent', num)} error={e.accuracyPercent?.message} />
          </div>
        </fieldset>
      )}

      <FormError error={error} />
      <Button type="submit" busy={busy}>{submitLabel}</Button>
    </form>
  );
}

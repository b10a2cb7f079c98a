import { useForm, type UseFormRegister } from 'react-hook-form';
import type { ProbeDto } from '@shared/schemas/probes';
import type { CoefficientSetDto } from '@shared/schemas/coefficient-sets';
import { TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { useCreateCoefficientSet } from '../api/create-coefficient-set';
import { DraftHeaderFields, draftHeaderDefaults, draftHeaderToBody, useDraftCheck, type DraftHeaderValues } from './draft-fields';

type Values = DraftHeaderValues & { tRefMs: number; alphaPerK: number; tCalC: number; gains: { code: number; darkCounts: number; luxPerCount: number; uRel: number }[] };

/** Types in a set from a paper certificate; coefficients in lux, as certificates state them. Prefills from the set in force. */
export function ManualDraftForm({ probe, current, onDone }: { probe: ProbeDto; current: CoefficientSetDto | null; onDone: () => void }) {
  const create = useCreateCoefficientSet();
  const { check, messageFor, problems } = useDraftCheck();
  const codes = probe.kind === 'counts' ? (probe.gains ?? []).map((g) => g.code) : [0];
  const form = useForm<Values>({
    defaultValues: {
      ...draftHeaderDefaults(),
      tRefMs: current?.tRefMs ?? 100, alphaPerK: current?.alphaPerK ?? 0, tCalC: current?.tCalC ?? 23,
      gains: codes.map((code) => current?.gains.find((g) => g.code === code) ?? { code, darkCounts: 0, luxPerCount: probe.kind === 'counts' ? NaN : 1, uRel: 0.01 }),
    },
  });
  const submit = (v: Values) => {
    const body = { source: 'manual' as const, ...draftHeaderToBody(v), tRefMs: v.tRefMs, alphaPerK: v.alphaPerK, tCalC: v.tCalC, gains: v.gains.map((g, i) => ({ code: codes[i], darkCounts: g.darkCounts, luxPerCount: g.luxPerCount, uRel: g.uRel })) };
    if (check(body)) create.mutate({ probeId: probe.id, body }, { onSuccess: onDone });
  };
  const n = { valueAsNumber: true } as const;
  return (
    <form noValidate aria-label="Draft a coefficient set" className="space-y-5" onSubmit={form.handleSubmit(submit)}>
      <DraftHeaderFields register={form.register as unknown as UseFormRegister<DraftHeaderValues>} errors={form.formState.errors} messageFor={messageFor} />
      {probe.kind === 'counts' && (
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField label="Reference integration time (ms)" type="number" step="any" {...form.register('tRefMs', n)} error={messageFor('tRefMs')} />
          <TextField label="Temperature coefficient α (1/K)" type="number" step="any" {...form.register('alphaPerK', n)} error={messageFor('alphaPerK')} />
          <TextField label="Calibration temperature (°C)" type="number" step="any" {...form.register('tCalC', n)} error={messageFor('tCalC')} />
        </div>
      )}
      <fieldset>
        <legend className="mb-2 text-sm font-semibold text-ink-900">{probe.kind === 'counts' ? 'Per gain code (lux per count, as on the certificate)' : 'Calibration uncertainty of the transmitter chain'}</legend>
        <div className="space-y-2">
          {codes.map((code, i) => (
            <div key={code} role="group" aria-label={`Gain code ${code}`} className="grid gap-3 sm:grid-cols-[5rem_1fr_1fr_1fr] sm:items-end">
              <div className="text-sm font-medium text-ink-800 sm:pb-2">{probe.kind === 'counts' ? `Code ${code}` : 'Signal'}</div>
              {probe.kind === 'counts' ? (
                <>
                  <TextField label={`Dark counts (code ${code})`} type="number" step="any" {...form.register(`gains.${i}.darkCounts`, n)} error={messageFor(`gains.${i}.darkCounts`)} />
                  <TextField label={`Lux per count (code ${code})`} type="number" step="any" {...form.register(`gains.${i}.luxPerCount`, n)} error={messageFor(`gains.${i}.luxPerCount`)} />
                </>
              ) : <div className="sm:col-span-2" />}
              <TextField label={`u rel, fraction (code ${code})`} type="number" step="any" hint="0.012 = 1.2 %, k = 1" {...form.register(`gains.${i}.uRel`, n)} error={messageFor(`gains.${i}.uRel`)} />
            </div>
          ))}
        </div>
      </fieldset>
      {problems.length > 0 && <p role="alert" className="text-sm text-short-700">Check the highlighted fields: {problems[0].message}</p>}
      <FormError error={create.error} />
      <Button type="submit" busy={create.isPending}>Save draft</Button>
    </form>
  );
}

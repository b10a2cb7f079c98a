import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { QueryState } from '@/components/ui/states';
import { CONTEXT_MODIFIERS, CONTEXT_MODIFIERS_SOURCE, ILLUMINANCE_SCALE_LUX, scaleIndex } from '@shared/core/illuminance-scale';
import type { ZoneTargetResponse } from '@shared/schemas/targets';
import { useUnits } from '@/lib/units';
import { useTargets } from '../api/get-targets';
import { useZoneTarget } from '../api/get-zone-target';
import { useSetZoneTarget } from '../api/set-zone-target';
import { labelOfUseType } from '@shared/schemas/zones';

/** Chooses the library entry a zone is judged against ("by use type" clears the choice) and the value its design chose. */
export function ZoneTargetPicker({ zoneId, onChanged }: { zoneId: number; onChanged?: () => unknown }) {
  const targets = useTargets();
  const current = useZoneTarget(zoneId);
  const set = useSetZoneTarget(onChanged);
  return (
    <QueryState query={current}>
      {(z) => (
        <div className="max-w-xl space-y-4">
          <SelectField label="Library entry" value={z.targetId ?? ''} disabled={set.isPending || targets.isPending}
            onChange={(e) => set.mutate({ zoneId, targetId: e.target.value ? Number(e.target.value) : null })}
            hint={z.target ? `Now: ${z.target.name} (${z.target.source})` : `No entry for “${labelOfUseType(z.useType)}”`}>
            <option value="">By its use ({labelOfUseType(z.useType)})</option>
            {(targets.data?.items ?? []).map((t) => <option key={t.id} value={t.id}>{t.name}{t.shipped ? '' : ' (yours)'}</option>)}
          </SelectField>
          <FormError error={set.error ?? targets.error} />
          {z.target && <DesignValueForm key={`${z.targetId}-${z.chosenEmLux}-${z.contextModifiers.join()}`} zoneId={zoneId} current={z} onChanged={onChanged} />}
        </div>
      )}
    </QueryState>
  );
}

/**
 * The maintained value the design chose (EN 12464-1:2021): the required value, or a step of the
 * illuminance scale up to the entry's modified value (or one step down), with the context modifiers behind it.
 */
function DesignValueForm({ zoneId, current, onChanged }: { zoneId: number; current: ZoneTargetResponse; onChanged?: () => unknown }) {
  const { format } = useUnits();
  const set = useSetZoneTarget(onChanged);
  const target = current.target!;
  const [chosen, setChosen] = useState<number | null>(current.chosenEmLux);
  const [modifiers, setModifiers] = useState<string[]>(current.contextModifiers);
  const [note, setNote] = useState(current.contextNote ?? '');
  const i = scaleIndex(target.emLux);
  const top = target.emModifiedLux ?? target.emLux;
  const options = i < 0 ? [] : ILLUMINANCE_SCALE_LUX.filter((v, k) => k >= i - 1 && v <= top && v !== target.emLux);
  const toggle = (id: string) => setModifiers((m) => (m.includes(id) ? m.filter((x) => x !== id) : [...m, id]));
  return (
    <form className="space-y-3 rounded-lg border border-ink-200 p-3" onSubmit={(e) => {
      e.preventDefault();
      set.mutate({ zoneId, targetId: current.targetId, chosenEmLux: chosen, contextModifiers: modifiers, contextNote: note.trim() === '' ? null : note.trim() });
    }}>
      <p className="text-sm text-ink-700">
        Required {format(target.emLux)}{target.emModifiedLux !== null ? `, modified ${format(target.emModifiedLux)}` : ', no modified value given'}.
        {current.design && <span className="block text-ink-600">{current.design.explanation}</span>}
      </p>
      {i < 0 ? <p className="text-sm text-ink-600">The required value is not a step of the illuminance scale, so no other value can be chosen.</p> : (
        <SelectField label="Value the design chose" value={chosen ?? ''} onChange={(e) => setChosen(e.target.value ? Number(e.target.value) : null)}>
          <option value="">The required value ({format(target.emLux)})</option>
          {options.map((v) => <option key={v} value={v}>{format(v)}{v === target.emModifiedLux ? ' (modified)' : v < target.emLux ? ' (one step down)' : ''}</option>)}
        </SelectField>
      )}
      <fieldset>
        <legend className="text-sm font-medium text-ink-800">Context modifiers</legend>
        <p className="text-xs text-ink-500">{CONTEXT_MODIFIERS_SOURCE}.</p>
        <div className="mt-1 grid gap-1 sm:grid-cols-2">
          {CONTEXT_MODIFIERS.map((m) => (
            <label key={m.id} className="flex items-start gap-2 text-sm text-ink-700">
              <input type="checkbox" className="mt-1" checked={modifiers.includes(m.id)} onChange={() => toggle(m.id)} />
              <span>{m.direction === 'raise' ? 'Raise: ' : 'Lower: '}{m.text}</span>
            </label>
          ))}
        </div>
      </fieldset>
      <TextAreaField label="Note (optional)" value={note} onChange={(e) => setNote(e.target.value)} rows={2} maxLength={1000} />
      <FormError error={set.error} />
      <Button type="submit" disabled={set.isPending}>{set.isPending ? 'Saving…' : 'Save the chosen value'}</Button>
    </form>
  );
}

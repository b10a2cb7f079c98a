import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import type { InstallationInfo, InstallationInput } from '@shared/schemas/surveys';
import { useSetInstallation } from '../api/set-installation';

const PARTS = [['llmf', 'LLMF', 'lamp lumen maintenance'], ['lsf', 'LSF', 'lamp survival'], ['lmf', 'LMF', 'luminaire maintenance'], ['rsmf', 'RSMF', 'room surface maintenance']] as const;
type PartKey = (typeof PARTS)[number][0];

/**
 * New installation (judged against Ēm / MF) or in service (against Ēm). MF is typed in, or built
 * from its parts LLMF × LSF × LMF × RSMF (CIE 97:2005); the server checks them.
 */
export function InstallationForm({ surveyId, current, onChanged }: { surveyId: number; current: InstallationInfo; onChanged?: () => unknown }) {
  const set = useSetInstallation(onChanged);
  const [state, setState] = useState<'in_service' | 'new'>(current.state);
  const [mode, setMode] = useState<'factor' | 'parts'>(current.parts ? 'parts' : 'factor');
  const [mf, setMf] = useState(current.maintenanceFactor?.toString() ?? '0.8');
  const [parts, setParts] = useState<Record<PartKey, string>>({
    llmf: current.parts?.llmf.toString() ?? '', lsf: current.parts?.lsf.toString() ?? '', lmf: current.parts?.lmf.toString() ?? '', rsmf: current.parts?.rsmf.toString() ?? '',
  });
  const product = PARTS.reduce((p, [k]) => p * Number(parts[k]), 1);
  const submit = () => {
    let body: InstallationInput;
    if (state === 'in_service') body = { state };
    else if (mode === 'factor') body = { state, maintenanceFactor: Number(mf) };
    else body = { state, parts: { llmf: Number(parts.llmf), lsf: Number(parts.lsf), lmf: Number(parts.lmf), rsmf: Number(parts.rsmf) } };
    set.mutate({ surveyId, ...body });
  };
  return (
    <form className="space-y-3" onSubmit={(e) => { e.preventDefault(); submit(); }}>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="The installation is" value={state} onChange={(e) => setState(e.target.value as 'in_service' | 'new')}>
          <option value="in_service">In service (judged against Ēm)</option>
          <option value="new">New (judged against Ēm / MF)</option>
        </SelectField>
        {state === 'new' && (
          <SelectField label="Maintenance factor given as" value={mode} onChange={(e) => setMode(e.target.value as 'factor' | 'parts')}>
            <option value="factor">One factor MF</option>
            <option value="parts">Its parts (CIE 97:2005)</option>
          </SelectField>
        )}
      </div>
      {state === 'new' && mode === 'factor' && (
        <TextField label="Maintenance factor MF" inputMode="decimal" value={mf} onChange={(e) => setMf(e.target.value)} hint="From the lighting design, above 0 and at most 1, e.g. 0.8" />
      )}
      {state === 'new' && mode === 'parts' && (
        <div className="grid gap-3 sm:grid-cols-4">
          {PARTS.map(([k, label, what]) => (
            <TextField key={k} label={label} hint={what} inputMode="decimal" value={parts[k]} onChange={(e) => setParts((p) => ({ ...p, [k]: e.target.value }))} />
          ))}
          <p className="num text-sm text-ink-700 sm:col-span-4">MF = LLMF × LSF × LMF × RSMF = {Number.isFinite(product) && product > 0 ? product.toFixed(4) : '–'}</p>
        </div>
      )}
      <FormError error={set.error} />
      <Button type="submit" disabled={set.isPending}>{set.isPending ? 'Saving…' : 'Save'}</Button>
    </form>
  );
}

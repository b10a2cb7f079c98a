import { useState, type FormEvent } from 'react';
import { Trash2 } from 'lucide-react';
import { EMERGENCY_PASSES, type EmergencyCheck, type EmergencyPass, type Limit } from '@shared/core/emergency';
import { ELEMENT_KIND_LABELS, type CriteriaSetDto } from '@shared/schemas/emergency';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useCreateCriteriaSet } from '../api/create-criteria-set';
import { useUpdateCriteriaSet } from '../api/update-criteria-set';

const KIND_WORDS: Record<EmergencyCheck['kind'], string> = {
  min: 'Lowest point at least',
  average: 'Average at least',
  max_min_ratio: 'Emax:Emin at most',
  min_over_max: 'Emin/Emax at least',
  share_of_normal: 'Share of the normal lighting, and never below',
  response: 'Response time',
  route_width: 'Widest route judged as one (wider: strips)',
};
const SCOPE_WORDS = { centre_line: 'centre line', central_band: 'central band', area: 'area less border', equipment: 'equipment point', all: 'whole path' } as const;
const PASS_WORDS: Record<EmergencyPass | 'each', string> = { each: 'Each pass measured', initial: 'Initial pass', end_of_duration: 'End-of-duration pass' };

/** What a check is about, in words: "Lowest point at least · centre line · Escape route". */
export function checkTitle(c: EmergencyCheck): string {
  const scope = 'scope' in c ? ` · ${SCOPE_WORDS[c.scope]}` : '';
  return `${KIND_WORDS[c.kind]}${scope} · ${c.appliesTo.map((k) => ELEMENT_KIND_LABELS[k]).join(', ')}`;
}

/** The check's figure in words, e.g. "1 lx", "40:1", "50 % within 5 s". */
export function checkFigure(c: EmergencyCheck): string {
  const limit = (l: Limit) => `${l.value} ${l.unit}`;
  switch (c.kind) {
    case 'min': case 'average': return limit(c.limit);
    case 'max_min_ratio': return `${c.maxRatio}:1`;
    case 'min_over_max': return String(c.minRatio);
    case 'share_of_normal': return `${c.share * 100} % of the normal Em, at least ${limit(c.floor)}`;
    case 'response': return `${c.share * 100} % within ${c.withinS} s`;
    case 'route_width': return `${c.maxWidthM} m`;
  }
}

type Draft = { name: string; source: string; requiredPasses: EmergencyPass[]; notes: string; checks: EmergencyCheck[] };

/** A number typed in a field ("0,5" accepted), NaN when it is not one. */
const num = (s: string) => (s.trim() === '' ? NaN : Number(s.replace(',', '.')));

/** Problems the server would refuse, said per check before sending (the server checks again). */
function draftProblems(d: Draft): string[] {
  const out: string[] = [];
  if (!d.name.trim()) out.push('Give the set a name.');
  if (!d.source.trim()) out.push('Say what the set stands on (its source).');
  if (d.checks.length === 0) out.push('Keep at least one check.');
  for (const c of d.checks) {
    const figures: number[] = c.kind === 'min' || c.kind === 'average' ? [c.limit.value] : c.kind === 'max_min_ratio' ? [c.maxRatio] : c.kind === 'min_over_max' ? [c.minRatio]
      : c.kind === 'share_of_normal' ? [c.share, c.floor.value] : c.kind === 'response' ? [c.share, c.withinS] : [c.maxWidthM];
    if (figures.some((v) => !(Number.isFinite(v) && v > 0))) out.push(`Check "${c.id}": give each figure as a number above 0.`);
    if (c.kind === 'max_min_ratio' && c.maxRatio <= 1) out.push(`Check "${c.id}": Emax:Emin must allow more than 1:1.`);
    if ((c.kind === 'min_over_max' && c.minRatio > 1) || ((c.kind === 'share_of_normal' || c.kind === 'response') && c.share > 1)) out.push(`Check "${c.id}": a ratio or share is at most 1 (100 %).`);
    if (!c.source.trim()) out.push(`Check "${c.id}": name its source.`);
  }
  return out;
}

/**
 * Creates an own criteria set from a base (a built-in or own set) or edits an own one: name,
 * source, the passes it needs, notes, and each check's figure, pass and source. Checks can be
 * removed; their kinds and the elements they apply to come from the base.
 */
export function CriteriaSetEditor({ base, editKey, onDone }: { base: CriteriaSetDto; editKey: string | null; onDone: () => void }) {
  const [draft, setDraft] = useState<Draft>(() => ({
    name: editKey ? base.name : `${base.name} (own)`,
    source: editKey ? base.source : `Organisation policy based on ${base.source}`,
    requiredPasses: [...base.requiredPasses],
    notes: base.notes.join('\n'),
    checks: base.checks.map((c) => structuredClone(c)),
  }));
  const [problems, setProblems] = useState<string[]>([]);
  const create = useCreateCriteriaSet();
  const update = useUpdateCriteriaSet();
  const saving = create.isPending || update.isPending;

  const setCheck = (i: number, next: EmergencyCheck) => setDraft((d) => ({ ...d, checks: d.checks.map((c, j) => (j === i ? next : c)) }));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = draftProblems(draft);
    setProblems(found);
    if (found.length) return;
    const body = { name: draft.name.trim(), source: draft.source.trim(), requiredPasses: draft.requiredPasses, checks: draft.checks, notes: draft.notes.split('\n').map((n) => n.trim()).filter(Boolean) };
    if (editKey) update.mutate({ key: editKey, body }, { onSuccess: onDone });
    else create.mutate(body, { onSuccess: onDone });
  };

  return (
    <form onSubmit={submit} className="space-y-4" aria-label={editKey ? `Edit ${base.name}` : `New criteria set based on ${base.name}`} noValidate>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Name" value={draft.name} onChange={(e) => setDraft({ ...draft, name: e.target.value })} maxLength={120} required />
        <TextField label="Source" value={draft.source} onChange={(e) => setDraft({ ...draft, source: e.target.value })} maxLength={300} required hint="What the set stands on: a standard, a code, your policy" />
      </div>
      <fieldset>
        <legend className="mb-1 text-sm font-medium text-ink-800">Passes without which compliance is not shown</legend>
        <div className="flex flex-wrap gap-4">
          {EMERGENCY_PASSES.map((p) => (
            <label key={p} className="flex items-center gap-2 text-sm text-ink-800">
              <input type="checkbox" className="h-4 w-4 rounded" checked={draft.requiredPasses.includes(p)}
                onChange={(e) => setDraft({ ...draft, requiredPasses: e.target.checked ? EMERGENCY_PASSES.filter((q) => q === p || draft.requiredPasses.includes(q)) : draft.requiredPasses.filter((q) => q !== p) })} />
              {PASS_WORDS[p]}
            </label>
          ))}
        </div>
      </fieldset>
      <ol className="space-y-3" aria-label="Checks">
        {draft.checks.map((c, i) => (
          <li key={`${c.id}-${i}`} className="rounded-lg p-3 ring-1 ring-ink-200">
            <fieldset className="space-y-2">
              <legend className="flex w-full flex-wrap items-center justify-between gap-2 text-sm font-medium text-ink-900">
                <span><span className="num mr-2 text-ink-500">{c.id}</span>{checkTitle(c)}</span>
              </legend>
              <div className="grid gap-2 sm:grid-cols-3">
                <CheckFigures check={c} onChange={(next) => setCheck(i, next)} />
                {c.kind !== 'route_width' && (
                  <SelectField label="Judged in" value={c.pass} onChange={(e) => setCheck(i, { ...c, pass: e.target.value as EmergencyCheck['pass'] })}>
                    {(['each', ...EMERGENCY_PASSES] as const).map((p) => <option key={p} value={p}>{PASS_WORDS[p]}</option>)}
                  </SelectField>
                )}
              </div>
              <TextField label={`Source of ${c.id}`} value={c.source} onChange={(e) => setCheck(i, { ...c, source: e.target.value })} maxLength={300} required />
              <Button type="button" size="sm" variant="ghost" onClick={() => setDraft((d) => ({ ...d, checks: d.checks.filter((_, j) => j !== i) }))} aria-label={`Remove check ${c.id}`}>
                <Trash2 className="h-4 w-4" aria-hidden />Remove
              </Button>
            </fieldset>
          </li>
        ))}
      </ol>
      <TextAreaField label="Notes (one per line, printed in reports)" value={draft.notes} onChange={(e) => setDraft({ ...draft, notes: e.target.value })} rows={3} />
      {problems.length > 0 && (
        <ul role="alert" className="space-y-1 rounded-lg bg-short-50 px-3 py-2 text-sm text-short-800">{problems.map((p) => <li key={p}>{p}</li>)}</ul>
      )}
      <FormError error={create.error ?? update.error} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={saving}>{editKey ? 'Save changes' : 'Create criteria set'}</Button>
        <Button type="button" variant="secondary" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

/** The figure fields of one check, by its kind. */
function CheckFigures({ check: c, onChange }: { check: EmergencyCheck; onChange: (c: EmergencyCheck) => void }) {
  const field = (label: string, value: number, set: (v: number) => void, hint?: string) => (
    <TextField label={`${label} (${c.id})`} inputMode="decimal" defaultValue={String(value)} onChange={(e) => set(num(e.target.value))} hint={hint} />
  );
  const unit = (l: Limit, set: (l: Limit) => void) => (
    <SelectField label={`Unit (${c.id})`} value={l.unit} onChange={(e) => set({ ...l, unit: e.target.value as Limit['unit'] })}>
      <option value="lx">lx</option>
      <option value="fc">fc (exact 10.763910417 lx)</option>
    </SelectField>
  );
  switch (c.kind) {
    case 'min':
    case 'average':
      return <>{field('Limit', c.limit.value, (v) => onChange({ ...c, limit: { ...c.limit, value: v } }))}{unit(c.limit, (l) => onChange({ ...c, limit: l }))}</>;
    case 'max_min_ratio':
      return field('Emax:Emin at most N:1, N', c.maxRatio, (v) => onChange({ ...c, maxRatio: v }));
    case 'min_over_max':
      return field('Emin/Emax at least', c.minRatio, (v) => onChange({ ...c, minRatio: v }));
    case 'share_of_normal':
      return <>{field('Share of normal Em (0-1)', c.share, (v) => onChange({ ...c, share: v }), 'EN 1838: 0.1 (10 %)')}{field('Never below', c.floor.value, (v) => onChange({ ...c, floor: { ...c.floor, value: v } }))}</>;
    case 'response':
      return <>{field('Share of the level (0-1)', c.share, (v) => onChange({ ...c, share: v }))}{field('Within seconds', c.withinS, (v) => onChange({ ...c, withinS: v }))}</>;
    case 'route_width':
      return field('Width in metres', c.maxWidthM, (v) => onChange({ ...c, maxWidthM: v }));
  }
}

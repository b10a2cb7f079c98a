import { useState, type FormEvent } from 'react';
import { paths } from '@shared/paths';
import { useNavigate } from 'react-router';
import { SYSTEM_TYPES, SYSTEM_TYPE_LABELS } from '@shared/schemas/emergency';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useCriteriaSets } from '../api/get-criteria-sets';
import { useCreateEmergencySurvey } from '../api/create-emergency-survey';
import { siteLocalToIso } from '@shared/datetime';

type SiteOption = { id: number; name: string; timeZone: string };

/** Starts an emergency survey: which site, which criteria, and how the test was run. */
export function StartSurveyForm({ sites }: { sites: readonly SiteOption[] }) {
  const sets = useCriteriaSets();
  const create = useCreateEmergencySurvey();
  const navigate = useNavigate();
  const [siteId, setSiteId] = useState(sites[0]?.id ?? 0);
  const [name, setName] = useState('');
  const [setKey, setSetKey] = useState('en-1838-2013');
  const [system, setSystem] = useState<(typeof SYSTEM_TYPES)[number]>('self_contained');
  const [rated, setRated] = useState('180');
  const [mainsOff, setMainsOff] = useState('');
  const [normalOff, setNormalOff] = useState(true);
  const [dark, setDark] = useState(true);
  const site = sites.find((s) => s.id === Number(siteId));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!site) return;
    create.mutate({
      siteId: site.id, name, criteriaSetKey: setKey,
      conditions: { systemType: system, ratedDurationMin: Number(rated), mainsOffAt: siteLocalToIso(mainsOff, site.timeZone), normalLightingOff: normalOff, daylightExcluded: dark },
    }, { onSuccess: (s) => navigate(paths.emergencySurvey.to(s.surveyId)) });
  };

  return (
    <form onSubmit={submit} className="space-y-3" aria-label="Start an emergency survey">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Site" value={siteId} onChange={(e) => setSiteId(Number(e.target.value))}>
          {sites.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
        </SelectField>
        <TextField label="Survey name" value={name} onChange={(e) => setName(e.target.value)} required maxLength={160} placeholder="Annual night test" />
        <SelectField label="Criteria set" value={setKey} onChange={(e) => setSetKey(e.target.value)}>
          {(sets.data?.items ?? []).map((s) => <option key={s.key} value={s.key}>{s.name}{s.builtIn ? '' : ' (own)'}</option>)}
        </SelectField>
        <SelectField label="System" value={system} onChange={(e) => setSystem(e.target.value as typeof system)}>
          {SYSTEM_TYPES.map((t) => <option key={t} value={t}>{SYSTEM_TYPE_LABELS[t]}</option>)}
        </SelectField>
        <TextField label="Rated duration (min)" inputMode="numeric" value={rated} onChange={(e) => setRated(e.target.value)} hint="60, 90 or 180 are usual" />
        <TextField label={`Mains cut at (${site?.timeZone ?? 'site time'})`} type="datetime-local" value={mainsOff} onChange={(e) => setMainsOff(e.target.value)} required />
      </div>
      <div className="flex flex-wrap gap-4 text-sm text-ink-800">
        <label className="flex items-center gap-2"><input type="checkbox" checked={normalOff} onChange={(e) => setNormalOff(e.target.checked)} className="h-4 w-4 rounded" />Normal lighting off</label>
        <label className="flex items-center gap-2"><input type="checkbox" checked={dark} onChange={(e) => setDark(e.target.checked)} className="h-4 w-4 rounded" />Daylight excluded</label>
      </div>
      <FormError error={create.error} />
      <Button type="submit" busy={create.isPending} disabled={!site}>Start emergency survey</Button>
    </form>
  );
}

import { useState, type FormEvent } from 'react';
import type { TestSchedule } from '@shared/core/emergency-schedule';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useSetTestSchedule } from '../api/set-test-schedule';

/**
 * The organisation's test intervals: a functional test every N days and a full-duration test
 * every M months (defaults 30 days and 12 months: NFPA 101 §7.9.3 via secondary sources;
 * EN 50172 / BS 5266-1 monthly and annual, from memory). Read-only for those who may not change it.
 */
export function ScheduleForm({ schedule, canEdit }: { schedule: TestSchedule; canEdit: boolean }) {
  const [days, setDays] = useState(String(schedule.functionalEveryDays));
  const [months, setMonths] = useState(String(schedule.fullDurationEveryMonths));
  const [problem, setProblem] = useState<string | null>(null);
  const save = useSetTestSchedule();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const d = Number(days), m = Number(months);
    if (!Number.isInteger(d) || d < 1 || d > 366) { setProblem('Functional test interval: a whole number of days from 1 to 366.'); return; }
    if (!Number.isInteger(m) || m < 1 || m > 60) { setProblem('Full-duration test interval: a whole number of months from 1 to 60.'); return; }
    setProblem(null);
    save.mutate({ functionalEveryDays: d, fullDurationEveryMonths: m });
  };
  return (
    <form onSubmit={submit} className="space-y-3" aria-label="Test schedule" noValidate>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Functional test every (days)" inputMode="numeric" value={days} onChange={(e) => setDays(e.target.value)} disabled={!canEdit} hint="Default 30 days (NFPA 101 §7.9.3; EN 50172: monthly)" />
        <TextField label="Full-duration test every (months)" inputMode="numeric" value={months} onChange={(e) => setMonths(e.target.value)} disabled={!canEdit} hint="Default 12 months (NFPA 101 §7.9.3; EN 50172: annual)" />
      </div>
      <p className="text-xs text-ink-500">A full-duration test also counts as a functional test. A competent person and the local codes decide what testing an installation needs.</p>
      {problem && <p role="alert" className="text-sm text-short-700">{problem}</p>}
      <FormError error={save.error} />
      {save.isSuccess && !save.isPending && <p role="status" className="text-sm text-meets-700">Saved: every site's due dates now follow these intervals.</p>}
      {canEdit ? <Button type="submit" busy={save.isPending}>Save schedule</Button> : <p className="text-sm text-ink-500">Only an administrator can change the schedule.</p>}
    </form>
  );
}

import { EMERGENCY_PASSES, type EmergencyPass } from '@shared/core/emergency';
import type { EmergencySurvey } from '@shared/schemas/emergency';
import { SelectField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useSetLogPass } from '../api/set-log-pass';
import { formatDateTime } from '@shared/datetime';

const CHOICE_WORDS: Record<EmergencyPass | 'by_time', string> = {
  by_time: 'Split by time after the mains failed',
  initial: 'All initial (right after the mains failed)',
  end_of_duration: 'All end-of-duration',
};

/** The survey's logs and which pass each holds: said by the surveyor, or split by time. */
export function LogPasses({ survey }: { survey: EmergencySurvey }) {
  const setPass = useSetLogPass();
  if (survey.logs.length === 0) return <p className="text-sm text-ink-500">No log uploaded yet.</p>;
  return (
    <div className="space-y-2">
      <FormError error={setPass.error} />
      <ul className="divide-y divide-ink-100" aria-label="Logs and their passes">
        {survey.logs.map((l) => (
          <li key={l.importId} className="flex flex-wrap items-end justify-between gap-3 py-2">
            <div className="min-w-0">
              <p className="break-all font-medium text-ink-900">{l.filename}</p>
              <p className="text-xs text-ink-500">{l.readings} readings · uploaded {formatDateTime(l.uploadedAt, survey.siteTimeZone)}</p>
            </div>
            <SelectField label={`Pass of ${l.filename}`} className="w-full sm:w-80" value={l.pass ?? 'by_time'} disabled={!survey.canEdit || setPass.isPending}
              onChange={(e) => setPass.mutate({ surveyId: survey.surveyId, importId: l.importId, pass: e.target.value === 'by_time' ? null : (e.target.value as EmergencyPass) })}>
              {(['by_time', ...EMERGENCY_PASSES] as const).map((k) => <option key={k} value={k}>{CHOICE_WORDS[k]}</option>)}
            </SelectField>
          </li>
        ))}
      </ul>
    </div>
  );
}

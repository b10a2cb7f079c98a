import { SYSTEM_TYPE_LABELS, type EmergencySurvey } from '@shared/schemas/emergency';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { EmergencyVerdictBadge } from './emergency-verdict';
import { formatDateTime } from '@shared/datetime';

const PASS_WORD = { initial: 'Initial pass (right after the mains failed)', end_of_duration: 'End-of-duration pass' } as const;
const minutes = (v: number | null) => (v === null ? '–' : `${v.toFixed(0)} min`);

/** What the survey is judged against, how it was measured, and its passes. */
export function SurveySummary({ survey }: { survey: EmergencySurvey }) {
  const c = survey.conditions;
  const counts = survey.elements.reduce<Record<string, number>>((a, e) => ({ ...a, [e.verdict]: (a[e.verdict] ?? 0) + 1 }), {});
  return (
    <Card>
      <CardHeader title="Criteria, conditions and passes" actions={<EmergencyVerdictBadge verdict={survey.verdict} />}
        description={`${counts.meets ?? 0} meet, ${counts.falls_short ?? 0} fall short, ${counts.inconclusive ?? 0} inconclusive, ${counts.not_judged ?? 0} not judged`} />
      <CardBody className="space-y-3 text-sm">
        <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[10rem_1fr]">
          <dt className="text-ink-500">Criteria set</dt><dd>{survey.criteriaSet.name}{survey.criteriaSet.builtIn ? '' : ' (your organisation\'s)'} <span className="block text-xs text-ink-500">{survey.criteriaSet.source}</span></dd>
          <dt className="text-ink-500">Decision rule</dt><dd>{survey.ruleText}</dd>
          <dt className="text-ink-500">System</dt><dd>{SYSTEM_TYPE_LABELS[c.systemType]}, rated {c.ratedDurationMin} min</dd>
          <dt className="text-ink-500">Mains cut</dt><dd>{c.mainsOffAt ? formatDateTime(c.mainsOffAt, survey.siteTimeZone) : '–'} ({survey.siteTimeZone})</dd>
          <dt className="text-ink-500">Normal lighting</dt><dd>{c.normalLightingOff ? 'Off' : 'On: readings include it'}; daylight {c.daylightExcluded ? 'excluded' : 'present'}</dd>
        </dl>
        {survey.frozenAt && (
          <p className="rounded-lg bg-ink-50 px-3 py-2 text-ink-700 ring-1 ring-ink-100" data-testid="frozen-note">
            Signed off {survey.frozenAt ? formatDateTime(survey.frozenAt, survey.siteTimeZone) : '–'}: the verdicts, criteria set and logbook shown here and in the report are those frozen then; later changes do not alter them.
          </p>
        )}
        <ul className="grid gap-2 sm:grid-cols-2" aria-label="Passes">
          {survey.passes.map((p) => (
            <li key={p.pass} className="rounded-lg bg-ink-50 px-3 py-2 ring-1 ring-ink-100" data-testid={`pass-${p.pass}`}>
              <p className="font-medium text-ink-900">{PASS_WORD[p.pass]}</p>
              <p className="text-ink-600">{p.readings ? <>{p.readings} readings, {minutes(p.fromMin)} to {minutes(p.toMin)} after the mains failed</> : 'Not measured yet'}</p>
            </li>
          ))}
        </ul>
        {survey.warnings.length > 0 && (
          <ul className="space-y-1 text-unsure-700" aria-label="Warnings">{survey.warnings.map((w) => <li key={w}>{w}</li>)}</ul>
        )}
        {survey.criteriaSet.notes.map((n) => <p key={n} className="text-xs text-ink-500">{n}</p>)}
      </CardBody>
    </Card>
  );
}

import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { AlertTriangle, Download, RefreshCw } from 'lucide-react';
import { can } from '@shared/policy';
import { formatCalendarDay } from '@shared/datetime';
import type { Role } from '@shared/roles';
import { READING_FLAG_LABELS } from '@shared/schemas/readings';
import { READING_FLAGS } from '@shared/core/types';
import type { SurveyDetail } from '@shared/schemas/surveys';
import type { PlanListResponse } from '@shared/schemas/plans';
import type { UseQueryResult } from '@tanstack/react-query';
import { useSurvey } from '../api/get-survey';
import { useRedecodeSurvey } from '../api/redecode-survey';
import { useDecodeChanges } from '../api/get-decode-changes';
import { SurveyStatusBadge } from './status-badge';
import { FlagBadge, ReadingsTable } from './readings-table';
import { LogUpload } from './log-upload';
import { WalkChart } from './walk-chart';
import { useUnits } from '@/lib/units';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { ConfirmAction } from '@/components/ui/confirm-action';
import { FormError } from '@/components/ui/form-error';
import { QueryState } from '@/components/ui/states';
import { apiFiles, paths } from '@shared/paths';

function Summary({ survey }: { survey: SurveyDetail }) {
  const flagged = READING_FLAGS.filter((f) => f !== 'ok' && survey.flagCounts[f]);
  return (
    <dl className="grid gap-4 sm:grid-cols-4">
      <div><dt className="text-xs uppercase tracking-wide text-ink-500">Readings</dt><dd className="num text-2xl font-semibold">{survey.readingCount.toLocaleString('en-GB')}</dd></div>
      <div><dt className="text-xs uppercase tracking-wide text-ink-500">Logs imported</dt><dd className="num text-2xl font-semibold">{survey.imports.filter((i) => i.status === 'done').length}</dd></div>
      <div>
        <dt className="text-xs uppercase tracking-wide text-ink-500">Calibration lapsed</dt>
        <dd className="num text-2xl font-semibold">{survey.calibrationLapsedCount.toLocaleString('en-GB')}</dd>
        {survey.calibrationLapsedCount > 0 && <dd className="text-xs text-unsure-700">readings decoded with a coefficient set past its due date</dd>}
      </div>
      <div>
        <dt className="text-xs uppercase tracking-wide text-ink-500">Flagged</dt>
        <dd className="mt-1 flex flex-wrap gap-1">
          {flagged.length === 0 ? <span className="text-sm text-ink-600">none</span> : flagged.map((f) => (
            <span key={f} className="inline-flex items-center gap-1"><FlagBadge flag={f} /><span className="num text-sm" aria-label={`${READING_FLAG_LABELS[f]} count`}>{survey.flagCounts[f]}</span></span>
          ))}
        </dd>
      </div>
    </dl>
  );
}

function Imports({ survey }: { survey: SurveyDetail }) {
  if (survey.imports.length === 0) return null;
  return (
    <ul className="mt-4 divide-y divide-ink-100 text-sm" aria-label="Imported logs">
      {survey.imports.map((i) => (
        <li key={i.id} className="flex flex-wrap justify-between gap-2 py-1.5">
          <span className="font-medium">{i.filename}</span>
          <span className="text-ink-600">{i.status === 'done' ? `${i.readings.toLocaleString('en-GB')} readings from ${i.rowsRead.toLocaleString('en-GB')} rows` : i.status === 'failed' ? `rejected (${i.errorCount} problem${i.errorCount === 1 ? '' : 's'})` : i.status}</span>
        </li>
      ))}
    </ul>
  );
}

function Redecode({ survey }: { survey: SurveyDetail }) {
  const redecode = useRedecodeSurvey(survey.id);
  const changes = useDecodeChanges(survey.id);
  const current = changes.data?.decodedWithCurrentSets;
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm text-ink-600">
        Decoded {survey.decodes.length} time{survey.decodes.length === 1 ? '' : 's'}; earlier decodes stay recorded.
        Re-decode after calibration staff approve a corrected coefficient set.
      </p>
      {current === true && <p className="text-sm text-ink-700" role="status">Every reading was decoded with the approved set in force at its time: a re-decode would change nothing.</p>}
      {current === false && (
        <div>
          <ConfirmAction variant="secondary" busy={redecode.isPending}
            trigger={<><RefreshCw className="h-4 w-4" aria-hidden />Re-decode with current coefficients…</>}
            consequence={<>A newer approved coefficient set applies to some readings. Re-decoding decodes all {survey.readingCount.toLocaleString('en-GB')} readings again from the kept samples; the new decode replaces the current one for verdicts, maps and exports. The earlier decode stays recorded, but this cannot be undone.</>}
            confirmLabel={<><RefreshCw className="h-4 w-4" aria-hidden />Re-decode now</>}
            onConfirm={() => redecode.mutate()} />
        </div>
      )}
      {redecode.isSuccess && <p role="status" className="text-sm text-meets-700">Re-decoded: {redecode.data.readings.toLocaleString('en-GB')} readings in decode {redecode.data.decodeId}.</p>}
      {changes.data?.before && <p className="text-sm"><Link className="font-medium text-lamp-700 underline" to={paths.decodeChanges.to(survey.id)}>What the latest re-decode changed</Link></p>}
      <FormError error={redecode.error ?? changes.error} />
    </div>
  );
}

export function SurveyPage({ surveyId, role, sitePlans, plannedPoints }: {
  surveyId: number; role: Role; sitePlans: UseQueryResult<PlanListResponse>;
  /** The planned points card, composed by the route from the grids feature. */
  plannedPoints?: ReactNode;
}) {
  const survey = useSurvey(surveyId);
  const units = useUnits();
  return (
    <Page>
      <QueryState query={survey}>
        {(s) => (
          <>
            <PageHeader
              eyebrow={<Link to={paths.surveys.to()} className="hover:underline">Surveys · {s.siteName}</Link>}
              title={s.name}
              description={<span className="inline-flex flex-wrap items-center gap-2"><SurveyStatusBadge status={s.status} />{s.startedOn && <span>started {formatCalendarDay(s.startedOn)}</span>}{s.conditions && <span>{s.conditions.daylightExcluded ? 'daylight excluded' : 'daylight included'}</span>}</span>}
            />
            <div className="flex flex-col gap-6">
              <Card><CardBody><Summary survey={s} /><Imports survey={s} /></CardBody></Card>
              {plannedPoints}
              {s.abilities.upload && (
                <Card>
                  <CardHeader title="Add a meter log" description="A file with any problem is rejected whole; nothing from it is stored." />
                  <CardBody><LogUpload surveyId={s.id} plans={sitePlans} timeZone={s.siteTimeZone} /></CardBody>
                </Card>
              )}
              {!s.abilities.upload && can(role, 'surveys.upload') && (
                <p className="flex items-center gap-2 text-sm text-ink-600"><AlertTriangle className="h-4 w-4" aria-hidden />Logs can be added only while the survey is a draft or returned for changes.</p>
              )}
              <Card>
                <CardHeader title="The walk" description={`Illuminance (${units.label}, log scale) over time, and the gain code the meter used.`} />
                <CardBody><WalkChart surveyId={s.id} timeZone={s.siteTimeZone} /></CardBody>
              </Card>
              <Card>
                <CardHeader
                  title="Readings"
                  description="U is the expanded uncertainty (k = 2, about 95 %). ≥ marks an over-range lower bound, ≤ an under-range upper bound."
                  actions={<a className="inline-flex items-center gap-2 rounded-lg bg-white px-2.5 py-1.5 text-sm font-medium ring-1 ring-inset ring-ink-200 hover:bg-ink-50" href={apiFiles.surveyReadingsCsv(s.id, units.unit === 'fc' ? 'fc' : 'lux')} download><Download className="h-4 w-4" aria-hidden />Export CSV ({units.label})</a>}
                />
                <ReadingsTable surveyId={s.id} timeZone={s.siteTimeZone} />
              </Card>
              {can(role, 'surveys.redecode') && s.imports.some((i) => i.status === 'done') && (
                <Card><CardHeader title="Re-decode" /><CardBody><Redecode survey={s} /></CardBody></Card>
              )}
              <p className="text-xs text-ink-500">
                Readings support a survey; they do not certify emergency lighting. Local codes and a qualified lighting professional take precedence, especially for stairs, exits and emergency routes.
              </p>
            </div>
          </>
        )}
      </QueryState>
    </Page>
  );
}

import { useMemo, useState } from 'react';
import { Link, useParams } from 'react-router';
import { TriangleAlert } from 'lucide-react';
import { can } from '@shared/policy';
import { formatCalendarDay } from '@shared/datetime';
import { SURVEY_STATUS_LABELS } from '@shared/schemas/surveys';
import { VERDICT_LABELS, VERDICTS, type ComplianceResponse } from '@shared/schemas/compliance';
import type { Zone } from '@shared/schemas/zones';
import { useCurrentUser } from '@/app/current-user';
import { useSurveyCompliance } from '@/features/compliance/api/get-survey-compliance';
import { useInvalidateCompliance } from '@/features/compliance/api/use-invalidate-compliance';
import { InstallationForm } from '@/features/surveys/components/installation-form';
import { ZoneTable } from '@/features/compliance/components/zone-table';
import { RuleNote } from '@/features/compliance/components/rule-note';
import { SafetyCaution } from '@/features/compliance/components/safety-caution';
import { VerdictBadge, VERDICT_FILL } from '@/features/compliance/components/verdict-badge';
import { TaskBandsLayer, TaskBandsLegend, taskBandsOf } from '@/features/compliance/components/task-bands-layer';
import { WorkflowActions } from '@/features/compliance/components/workflow-actions';
import { ReportDownloads } from '@/features/reports/components/report-downloads';
import { SendReportForm } from '@/features/reports/components/send-report-form';
import { useSitePlans } from '@/features/plans/api/get-site-plans';
import { useZones } from '@/features/plans/api/get-zones';
import { useSurveyMap } from '@/features/plans/api/get-survey-map';
import { SurveyMapView } from '@/components/plan-map/survey-map-view';
import { Badge } from '@/components/ui/badge';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { SelectField } from '@/components/ui/field';
import { Page, PageHeader } from '@/components/ui/page';
import { EmptyState, QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

/** One survey for the facility manager: worst zones first, the map shaded by verdict, sign-off and reports. */
export function SurveyComplianceRoute() {
  const surveyId = Number(useParams().surveyId);
  const user = useCurrentUser();
  const compliance = useSurveyCompliance(surveyId);
  const invalidate = useInvalidateCompliance();
  return (
    <Page>
      <QueryState query={compliance} loadingLabel="Judging the zones…">
        {(c) => (
          <div className="space-y-6">
            <PageHeader
              eyebrow={<Link to={paths.compliance.to()} className="hover:underline">{c.siteName}</Link>}
              title={c.surveyName}
              description={`${c.startedOn ? formatCalendarDay(c.startedOn) : 'No date'} · ${c.counts.meets} meet, ${c.counts.falls_short} fall short, ${c.counts.inconclusive} inconclusive, ${c.counts.not_assessed} not assessed`}
              actions={<Badge tone={c.status === 'signed_off' ? 'good' : c.status === 'returned' ? 'unsure' : 'info'}>{SURVEY_STATUS_LABELS[c.status]}</Badge>}
            />
            <RuleNote rule={c.rule} ruleText={c.ruleText} frozen={c.frozen} />
            {c.warnings.length > 0 && (
              <ul className="space-y-1 rounded-lg bg-lamp-50 p-3 text-sm text-lamp-900 ring-1 ring-lamp-200">
                {c.warnings.map((w, i) => <li key={i} className="flex gap-2"><TriangleAlert className="mt-0.5 h-4 w-4 shrink-0 text-lamp-600" aria-hidden />{w}</li>)}
              </ul>
            )}
            <Card>
              <CardHeader title="Installation" description={c.installationText} />
              {c.abilities.setInstallation && (
                <CardBody><InstallationForm surveyId={surveyId} current={c.installation} onChanged={() => invalidate(surveyId)} /></CardBody>
              )}
            </Card>
            <Card>
              <CardHeader title="Review" description={c.previous ? `Compared with “${c.previous.name}”, the previous signed-off survey of this site.` : 'No earlier signed-off survey of this site to compare with.'} />
              <CardBody><WorkflowActions surveyId={surveyId} status={c.status} abilities={c.abilities} reviewComment={c.reviewComment} record={c} /></CardBody>
            </Card>
            <Card>
              <CardHeader title="Zones, worst first" description={`Grid rule: ${c.gridRule}`} />
              {c.zones.length === 0
                ? <EmptyState title="No zones on this site's plans yet">Draw zones on the site's plans to get verdicts.</EmptyState>
                : <ZoneTable surveyId={surveyId} zones={c.zones} showChange={c.previous !== null} />}
            </Card>
            <VerdictMap compliance={c} />
            <Card>
              <CardHeader title="Report and exports" description={c.frozen ? 'The report shows the verdicts frozen at sign-off.' : 'Not signed off yet: the report is marked provisional.'} />
              <CardBody className="space-y-5">
                <ReportDownloads surveyId={surveyId} />
                {can(user.role, 'reports.send') && <SendReportForm surveyId={surveyId} />}
              </CardBody>
            </Card>
            <SafetyCaution />
          </div>
        )}
      </QueryState>
    </Page>
  );
}

/** The plan-map component (plans feature) with zones shaded by this survey's verdicts. */
function VerdictMap({ compliance }: { compliance: ComplianceResponse }) {
  const plans = useSitePlans(compliance.siteId);
  const [chosen, setChosen] = useState<number | undefined>(undefined);
  const firstWithVerdicts = compliance.zones.find((z) => z.verdict !== 'not_assessed')?.planId;
  const planId = chosen ?? firstWithVerdicts ?? plans.data?.items[0]?.id;
  const zones = useZones(planId);
  const map = useSurveyMap(planId !== undefined ? compliance.surveyId : undefined, planId);
  const verdictOf = useMemo(() => new Map(compliance.zones.map((z) => [z.zoneId, z.verdict])), [compliance.zones]);
  const fill = (z: Zone) => {
    const v = verdictOf.get(z.id);
    return v ? { colour: VERDICT_FILL[v], opacity: 0.35, label: VERDICT_LABELS[v] } : null;
  };
  const plan = plans.data?.items.find((p) => p.id === planId);
  const bands = useMemo(() => (planId === undefined ? [] : taskBandsOf(compliance.zones, planId)), [compliance.zones, planId]);
  const [showBands, setShowBands] = useState(true);
  return (
    <Card>
      <CardHeader title="On the plan" description="Zones shaded by verdict; points coloured by illuminance." actions={plans.data && plans.data.items.length > 1 ? (
        <SelectField label="Plan" value={planId ?? ''} onChange={(e) => setChosen(Number(e.target.value))} className="min-w-48">
          {plans.data.items.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
        </SelectField>
      ) : undefined} />
      <CardBody>
        <QueryState query={plans} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="This site has no plan yet" />}>
          {() => !plan ? null : (
            <QueryState query={zones}>
              {(z) => (
                <QueryState query={map} loadingLabel="Placing the readings…">
                  {(m) => (
                    <SurveyMapView plan={plan} zones={z.items} map={m} zoneFill={(zone) => fill(zone)}
                      extraLayers={showBands && bands.length > 0 ? <TaskBandsLayer bands={bands} /> : undefined}
                      zoneLegend={(
                        <div className="space-y-2">
                          <ul className="flex flex-wrap gap-2 text-xs" aria-label="Zone shading">{VERDICTS.map((v) => <li key={v} className="inline-flex items-center gap-1"><span className="inline-block h-3 w-3 rounded-sm" style={{ background: VERDICT_FILL[v], opacity: 0.6 }} aria-hidden /><VerdictBadge verdict={v} /></li>)}</ul>
                          {bands.length > 0 && (
                            <>
                              <label className="inline-flex min-h-11 items-center gap-2 text-sm sm:min-h-0">
                                <input type="checkbox" checked={showBands} onChange={(e) => setShowBands(e.target.checked)} />
                                Bands around task areas
                              </label>
                              {showBands && <TaskBandsLegend bands={bands} />}
                            </>
                          )}
                        </div>
                      )} />
                  )}
                </QueryState>
              )}
            </QueryState>
          )}
        </QueryState>
      </CardBody>
    </Card>
  );
}

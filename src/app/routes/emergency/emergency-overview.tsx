import { useState } from 'react';
import { paths } from '@shared/paths';
import { Link } from 'react-router';
import { can } from '@shared/policy';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';
import { SelectField } from '@/components/ui/field';
import { useSites } from '@/features/surveys/api/get-sites';
import { useSitePlans } from '@/features/plans/api/get-site-plans';
import { useTestsDue } from '@/features/emergency/api/get-tests-due';
import { useEmergencySurveys } from '@/features/emergency/api/get-emergency-surveys';
import { SitesDue } from '@/features/emergency/components/tests-due';
import { StartSurveyForm } from '@/features/emergency/components/start-survey-form';
import { EmergencyCaution } from '@/features/emergency/components/emergency-caution';
import { formatCalendarDay } from '@shared/datetime';
import { SURVEY_STATUS_LABELS } from '@shared/schemas/surveys';
import { useCurrentUser } from '../../current-user';

/**
 * The safety officer's start: which tests are due or overdue where, the emergency surveys,
 * starting one, and where the routes are drawn.
 */
export function EmergencyOverviewRoute() {
  const me = useCurrentUser();
  const due = useTestsDue();
  const surveys = useEmergencySurveys();
  const sites = useSites();
  const [planSite, setPlanSite] = useState<number | undefined>(undefined);
  const siteForPlans = planSite ?? sites.data?.items[0]?.id;
  const plans = useSitePlans(siteForPlans);
  return (
    <Page>
      <PageHeader title="Emergency lighting" description="Tests due, night surveys of escape routes and areas, and the routes on each plan." />
      <div className="space-y-6">
        <EmergencyCaution />
        <Card>
          <CardHeader title="Tests due" description="Functional and full-duration tests per site, from each site's logbook."
            actions={<Link to={paths.emergencyCriteria.to()} className="text-sm font-medium text-lamp-800 underline">Criteria sets and test schedule</Link>} />
          <CardBody>
            <QueryState query={due} isEmpty={(d) => d.sites.length === 0}>{(d) => <SitesDue sites={d.sites} />}</QueryState>
          </CardBody>
        </Card>
        <Card>
          <CardHeader title="Emergency surveys" />
          <CardBody>
            <QueryState query={surveys} isEmpty={(d) => d.items.length === 0} empty={<p className="text-sm text-ink-500">No emergency survey yet.</p>}>
              {(d) => (
                <ul className="divide-y divide-ink-100">
                  {d.items.map((s) => (
                    <li key={s.surveyId} className="flex flex-wrap items-center justify-between gap-2 py-2">
                      <Link to={paths.emergencySurvey.to(s.surveyId)} className="font-medium text-lamp-800 underline-offset-2 hover:underline">{s.name}</Link>
                      <span className="text-sm text-ink-500">{s.siteName} · {s.startedOn ? formatCalendarDay(s.startedOn) : formatCalendarDay(s.createdAt.slice(0, 10))} · {(SURVEY_STATUS_LABELS as Record<string, string>)[s.status] ?? s.status}</span>
                    </li>
                  ))}
                </ul>
              )}
            </QueryState>
          </CardBody>
        </Card>
        {can(me.role, 'surveys.write') && (
          <Card>
            <CardHeader title="Start an emergency survey" description="Upload its two-pass log afterwards on the survey's page." />
            <CardBody>
              <QueryState query={sites} isEmpty={(d) => d.items.length === 0}>{(d) => <StartSurveyForm sites={d.items} />}</QueryState>
            </CardBody>
          </Card>
        )}
        <Card>
          <CardHeader title="Routes and areas on the plans" />
          <CardBody className="space-y-3">
            <QueryState query={sites}>
              {(d) => (
                <SelectField label="Site" value={siteForPlans ?? ''} onChange={(e) => setPlanSite(Number(e.target.value))} className="max-w-sm">
                  {d.items.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
                </SelectField>
              )}
            </QueryState>
            {siteForPlans !== undefined && (
              <QueryState query={plans} isEmpty={(d) => d.items.length === 0} empty={<p className="text-sm text-ink-500">This site has no plan yet: upload one under Plans.</p>}>
                {(d) => (
                  <ul className="flex flex-wrap gap-2">
                    {d.items.map((p) => <li key={p.id}><Link to={paths.emergencyPlan.to(p.id)} className="inline-block rounded-lg bg-ink-50 px-3 py-2 text-sm font-medium text-ink-800 ring-1 ring-ink-200 hover:ring-lamp-300">{p.name}</Link></li>)}
                  </ul>
                )}
              </QueryState>
            )}
            <p className="text-sm"><Link className="text-lamp-800 underline" to={siteForPlans ? paths.emergencyLogbook.to(siteForPlans) : paths.emergency.to()}>Open this site's test logbook</Link></p>
          </CardBody>
        </Card>
      </div>
    </Page>
  );
}

import { Link, useParams } from 'react-router';
import { apiFiles, paths } from '@shared/paths';
import { FileDown } from 'lucide-react';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';
import { useUnits } from '@/lib/units';
import { useSitePlans } from '@/features/plans/api/get-site-plans';
import { useSurvey } from '@/features/surveys/api/get-survey';
import { LogUpload } from '@/features/surveys/components/log-upload';
import { useEmergencySurvey } from '@/features/emergency/api/get-emergency-survey';
import { SurveySummary } from '@/features/emergency/components/survey-summary';
import { ElementVerdicts } from '@/features/emergency/components/element-verdicts';
import { EmergencyMap } from '@/features/emergency/components/emergency-map';
import { EmergencyCaution } from '@/features/emergency/components/emergency-caution';
import { LogPasses } from '@/features/emergency/components/log-passes';
import { WorkflowActions } from '@/features/compliance/components/workflow-actions';

/**
 * An emergency survey: what it is judged against, the upload of its log (the surveys feature's
 * import), the routes on each plan coloured by verdict, and each element's verdict and why.
 */
export function EmergencySurveyRoute() {
  const surveyId = Number(useParams().surveyId);
  const survey = useEmergencySurvey(surveyId);
  const plain = useSurvey(surveyId);
  const plans = useSitePlans(survey.data?.siteId);
  const { unit } = useUnits();
  return (
    <Page>
      <QueryState query={survey}>
        {(s) => (
          <>
            <PageHeader eyebrow={<Link to={paths.emergency.to()} className="underline">Emergency lighting</Link>} title={s.name} description={`${s.siteName} · ${s.status.replace('_', ' ')}`}
              actions={<a className="inline-flex items-center gap-2 rounded-lg bg-ink-900 px-3 py-2 text-sm font-medium text-white" href={apiFiles.emergencyReportPdf(s.surveyId, unit)} download><FileDown className="h-4 w-4" aria-hidden />Report (PDF)</a>} />
            <div className="space-y-6">
              <EmergencyCaution />
              <SurveySummary survey={s} />
              {plain.data && (plain.data.abilities.submit || plain.data.abilities.signOff || plain.data.abilities.return || s.status !== 'draft') && (
                <Card>
                  <CardHeader title="Review and sign-off" description="Signing off freezes the verdicts, the criteria set and the logbook as they are now; the report is e-mailed." />
                  <CardBody><WorkflowActions surveyId={s.surveyId} status={plain.data.status} abilities={plain.data.abilities} reviewComment={s.review.reviewComment} record={{ ...s.review, siteTimeZone: s.siteTimeZone }} /></CardBody>
                </Card>
              )}
              {plain.data?.abilities.upload && (
                <Card>
                  <CardHeader title="Upload the log" description="One log may hold both passes: its readings are split by their time after the mains were cut. A log of one pass only can say so below." />
                  <CardBody><LogUpload surveyId={s.surveyId} plans={plans} /></CardBody>
                </Card>
              )}
              <Card>
                <CardHeader title="Logs and their passes" description="Which pass each log holds. By time: readings in the first half of the rated duration are the initial pass, later ones the end-of-duration pass; readings before the mains failed count in no pass." />
                <CardBody><LogPasses survey={s} /></CardBody>
              </Card>
              {plans.data?.items.filter((p) => s.elements.some((e) => e.element.planId === p.id)).map((p) => (
                <Card key={p.id}>
                  <CardHeader title={p.name} description="Routes and areas coloured by verdict (the cards below say which and why); large dots: points that fall short." />
                  <CardBody><EmergencyMap plan={p} elements={s.elements.filter((e) => e.element.planId === p.id).map((e) => e.element)} verdicts={s.elements} className="h-[45vh] min-h-[16rem]" /></CardBody>
                </Card>
              ))}
              {s.elements.length === 0
                ? <p className="text-sm text-ink-500">No escape route or area is drawn on this site's plans yet.</p>
                : <ElementVerdicts survey={s} />}
            </div>
          </>
        )}
      </QueryState>
    </Page>
  );
}

import { useParams } from 'react-router';
import { SurveyPage } from '@/features/surveys/components/survey-page';
import { useSurvey } from '@/features/surveys/api/get-survey';
import { useSitePlans } from '@/features/plans/api/get-site-plans';
import { PlannedPointsCard } from '@/features/grids/components/planned-points-card';
import { useCurrentUser } from '../../current-user';

/** The survey page, given its site's plans from the plans feature and its planned points from the grids feature. */
export function SurveyDetailRoute() {
  const surveyId = Number(useParams().surveyId);
  const me = useCurrentUser();
  const survey = useSurvey(surveyId);
  const sitePlans = useSitePlans(survey.data?.siteId);
  return <SurveyPage surveyId={surveyId} role={me.role} sitePlans={sitePlans} plannedPoints={<PlannedPointsCard surveyId={surveyId} plans={sitePlans.data?.items ?? []} />} />;
}

import { useParams } from 'react-router';
import { SurveyPage } from '@/features/surveys/components/survey-page';
import { useSurvey } from '@/features/surveys/api/get-survey';
import { useSitePlans } from '@/features/plans/api/get-site-plans';
import { usePlannedPoints } from '@/features/grids/api/get-planned-points';
import { PlannedPointsCard } from '@/features/grids/components/planned-points-card';
import { UnplacedPanel } from '@/features/grids/components/unplaced-panel';
import { useCurrentUser } from '../../current-user';

/**
 * The survey page, given its site's plans from the plans feature, and its planned points (visited
 * or not, per plan) and the readings without a place from the grids feature.
 */
export function SurveyDetailRoute() {
  const surveyId = Number(useParams().surveyId);
  const me = useCurrentUser();
  const survey = useSurvey(surveyId);
  const sitePlans = useSitePlans(survey.data?.siteId);
  const planned = usePlannedPoints(surveyId);
  const plans = sitePlans.data?.items ?? [];
  return (
    <SurveyPage surveyId={surveyId} role={me.role} sitePlans={sitePlans} plannedPoints={(
      <>
        <PlannedPointsCard surveyId={surveyId} plans={plans} />
        {survey.data && (
          <UnplacedPanel surveyId={surveyId} plans={plans} timeZone={survey.data.siteTimeZone} plannedPoints={planned.data?.items ?? []}
            editable={survey.data.abilities.edit} droppable={false} />
        )}
      </>
    )} />
  );
}

import { useParams } from 'react-router';
import { SurveyPage } from '@/features/surveys/components/survey-page';
import { useCurrentUser } from '../../current-user';

export function SurveyDetailRoute() {
  const { surveyId } = useParams();
  const me = useCurrentUser();
  return <SurveyPage surveyId={Number(surveyId)} role={me.role} />;
}

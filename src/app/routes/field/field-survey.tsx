import { useOutletContext, useParams } from 'react-router';
import type { SessionUser } from '@shared/schemas/auth';
import { FieldView } from '@/features/field/components/field-view';

export function FieldSurveyRoute() {
  const { surveyId } = useParams();
  const user = useOutletContext<SessionUser>();
  return <FieldView surveyId={Number(surveyId)} userName={user.name} />;
}


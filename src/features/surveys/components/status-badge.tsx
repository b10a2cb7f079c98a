import { SURVEY_STATUS_LABELS, type SurveyStatus } from '@shared/schemas/surveys';
import { Badge, type Tone } from '@/components/ui/badge';

const TONE: Record<SurveyStatus, Tone> = { draft: 'neutral', submitted: 'info', signed_off: 'good', returned: 'warn' };

export function SurveyStatusBadge({ status }: { status: SurveyStatus }) {
  return <Badge tone={TONE[status]}>{SURVEY_STATUS_LABELS[status]}</Badge>;
}

import { useQueryClient } from '@tanstack/react-query';
import { surveyKeys } from '@/lib/query-keys';

/**
 * After a grid, placement or exclusion change: everything under the survey (planned points, the
 * unplaced list, the map, readings, verdicts), since each shows where readings are and which zone they count in.
 */
export function useInvalidateSurveyPoints() {
  const qc = useQueryClient();
  return (surveyId: number) => qc.invalidateQueries({ queryKey: surveyKeys.detail(surveyId) });
}

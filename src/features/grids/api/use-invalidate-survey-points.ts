import { useQueryClient } from '@tanstack/react-query';
import { plannedPointsQueryOptions } from './get-planned-points';

/**
 * After a grid, placement or exclusion change: everything under the survey (planned points, the
 * unplaced list, the map, verdicts), since each shows where readings are and which zone they count in.
 */
export function useInvalidateSurveyPoints() {
  const qc = useQueryClient();
  return (surveyId: number) => qc.invalidateQueries({ queryKey: plannedPointsQueryOptions(surveyId).queryKey.slice(0, 2) });
}

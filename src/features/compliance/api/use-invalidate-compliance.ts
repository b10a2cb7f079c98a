import { useQueryClient } from '@tanstack/react-query';
import { sitesOverviewQueryOptions } from './get-sites-overview';
import { surveyComplianceQueryOptions } from './get-survey-compliance';

/** After a workflow step: the survey's verdicts (and its zones, keyed under it) and the sites overview. */
export function useInvalidateCompliance() {
  const qc = useQueryClient();
  return (surveyId: number) => Promise.all([
    qc.invalidateQueries({ queryKey: sitesOverviewQueryOptions().queryKey }),
    qc.invalidateQueries({ queryKey: surveyComplianceQueryOptions(surveyId).queryKey }),
  ]);
}

import { useQueryClient } from '@tanstack/react-query';
import { siteKeys, surveyKeys } from '@/lib/query-keys';

/**
 * After a workflow step: the survey with everything keyed under it (its status and abilities,
 * verdicts, zones), the survey lists (status column) and the sites overview.
 */
export function useInvalidateCompliance() {
  const qc = useQueryClient();
  return (surveyId: number) => Promise.all([
    qc.invalidateQueries({ queryKey: siteKeys.overview() }),
    qc.invalidateQueries({ queryKey: surveyKeys.detail(surveyId) }),
    qc.invalidateQueries({ queryKey: surveyKeys.lists() }),
  ]);
}

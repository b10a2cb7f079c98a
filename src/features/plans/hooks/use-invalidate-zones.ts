import { useQueryClient } from '@tanstack/react-query';
import { planKeys, siteKeys, surveyKeys } from '@/lib/query-keys';

/**
 * After a zone change: the plan with its zones, and every survey's map and verdicts (which
 * readings fall in which zone changes; the client cannot tell which surveys lie on the plan).
 */
export function useInvalidateZones() {
  const qc = useQueryClient();
  return (planId: number) => {
    qc.invalidateQueries({ queryKey: planKeys.detail(planId) });
    qc.invalidateQueries({ queryKey: surveyKeys.details() });
    qc.invalidateQueries({ queryKey: siteKeys.overview() });
  };
}

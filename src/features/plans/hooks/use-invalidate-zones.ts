import { useQueryClient } from '@tanstack/react-query';
import { zonesQueryOptions } from '../api/get-zones';
import { planQueryOptions } from '../api/get-plan';
import { surveyMapQueryOptions } from '../api/get-survey-map';

/** After a zone change: the plan's zones, its zone count, and every survey map (zone assignment changes). */
export function useInvalidateZones() {
  const qc = useQueryClient();
  return (planId: number) => {
    qc.invalidateQueries({ queryKey: zonesQueryOptions(planId).queryKey });
    qc.invalidateQueries({ queryKey: planQueryOptions(planId).queryKey });
    qc.invalidateQueries({ queryKey: surveyMapQueryOptions(0).queryKey.slice(0, 1) });
  };
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SetZoneTargetInput, ZoneTargetResponse } from '@shared/schemas/targets';
import { zoneTargetQueryOptions } from './get-zone-target';
import { siteKeys, surveyKeys } from '@/lib/query-keys';

export const setZoneTarget = ({ zoneId, ...body }: SetZoneTargetInput & { zoneId: number }) => api.put<ZoneTargetResponse>(`/zones/${zoneId}/target`, body);

/** `onChanged` lets the page refresh what depends on the choice (the survey's verdicts). */
export function useSetZoneTarget(onChanged?: () => unknown) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: setZoneTarget,
    onSuccess: async (z) => {
      qc.setQueryData(zoneTargetQueryOptions(z.zoneId).queryKey, z);
      // The zone's verdict changes in every survey not yet signed off.
      await Promise.all([qc.invalidateQueries({ queryKey: surveyKeys.details() }), qc.invalidateQueries({ queryKey: siteKeys.overview() }), onChanged?.()]);
    },
  });
}

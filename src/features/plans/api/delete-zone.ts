import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { useInvalidateZones } from '../hooks/use-invalidate-zones';

export const deleteZone = ({ zoneId }: { zoneId: number; planId: number }) => api.delete<void>(`/zones/${zoneId}`);

export function useDeleteZone() {
  const invalidate = useInvalidateZones();
  return useMutation({ mutationFn: deleteZone, onSuccess: (_r, v) => invalidate(v.planId) });
}

import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UpdateZoneBody, Zone } from '@shared/schemas/zones';
import { useInvalidateZones } from '../hooks/use-invalidate-zones';

export const updateZone = ({ zoneId, ...body }: UpdateZoneBody & { zoneId: number }) => api.patch<Zone>(`/zones/${zoneId}`, body);

export function useUpdateZone() {
  const invalidate = useInvalidateZones();
  return useMutation({ mutationFn: updateZone, onSuccess: (z) => invalidate(z.planId) });
}

import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Zone, ZoneBodyInput } from '@shared/schemas/zones';
import { useInvalidateZones } from '../hooks/use-invalidate-zones';

export const createZone = ({ planId, ...body }: ZoneBodyInput & { planId: number }) => api.post<Zone>(`/plans/${planId}/zones`, body);

export function useCreateZone() {
  const invalidate = useInvalidateZones();
  return useMutation({ mutationFn: createZone, onSuccess: (z) => invalidate(z.planId) });
}

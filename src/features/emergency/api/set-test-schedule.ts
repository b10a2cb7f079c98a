import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { TestSchedule } from '@shared/core/emergency-schedule';

export const setTestSchedule = (body: TestSchedule) => api.put<TestSchedule>('/emergency/test-schedule', body);

/** New intervals move every due date: the schedule, logbooks and overviews refresh. */
export function useSetTestSchedule() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: setTestSchedule, onSuccess: () => qc.invalidateQueries({ queryKey: emergencyKeys.tests() }) });
}

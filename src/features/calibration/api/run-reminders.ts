import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ReminderRunResponse } from '@shared/schemas/coefficient-sets';
import { probeKeys } from '@/lib/query-keys';

export const runReminders = () => api.post<ReminderRunResponse>('/calibration/reminders/run');

export function useRunReminders() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: runReminders, onSuccess: () => qc.invalidateQueries({ queryKey: probeKeys.dashboard() }) });
}

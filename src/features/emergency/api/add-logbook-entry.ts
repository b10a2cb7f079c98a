import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { LogbookEntry, LogbookEntryBody } from '@shared/schemas/emergency';

export const addLogbookEntry = ({ siteId, body }: { siteId: number; body: LogbookEntryBody }) => api.post<LogbookEntry>(`/sites/${siteId}/emergency-tests`, body);

/** After a new entry: the site's logbook and every due-date overview. */
export function useAddLogbookEntry() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: addLogbookEntry, onSuccess: () => qc.invalidateQueries({ queryKey: emergencyKeys.tests() }) });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateSiteBody, Site } from '@shared/schemas/sites';
import { siteKeys } from '@/lib/query-keys';

export const createSite = (body: CreateSiteBody) => api.post<Site>('/sites', body);

export function useCreateSite() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createSite, onSuccess: () => qc.invalidateQueries({ queryKey: siteKeys.all }) });
}

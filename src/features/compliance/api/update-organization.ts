import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Organization, UpdateOrganizationBody } from '@shared/schemas/organization';
import { organizationQueryOptions } from './get-organization';
import { siteKeys, surveyKeys } from '@/lib/query-keys';

export const updateOrganization = (body: UpdateOrganizationBody) => api.patch<Organization>('/organization', body);

/** A new rule changes every verdict not yet signed off: refresh the organisation and every compliance answer. */
export function useUpdateOrganization() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateOrganization,
    onSuccess: (org) => {
      qc.setQueryData(organizationQueryOptions().queryKey, org);
      return Promise.all([
        qc.invalidateQueries({ queryKey: siteKeys.overview() }),
        qc.invalidateQueries({ queryKey: surveyKeys.details() }),
      ]);
    },
  });
}

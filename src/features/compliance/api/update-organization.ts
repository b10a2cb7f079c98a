import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Organization, UpdateOrganizationBody } from '@shared/schemas/organization';
import { organizationQueryOptions } from './get-organization';
import { sitesOverviewQueryOptions } from './get-sites-overview';

export const updateOrganization = (body: UpdateOrganizationBody) => api.patch<Organization>('/organization', body);

/** A new rule changes every verdict not yet signed off: refresh the organisation and every compliance answer. */
export function useUpdateOrganization() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateOrganization,
    onSuccess: (org) => {
      qc.setQueryData(organizationQueryOptions().queryKey, org);
      // Every compliance answer (sites overview, each survey, each zone) shares the root of this key.
      return qc.invalidateQueries({ queryKey: [sitesOverviewQueryOptions().queryKey[0]] });
    },
  });
}

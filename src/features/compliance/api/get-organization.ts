import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Organization } from '@shared/schemas/organization';
import { organizationKeys } from '@/lib/query-keys';

export const getOrganization = () => api.get<Organization>('/organization');
export const organizationQueryOptions = () => queryOptions({ queryKey: organizationKeys.current(), queryFn: getOrganization });
export const useOrganization = () => useQuery(organizationQueryOptions());

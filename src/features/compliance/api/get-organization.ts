import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Organization } from '@shared/schemas/organization';

export const getOrganization = () => api.get<Organization>('/organization');
export const organizationQueryOptions = () => queryOptions({ queryKey: ['organization'], queryFn: getOrganization });
export const useOrganization = () => useQuery(organizationQueryOptions());

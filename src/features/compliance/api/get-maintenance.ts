import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { MaintenanceResponse } from '@shared/schemas/compliance';
import { siteKeys } from '@/lib/query-keys';

export const getMaintenance = () => api.get<MaintenanceResponse>('/compliance/maintenance');
export const maintenanceQueryOptions = () => queryOptions({ queryKey: siteKeys.maintenance(), queryFn: getMaintenance });
export const useMaintenance = () => useQuery(maintenanceQueryOptions());

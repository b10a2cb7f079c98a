import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { DashboardResponse } from '@shared/schemas/probes';
import { probeKeys } from '@/lib/query-keys';

export const getCalibrationDashboard = () => api.get<DashboardResponse>('/calibration/dashboard');
export const calibrationDashboardQueryOptions = () => queryOptions({ queryKey: probeKeys.dashboard(), queryFn: getCalibrationDashboard });
export const useCalibrationDashboard = () => useQuery(calibrationDashboardQueryOptions());

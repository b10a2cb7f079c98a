import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { DashboardResponse } from '@shared/schemas/probes';

export const getCalibrationDashboard = () => api.get<DashboardResponse>('/calibration/dashboard');
export const calibrationDashboardQueryOptions = () => queryOptions({ queryKey: ['calibration-dashboard'], queryFn: getCalibrationDashboard });
export const useCalibrationDashboard = () => useQuery(calibrationDashboardQueryOptions());

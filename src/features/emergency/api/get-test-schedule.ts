import { queryOptions, useQuery } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { TestSchedule } from '@shared/core/emergency-schedule';

export const getTestSchedule = () => api.get<TestSchedule>('/emergency/test-schedule');
export const testScheduleQueryOptions = () => queryOptions({ queryKey: emergencyKeys.schedule(), queryFn: getTestSchedule });
export const useTestSchedule = () => useQuery(testScheduleQueryOptions());

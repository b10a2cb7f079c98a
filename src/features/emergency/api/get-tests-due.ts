import { queryOptions, useQuery } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { TestsDueOverview } from '@shared/schemas/emergency';

export const getTestsDue = () => api.get<TestsDueOverview>('/emergency/tests-due');
export const testsDueQueryOptions = () => queryOptions({ queryKey: emergencyKeys.testsDue(), queryFn: getTestsDue });
export const useTestsDue = () => useQuery(testsDueQueryOptions());

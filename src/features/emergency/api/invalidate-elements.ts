import type { QueryClient } from '@tanstack/react-query';
import { emergencyKeys, surveyKeys } from '@/lib/query-keys';

/** After an element is added, changed or deleted: the plan's elements, and every survey judged with them. */
export function invalidateAfterElementChange(qc: QueryClient, planId: number) {
  void qc.invalidateQueries({ queryKey: emergencyKeys.elements(planId) });
  void qc.invalidateQueries({ queryKey: emergencyKeys.surveys() });
  void qc.invalidateQueries({ queryKey: surveyKeys.details() });
}

import { useQueryClient } from '@tanstack/react-query';
import { probeKeys } from '@/lib/query-keys';

/** After a set changes: its probe's sets, the probe (state, due date), the list and the dashboard. */
export function useInvalidateCalibration() {
  const qc = useQueryClient();
  return (probeId: number) => Promise.all([
    qc.invalidateQueries({ queryKey: probeKeys.detail(probeId) }),
    qc.invalidateQueries({ queryKey: probeKeys.list() }),
    qc.invalidateQueries({ queryKey: probeKeys.dashboard() }),
  ]);
}

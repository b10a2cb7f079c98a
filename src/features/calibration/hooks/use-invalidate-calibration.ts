import { useQueryClient } from '@tanstack/react-query';
import { coefficientSetsQueryOptions } from '../api/get-coefficient-sets';
import { probesQueryOptions } from '../api/get-probes';
import { probeQueryOptions } from '../api/get-probe';
import { calibrationDashboardQueryOptions } from '../api/get-calibration-dashboard';

/** After a set changes: its probe's sets, the probe (state, due date), the list and the dashboard. */
export function useInvalidateCalibration() {
  const qc = useQueryClient();
  return (probeId: number) => Promise.all([
    qc.invalidateQueries({ queryKey: coefficientSetsQueryOptions(probeId).queryKey }),
    qc.invalidateQueries({ queryKey: probeQueryOptions(probeId).queryKey }),
    qc.invalidateQueries({ queryKey: probesQueryOptions().queryKey }),
    qc.invalidateQueries({ queryKey: calibrationDashboardQueryOptions().queryKey }),
  ]);
}

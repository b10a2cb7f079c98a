import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { JOBS } from '../../jobs';
import { dashboardResponseSchema } from '@shared/schemas/probes';
import { reminderRunResponseSchema } from '@shared/schemas/coefficient-sets';
import { registerProbeRoutes } from '../probes/probes-routes';
import { registerCoefficientSetRoutes } from '../coefficient-sets/coefficient-sets-routes';
import { registerBenchRunRoutes } from '../bench-runs/bench-runs-routes';
import { calibrationDashboard } from './dashboard-service';
import { runCalibrationReminders } from './reminders-service';

// Daily inside the server (module scope: added once however many apps are built).
JOBS.push({ name: 'calibration-reminders', everyMs: 24 * 3600_000, run: (deps) => runCalibrationReminders(deps) });

/** The calibration workspace: probes, coefficient sets, bench runs, dashboard and reminders. */
export function registerCalibrationRoutes(api: Api, deps: Deps) {
  registerProbeRoutes(api, deps);
  registerCoefficientSetRoutes(api, deps);
  registerBenchRunRoutes(api, deps);

  api.route({ method: 'get', path: '/calibration/dashboard', access: 'probes.read', tag: 'calibration', summary: 'Every probe with its due date and calibration state (due soon = within 30 days)', response: dashboardResponseSchema },
    ({ user }) => calibrationDashboard(deps, user));

  api.route({ method: 'post', path: '/calibration/reminders/run', access: 'reminders.run', tag: 'calibration', summary: 'Send the calibration reminders of this organisation now (due within 14 days or overdue, at most one per probe per week)', response: reminderRunResponseSchema },
    ({ user }) => runCalibrationReminders(deps, user.organizationId));
}

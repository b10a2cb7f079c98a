import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { dashboardResponseSchema } from '@shared/schemas/probes';
import { reminderRunResponseSchema } from '@shared/schemas/coefficient-sets';
import { calibrationDashboard } from './dashboard-service';
import { runCalibrationReminders } from './reminders-service';

/** The calibration dashboard and reminders on demand (the daily reminder job is in server/modules.ts). */
export function registerCalibrationRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/calibration/dashboard', access: 'probes.read', tag: 'calibration', summary: 'Every probe with its due date and calibration state (due soon = within 30 days)', response: dashboardResponseSchema },
    ({ user }) => calibrationDashboard(deps, user));

  api.route({ method: 'post', path: '/calibration/reminders/run', access: 'reminders.run', tag: 'calibration', summary: 'Send the calibration reminders of this organisation now (due within 14 days or overdue, at most one per probe per week)', response: reminderRunResponseSchema },
    ({ user }) => runCalibrationReminders(deps, user.organizationId));
}

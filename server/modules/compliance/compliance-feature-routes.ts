import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { registerTargetRoutes } from '../targets/targets-routes';
import { registerOrganizationRoutes } from '../organization/organization-routes';
import { registerWorkflowRoutes } from '../workflow/workflow-routes';
import { registerReportRoutes } from '../reports/reports-routes';
import { registerComplianceRoutes } from './compliance-routes';

/** Target library, organisation settings, verdicts, sign-off workflow and reports: the compliance feature's routes. */
export function registerComplianceFeatureRoutes(api: Api, deps: Deps) {
  registerTargetRoutes(api, deps);
  registerOrganizationRoutes(api, deps);
  registerComplianceRoutes(api, deps);
  registerWorkflowRoutes(api, deps);
  registerReportRoutes(api, deps);
}

import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { complianceResponseSchema, maintenanceResponseSchema, sitesOverviewResponseSchema, zoneDetailParamsSchema, zoneDetailResponseSchema } from '@shared/schemas/compliance';
import { getCompliance, getZoneDetail, maintenanceOverview, sitesOverview } from './compliance-service';
import { surveyMapQuerySchema, surveyMapResponseSchema } from '@shared/schemas/plans';
import { surveyMap } from './survey-map-service';

export function registerComplianceRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/compliance/sites', access: 'surveys.read', tag: 'compliance', summary: 'Sites with their latest survey and counts of zones meeting, falling short, inconclusive', response: sitesOverviewResponseSchema },
    ({ user }) => sitesOverview(deps.db, user));

  api.route({ method: 'get', path: '/surveys/:id/compliance', access: 'surveys.read', tag: 'compliance', summary: 'Verdict per zone (worst first) with the decision rule and the change since the previous signed-off survey', params: idParamsSchema, response: complianceResponseSchema },
    ({ user, params }) => getCompliance(deps.db, user, params.id));

  api.route({ method: 'get', path: '/surveys/:id/zones/:zoneId/compliance', access: 'surveys.read', tag: 'compliance', summary: 'One zone: its points, statistics, target and source', params: zoneDetailParamsSchema, response: zoneDetailResponseSchema },
    ({ user, params }) => getZoneDetail(deps.db, user, params.id, params.zoneId));

  api.route({ method: 'get', path: '/compliance/maintenance', access: 'surveys.read', tag: 'compliance', summary: 'Zones due for maintenance (signed-off Eavg below its maintained value, or heading there within a year), with the trend of their signed-off values', response: maintenanceResponseSchema },
    ({ user }) => maintenanceOverview(deps.db, user));

  // The map's readings and zone figures come from the survey's verdict aggregate (verdict-aggregates.ts).
  api.route({ method: 'get', path: '/surveys/:id/map', access: 'surveys.read', tag: 'plans', summary: 'A survey\'s readings on a plan, with zone and wall-band marks and zone averages', params: idParamsSchema, query: surveyMapQuerySchema, response: surveyMapResponseSchema },
    ({ user, params, query }) => surveyMap(deps.db, user, params.id, query.planId));
}

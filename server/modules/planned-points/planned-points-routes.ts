import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import {
  createPlannedPointBodySchema, deletePlannedPointQuerySchema, generateGridBodySchema, justifyGridBodySchema, movePlannedPointBodySchema,
  plannedPointSchema, plannedPointsQuerySchema, plannedPointsResponseSchema, surveyGridParamsSchema, surveyGridSchema, surveyPointParamsSchema,
} from '@shared/schemas/planned-points';
import { sendFile } from '../reports/reports-routes';
import { plannedPointsCsv, walkSheetPdf } from './walk-sheet';
import { createPlannedPoint, deletePlannedPoint, generateGrids, justifyGrid, listPlannedPoints, movePlannedPoint } from './planned-points-service';

/** Planned measurement points of a survey: EN 12464-1 grids per zone, edits and their reasons. */
export function registerPlannedPointRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/surveys/:id/planned-points', access: 'surveys.read', tag: 'planned points', summary: 'The survey\'s planned grids and points (optionally one plan\'s), with how many readings each point has', params: idParamsSchema, query: plannedPointsQuerySchema, response: plannedPointsResponseSchema },
    ({ user, params, query }) => listPlannedPoints(deps.db, user, params.id, query.planId));

  api.route({ method: 'post', path: '/surveys/:id/planned-points/generate', access: 'surveys.write', tag: 'planned points', summary: 'Generate the EN 12464-1 grid for a zone or every zone of a plan ({zoneId} or {planId}, rounding, layout, surface: working plane, or a room\'s walls (with wallHeightM) or ceiling); replaces that zone\'s earlier points on that surface', params: idParamsSchema, body: generateGridBodySchema, response: plannedPointsResponseSchema },
    ({ user, params, body }) => generateGrids(deps, user, params.id, body));

  api.route({ method: 'post', path: '/surveys/:id/planned-points', access: 'surveys.write', tag: 'planned points', summary: 'Add a planned point to a zone\'s grid (a changed grid needs a reason)', params: idParamsSchema, body: createPlannedPointBodySchema, status: 201, response: plannedPointSchema },
    ({ user, params, body }) => createPlannedPoint(deps, user, params.id, body));

  api.route({ method: 'patch', path: '/surveys/:id/planned-points/:pointId', access: 'surveys.write', tag: 'planned points', summary: 'Move a planned point (a changed grid needs a reason)', params: surveyPointParamsSchema, body: movePlannedPointBodySchema, response: plannedPointSchema },
    ({ user, params, body }) => movePlannedPoint(deps, user, params.id, params.pointId, body));

  api.route({ method: 'delete', path: '/surveys/:id/planned-points/:pointId', access: 'surveys.write', tag: 'planned points', summary: 'Delete a planned point (?reason= for the changed grid)', params: surveyPointParamsSchema, query: deletePlannedPointQuerySchema },
    ({ user, params, query }) => { deletePlannedPoint(deps, user, params.id, params.pointId, query.reason); });

  api.route({ method: 'put', path: '/surveys/:id/grids/:gridId/reason', access: 'surveys.write', tag: 'planned points', summary: 'Justify a changed grid with a written reason (audited)', params: surveyGridParamsSchema, body: justifyGridBodySchema, response: surveyGridSchema },
    ({ user, params, body }) => justifyGrid(deps, user, params.id, params.gridId, body.reason));

  api.route({ method: 'get', path: '/surveys/:id/walk-sheet.pdf', access: 'surveys.read', tag: 'planned points', summary: 'The walk sheet: conditions to fill in, each plan with its zones and labelled planned points to scale, and a table of labels to write readings by hand', params: idParamsSchema, produces: 'application/pdf' },
    async ({ user, params, res }) => { sendFile(res, await walkSheetPdf(deps, user, params.id)); });

  api.route({ method: 'get', path: '/surveys/:id/planned-points.csv', access: 'surveys.read', tag: 'planned points', summary: 'The planned points as CSV: label, plan, zone, x_m, y_m (full precision), plane, height_m, azimuth_deg', params: idParamsSchema, produces: 'text/csv' },
    ({ user, params, res }) => { sendFile(res, plannedPointsCsv(deps, user, params.id)); });
}

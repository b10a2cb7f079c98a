import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { exclusionBodySchema, placementBodySchema, placementResultSchema, surveyReadingParamsSchema, unplacedResponseSchema } from '@shared/schemas/planned-points';
import { listUnplaced, placeReading, setExclusion } from './placements-service';

/** Placing readings by hand and excluding single readings from a zone's statistics. */
export function registerPlacementRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/surveys/:id/unplaced', access: 'surveys.read', tag: 'placements', summary: 'Task readings without a place on a plan, grouped by point label in time order', params: idParamsSchema, response: unplacedResponseSchema },
    ({ user, params }) => listUnplaced(deps.db, user, params.id));

  api.route({ method: 'put', path: '/surveys/:id/readings/:readingId/placement', access: 'surveys.write', tag: 'placements', summary: 'Place a reading on a plan ({planId, xM, yM}) or a planned point ({plannedPointId}), or unplace it ({unplace: true, reason}); moving needs a reason', params: surveyReadingParamsSchema, body: placementBodySchema, response: placementResultSchema },
    ({ user, params, body }) => placeReading(deps, user, params.id, params.readingId, body));

  api.route({ method: 'put', path: '/surveys/:id/readings/:readingId/exclusion', access: 'surveys.write', tag: 'placements', summary: 'Exclude a reading from its zone\'s statistics ({excluded: true, reason}) or include it again', params: surveyReadingParamsSchema, body: exclusionBodySchema, response: placementResultSchema },
    ({ user, params, body }) => setExclusion(deps, user, params.id, params.readingId, body));
}

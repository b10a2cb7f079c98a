import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { readingSeriesSchema, readingsExportQuerySchema, readingsQuerySchema, readingsResponseSchema } from '@shared/schemas/readings';
import { exportReadingsCsv, listReadings, readingSeries } from './readings-service';

export function registerReadingRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/surveys/:id/readings', access: 'surveys.read', tag: 'readings', summary: 'The survey\'s current readings (filter by flag and point, sort, page)', params: idParamsSchema, query: readingsQuerySchema, response: readingsResponseSchema },
    ({ user, params, query }) => listReadings(deps.db, user, params.id, query));

  api.route({ method: 'get', path: '/surveys/:id/readings/series', access: 'surveys.read', tag: 'readings', summary: 'The walk over time for a chart (lux and gain code), thinned to a few thousand points', params: idParamsSchema, response: readingSeriesSchema },
    ({ user, params }) => readingSeries(deps.db, user, params.id));

  api.route({ method: 'get', path: '/surveys/:id/readings.csv', access: 'surveys.read', tag: 'readings', summary: 'The current readings as CSV in lux or foot-candles (formula cells neutralised)', params: idParamsSchema, query: readingsExportQuerySchema, produces: 'text/csv' },
    ({ user, params, query, res }) => exportReadingsCsv(deps.db, user, params.id, query.unit, res));
}

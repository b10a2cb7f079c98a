import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { createProbeBodySchema, probeListQuerySchema, probeListResponseSchema, probeSchema, probeSurveysResponseSchema, updateProbeBodySchema } from '@shared/schemas/probes';
import { createProbe, getProbe, listProbes, updateProbe } from './probes-service';
import { surveysDecodedWithProbe } from './probe-surveys';

export function registerProbeRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/probes', access: 'probes.read', tag: 'calibration', summary: 'Probes of the organisation with their calibration state (surveyors: in service only)', query: probeListQuerySchema, response: probeListResponseSchema },
    ({ user, query }) => ({ items: listProbes(deps, user, query) }));

  api.route({ method: 'post', path: '/probes', access: 'probes.write', tag: 'calibration', summary: 'Register a probe', body: createProbeBodySchema, response: probeSchema, status: 201 },
    ({ user, body }) => createProbe(deps, user, body));

  api.route({ method: 'get', path: '/probes/:id', access: 'probes.read', tag: 'calibration', summary: 'One probe', params: idParamsSchema, response: probeSchema },
    ({ user, params }) => getProbe(deps, user, params.id));

  api.route({ method: 'patch', path: '/probes/:id', access: 'probes.write', tag: 'calibration', summary: 'Change a probe (status "retired" retires it for good)', params: idParamsSchema, body: updateProbeBodySchema, response: probeSchema },
    ({ user, params, body }) => updateProbe(deps, user, params.id, body));

  api.route({ method: 'get', path: '/probes/:id/surveys', access: 'surveys.redecode', tag: 'calibration', summary: 'Surveys whose current readings used this probe, and how many a re-decode would change', params: idParamsSchema, response: probeSurveysResponseSchema },
    ({ user, params }) => ({ items: surveysDecodedWithProbe(deps, user, params.id) }));
}

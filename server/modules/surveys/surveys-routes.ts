import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { createSurveyBodySchema, installationSchema, surveyDetailSchema, surveyListQuerySchema, surveyListResponseSchema, surveySchema } from '@shared/schemas/surveys';
import { createSurvey, getSurvey, listSurveys, setInstallation } from './surveys-service';

export function registerSurveyRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/surveys', access: 'surveys.read', tag: 'surveys', summary: 'Surveys of the organisation, newest first (filter by site or status)', query: surveyListQuerySchema, response: surveyListResponseSchema },
    ({ user, query }) => ({ items: listSurveys(deps.db, user, query) }));

  api.route({ method: 'post', path: '/surveys', access: 'surveys.write', tag: 'surveys', summary: 'Create a draft survey of a site', body: createSurveyBodySchema, status: 201, response: surveySchema },
    ({ user, body }) => createSurvey(deps, user, body));

  api.route({ method: 'get', path: '/surveys/:id', access: 'surveys.read', tag: 'surveys', summary: 'One survey with its flag counts, imports and decodes', params: idParamsSchema, response: surveyDetailSchema },
    ({ user, params }) => getSurvey(deps.db, user, params.id));

  api.route({ method: 'put', path: '/surveys/:id/installation', access: 'surveys.write', tag: 'surveys', summary: 'New installation (judged against Em / MF, with MF or its parts LLMF × LSF × LMF × RSMF) or in service (against Em); 409 once signed off', params: idParamsSchema, body: installationSchema, response: surveySchema },
    ({ user, params, body }) => setInstallation(deps, user, params.id, body));
}

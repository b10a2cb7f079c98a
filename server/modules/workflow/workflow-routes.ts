import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { returnSurveyBodySchema, signOffBodySchema, submitSurveyBodySchema, workflowStateSchema } from '@shared/schemas/workflow';
import { returnSurvey, signOffSurvey, submitSurvey } from './workflow-service';

export function registerWorkflowRoutes(api: Api, deps: Deps) {
  api.route({ method: 'post', path: '/surveys/:id/submit', access: 'surveys.submit', tag: 'workflow', summary: 'Submit a draft or returned survey for review', params: idParamsSchema, body: submitSurveyBodySchema, response: workflowStateSchema },
    ({ user, params, body }) => submitSurvey(deps, user, params.id, body));

  api.route({ method: 'post', path: '/surveys/:id/sign-off', access: 'surveys.review', tag: 'workflow', summary: 'Sign off a submitted survey: freezes verdicts, targets, coefficient sets and rule; e-mails the report', params: idParamsSchema, body: signOffBodySchema, response: workflowStateSchema },
    ({ user, params, body }) => signOffSurvey(deps, user, params.id, body));

  api.route({ method: 'post', path: '/surveys/:id/return', access: 'surveys.review', tag: 'workflow', summary: 'Return a submitted survey to the surveyor with a comment', params: idParamsSchema, body: returnSurveyBodySchema, response: workflowStateSchema },
    ({ user, params, body }) => returnSurvey(deps, user, params.id, body));
}

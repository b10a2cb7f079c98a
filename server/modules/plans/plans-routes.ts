import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { createPlanFieldsSchema, PLAN_IMAGE_MAX_BYTES, planListResponseSchema, planSchema, updatePlanBodySchema } from '@shared/schemas/plans';
import { singleFileUpload } from '../../http/upload';
import { sendHashedFile } from '../../http/send-file';
import { createPlan, deletePlan, getPlan, listPlans, planImage, replacePlanImage, updatePlan } from './plans-service';

export function registerPlanRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/sites/:id/plans', access: 'sites.read', tag: 'plans', summary: 'Plans of a site', params: idParamsSchema, response: planListResponseSchema },
    ({ user, params }) => ({ items: listPlans(deps.db, user, params.id) }));

  api.route({
    method: 'post', path: '/sites/:id/plans', access: 'plans.write', tag: 'plans', summary: 'Upload a plan image (PNG, JPEG or WebP), optionally with its width in metres',
    params: idParamsSchema, body: createPlanFieldsSchema, status: 201, response: planSchema,
    before: singleFileUpload(deps, 'file', Math.min(PLAN_IMAGE_MAX_BYTES, deps.config.uploadLimitBytes)),
    multipart: { file: 'file', name: 'string', widthM: 'string' },
  }, ({ user, params, body, req }) => createPlan(deps, user, params.id, req.file!, body));

  api.route({ method: 'get', path: '/plans/:id', access: 'sites.read', tag: 'plans', summary: 'One plan', params: idParamsSchema, response: planSchema },
    ({ user, params }) => getPlan(deps.db, user, params.id));

  api.route({ method: 'patch', path: '/plans/:id', access: 'plans.write', tag: 'plans', summary: 'Rename a plan or set its scale (width in metres, or two image points and their distance)', params: idParamsSchema, body: updatePlanBodySchema, response: planSchema },
    ({ user, params, body }) => updatePlan(deps, user, params.id, body));

  api.route({ method: 'delete', path: '/plans/:id', access: 'plans.write', tag: 'plans', summary: 'Delete an unused plan (no zones, no readings placed on it); otherwise 409 says what holds it', params: idParamsSchema },
    ({ user, params }) => { deletePlan(deps, user, params.id); });

  api.route({
    method: 'put', path: '/plans/:id/image', access: 'plans.write', tag: 'plans', summary: 'Replace the plan image; the plan keeps its width in metres, so zones and readings keep their place (422 if a zone would reach beyond the new image)',
    params: idParamsSchema, response: planSchema,
    before: singleFileUpload(deps, 'file', Math.min(PLAN_IMAGE_MAX_BYTES, deps.config.uploadLimitBytes)),
    multipart: { file: 'file' },
  }, ({ user, params, req }) => replacePlanImage(deps, user, params.id, req.file!));

  api.route({ method: 'get', path: '/plans/:id/image', access: 'sites.read', tag: 'plans', summary: 'The plan image (ETag is its SHA-256)', params: idParamsSchema, produces: 'image/*' },
    // The image URL carries the hash (a new image is a new URL): revalidation is cheap.
    ({ user, params, req, res }) => sendHashedFile(req, res, planImage(deps, user, params.id), 3600));

}

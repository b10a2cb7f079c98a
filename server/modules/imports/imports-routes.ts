import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { importStatusSchema, uploadLogResponseSchema } from '@shared/schemas/imports';
import { singleFileUpload } from '../../http/upload';
import { getImport, uploadLog } from './imports-service';
import { redecodeSurvey } from './redecode-service';
import { decodeChangesSchema, redecodeResponseSchema } from '@shared/schemas/readings';
import { decodeChanges } from './decode-changes';

export function registerImportRoutes(api: Api, deps: Deps) {
  api.route({
    method: 'post', path: '/surveys/:id/logs', access: 'surveys.upload', tag: 'imports', status: 202,
    summary: 'Upload a survey log (CSV, multipart field "file"; optional "planId": the plan for rows whose plan column is empty; optional "matchWindowS" (default 20) and "clockOffsetS" (default 0) for placing bursts without a place on the survey\'s "measured here now" marks by time); answers at once with the import to poll',
    params: idParamsSchema, before: singleFileUpload(deps, 'file', deps.config.uploadLimitBytes), multipart: { file: 'file', planId: 'string', matchWindowS: 'string', clockOffsetS: 'string' }, response: uploadLogResponseSchema,
  }, async ({ user, params, req }) => {
    // Fields are checked in the service, which also removes the uploaded temporary file on refusal.
    const body = req.body as Record<string, unknown> | undefined;
    const { importId } = await uploadLog(deps, user, params.id, req.file!, { planId: body?.planId, matchWindowS: body?.matchWindowS, clockOffsetS: body?.clockOffsetS });
    return { importId };
  });

  api.route({ method: 'get', path: '/imports/:id', access: 'surveys.read', tag: 'imports', summary: 'An import\'s status, progress, warnings and line-numbered errors', params: idParamsSchema, response: importStatusSchema },
    ({ user, params }) => getImport(deps, user, params.id));

  // Re-decoding reuses the import's decoder and writer, so it lives with the imports.
  api.route({ method: 'post', path: '/surveys/:id/redecode', access: 'surveys.redecode', tag: 'readings', summary: 'Re-decode the survey\'s kept samples with the current approved coefficient sets (the previous decode stays recorded)', params: idParamsSchema, response: redecodeResponseSchema },
    ({ user, params }) => redecodeSurvey(deps, user, params.id));

  api.route({ method: 'get', path: '/surveys/:id/decode-changes', access: 'surveys.redecode', tag: 'readings', summary: 'What the latest re-decode changed: each changed reading before and after (read-only, for calibration staff)', params: idParamsSchema, response: decodeChangesSchema },
    ({ user, params }) => decodeChanges(deps.db, user, params.id));
}

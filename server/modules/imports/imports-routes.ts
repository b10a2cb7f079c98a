import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { importStatusSchema, uploadLogResponseSchema } from '@shared/schemas/imports';
import { singleFileUpload } from '../../http/upload';
import { getImport, uploadLog } from './imports-service';
import { failInterruptedImports } from './import-runner';

export function registerImportRoutes(api: Api, deps: Deps) {
  void failInterruptedImports(deps);

  api.route({
    method: 'post', path: '/surveys/:id/logs', access: 'surveys.upload', tag: 'imports', status: 202,
    summary: 'Upload a survey log (CSV, multipart field "file"); answers at once with the import to poll',
    params: idParamsSchema, before: singleFileUpload(deps, 'file', deps.config.uploadLimitBytes), multipart: { file: 'file' }, response: uploadLogResponseSchema,
  }, async ({ user, params, req }) => {
    const { importId } = await uploadLog(deps, user, params.id, req.file!);
    return { importId };
  });

  api.route({ method: 'get', path: '/imports/:id', access: 'surveys.read', tag: 'imports', summary: 'An import\'s status, progress, warnings and line-numbered errors', params: idParamsSchema, response: importStatusSchema },
    ({ user, params }) => getImport(deps, user, params.id));
}

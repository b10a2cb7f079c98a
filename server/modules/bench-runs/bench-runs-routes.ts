import fs from 'node:fs';
import type { Api } from '../../http/api';
import { badRequest } from '../../http/errors';
import type { Deps } from '../../deps';
import { singleFileUpload } from '../../http/upload';
import { idParamsSchema } from '@shared/schemas/common';
import { BENCH_MAX_BYTES, benchRunDetailSchema, benchRunFieldsSchema, benchRunListResponseSchema } from '@shared/schemas/bench-runs';
import { sendStoredFile } from '../../http/send-file';
import { benchRunFile, getBenchRun, listBenchRuns, uploadBenchRun } from './bench-runs-service';

export function registerBenchRunRoutes(api: Api, deps: Deps) {
  api.route({
    method: 'post', path: '/probes/:id/bench-runs', access: 'probes.write', tag: 'calibration',
    summary: 'Upload a bench CSV (gain, reference_lux, counts, int_ms, temp_c) and fit it per gain code; 422 with row-level errors and nothing stored if any row is bad',
    params: idParamsSchema, response: benchRunDetailSchema, status: 201,
    before: singleFileUpload(deps, 'file', BENCH_MAX_BYTES), multipart: { file: 'file', tRefMs: 'string', referenceURel: 'string', alphaPerK: 'string', tCalC: 'string' },
  }, ({ user, params, req }) => {
    // Fields are parsed here, not by the route's validator, so a bad field still removes the temporary upload.
    const fields = benchRunFieldsSchema.safeParse(req.body ?? {});
    if (!fields.success) {
      fs.rmSync(req.file!.path, { force: true });
      const first = fields.error.issues[0];
      throw badRequest(`Invalid field "${first.path.join('.')}": ${first.message}`, fields.error.issues.map((i) => ({ part: 'body', path: i.path.join('.'), message: i.message })));
    }
    return uploadBenchRun(deps, user, params.id, req.file!, fields.data);
  });

  api.route({ method: 'get', path: '/probes/:id/bench-runs', access: 'coefficients.read', tag: 'calibration', summary: 'Bench runs of a probe, newest first', params: idParamsSchema, response: benchRunListResponseSchema },
    ({ user, params }) => ({ items: listBenchRuns(deps, user, params.id) }));

  api.route({ method: 'get', path: '/bench-runs/:id', access: 'coefficients.read', tag: 'calibration', summary: 'A bench run with its rows and fit', params: idParamsSchema, response: benchRunDetailSchema },
    ({ user, params }) => getBenchRun(deps, user, params.id));

  api.route({ method: 'get', path: '/bench-runs/:id/file', access: 'coefficients.read', tag: 'calibration', summary: 'Download the raw bench file as uploaded', params: idParamsSchema, produces: 'text/csv' },
    ({ user, params, res }) => sendStoredFile(res, benchRunFile(deps, user, params.id), 'text/csv; charset=utf-8'));
}

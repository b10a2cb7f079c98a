import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { singleFileUpload } from '../../http/upload';
import { sendStoredFile } from '../../http/send-file';
import { idParamsSchema } from '@shared/schemas/common';
import { CERTIFICATE_MAX_BYTES, coefficientSetListResponseSchema, coefficientSetSchema, createCoefficientSetBodySchema } from '@shared/schemas/coefficient-sets';
import {
  approveCoefficientSet, attachCertificate, certificateFile, createCoefficientSetDraft, discardCoefficientSetDraft, listCoefficientSets,
} from './coefficient-sets-service';

export function registerCoefficientSetRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/probes/:id/coefficient-sets', access: 'coefficients.read', tag: 'calibration', summary: 'Every version of a probe\'s coefficient sets, newest first (drafts only for those who may draft)', params: idParamsSchema, response: coefficientSetListResponseSchema },
    ({ user, params }) => ({ items: listCoefficientSets(deps, user, params.id) }));

  api.route({ method: 'post', path: '/probes/:id/coefficient-sets', access: 'coefficients.write', tag: 'calibration', summary: 'Draft a new coefficient set version, typed in (source "manual") or from a bench run\'s fit (source "bench_run")', params: idParamsSchema, body: createCoefficientSetBodySchema, response: coefficientSetSchema, status: 201 },
    ({ user, params, body }) => createCoefficientSetDraft(deps, user, params.id, body));

  api.route({ method: 'post', path: '/coefficient-sets/:id/approve', access: 'coefficients.approve', tag: 'calibration', summary: 'Approve a draft (four-eyes: not by its drafter, 403 four_eyes); approved sets never change', params: idParamsSchema, response: coefficientSetSchema },
    ({ user, params }) => approveCoefficientSet(deps, user, params.id));

  api.route({ method: 'delete', path: '/coefficient-sets/:id', access: 'coefficients.write', tag: 'calibration', summary: 'Discard a draft (approved sets: 409)', params: idParamsSchema },
    ({ user, params }) => { discardCoefficientSetDraft(deps, user, params.id); });

  api.route({ method: 'post', path: '/coefficient-sets/:id/certificate', access: 'coefficients.write', tag: 'calibration', summary: 'Attach the calibration certificate PDF to a draft (checked by content, at most 10 MB)', params: idParamsSchema, response: coefficientSetSchema, before: singleFileUpload(deps, 'file', CERTIFICATE_MAX_BYTES), multipart: { file: 'file' } },
    ({ user, params, req }) => attachCertificate(deps, user, params.id, req.file!));

  api.route({ method: 'get', path: '/coefficient-sets/:id/certificate', access: 'coefficients.read', tag: 'calibration', summary: 'Download the certificate PDF', params: idParamsSchema, produces: 'application/pdf' },
    ({ user, params, res }) => sendStoredFile(res, certificateFile(deps, user, params.id), 'application/pdf'));
}

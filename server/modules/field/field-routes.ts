import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { fieldPhotoResponseSchema, fieldRecordBodySchema, fieldRecordResponseSchema, fieldSessionBodySchema, fieldSessionResponseSchema, fieldStateSchema } from '@shared/schemas/field';
import { singleFileUpload } from '../../http/upload';
import { sendHashedFile } from '../../http/send-file';
import type { Response } from 'express';

/** An idempotent create answers 201 when it stored the record now, 200 when the key was stored before. */
function answer<T extends { alreadyStored: boolean }>(res: Response, out: T): T {
  res.status(out.alreadyStored ? 200 : 201);
  return out;
}
import { fieldState, recordFieldRecord, recordFieldSession } from './field-service';
import { FIELD_PHOTO_MAX_BYTES, fieldPhotoFile, storeFieldPhoto } from './field-photos';

/** The field view's routes: its survey state, and records synced from the phone with idempotency keys. */
export function registerFieldRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/surveys/:id/field', access: 'surveys.read', tag: 'field', summary: 'What the field view needs for a survey: plans, zones, planned points, meters, sessions, records and photos', params: idParamsSchema, response: fieldStateSchema },
    ({ user, params }) => fieldState(deps, user, params.id));

  api.route({
    method: 'post', path: '/surveys/:id/field/sessions', access: 'surveys.upload', tag: 'field', summary: 'Record a session\'s measurement conditions (201; 200 with alreadyStored when the idempotency key was stored before; 409 once submitted or signed off)',
    params: idParamsSchema, body: fieldSessionBodySchema, response: fieldSessionResponseSchema,
  }, ({ user, params, body, res }) => answer(res, recordFieldSession(deps, user, params.id, body)));

  api.route({
    method: 'post', path: '/surveys/:id/field/records', access: 'surveys.upload', tag: 'field', summary: 'Record typed values, a "measured here now" mark or a skipped point (201; 200 with alreadyStored for a repeated idempotency key; 422 names a bad value; 409 once submitted or signed off)',
    params: idParamsSchema, body: fieldRecordBodySchema, response: fieldRecordResponseSchema,
  }, ({ user, params, body, res }) => answer(res, recordFieldRecord(deps, user, params.id, body)));

  api.route({
    method: 'post', path: '/surveys/:id/field/photos', access: 'surveys.upload', tag: 'field', summary: 'A photo of a point or zone (multipart `file`; shrunk, location removed unless keepLocation=true; 415 unless PNG, JPEG or WebP; 413 over 20 MB)',
    params: idParamsSchema, response: fieldPhotoResponseSchema,
    before: singleFileUpload(deps, 'file', Math.min(FIELD_PHOTO_MAX_BYTES, deps.config.uploadLimitBytes)),
    multipart: { file: 'file', idempotencyKey: 'string', takenAt: 'string', point: 'string', plannedPointId: 'string', zoneId: 'string', note: 'string', keepLocation: 'string' },
  }, async ({ user, params, req, res }) => answer(res, await storeFieldPhoto(deps, user, params.id, req.file!, req.body)));

  api.route({ method: 'get', path: '/field-photos/:id', access: 'surveys.read', tag: 'field', summary: 'A field photo (JPEG; ETag is its SHA-256)', params: idParamsSchema, produces: 'image/*' },
    ({ user, params, req, res }) => sendHashedFile(req, res, fieldPhotoFile(deps, user, params.id), 86_400));
}

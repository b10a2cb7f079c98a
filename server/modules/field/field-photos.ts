import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import sharp, { type OutputInfo } from 'sharp';
import { and, asc, eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { fieldPhotos, fieldRecords } from '../../db/schema/field';
import { zones } from '../../db/schema/plans';
import { storedFiles } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import { fieldPhotoFieldsSchema, type FieldPhoto } from '@shared/schemas/field';
import { badRequest, notFound, unprocessable } from '../../http/errors';
import { keepUploadedFile, sniffFile, storedPath } from '../../lib/file-store';
import { recordAudit } from '../audit/audit-service';
import { getSurveyRow } from '../surveys/surveys-service';
import { assertSurveyAcceptsFieldRecords, plannedPointOfSurvey, presentPhoto, zoneOfSurveySite } from './field-service';

/** A photo upload may be at most this large before shrinking (413 beyond; phone cameras give 3-12 MB). */
export const FIELD_PHOTO_MAX_BYTES = 20 * 1024 * 1024;

/** Photos are shrunk to fit this many pixels on the longer side (enough to read a label on a luminaire). */
export const FIELD_PHOTO_MAX_SIDE_PX = 2048;

export type UploadedPhoto = { path: string; originalname: string; size: number };

/**
 * Keeps a photo of a point or zone: checked by content (415 unless PNG, JPEG or WebP), turned
 * upright, shrunk with sharp to FIELD_PHOTO_MAX_SIDE_PX as JPEG, with every metadata block (EXIF,
 * so GPS location too) removed unless the user keeps it, then stored by the SHA-256 of the result.
 * The same idempotency key twice stores one photo.
 */
export async function storeFieldPhoto(deps: Deps, user: SessionUser, surveyId: number, file: UploadedPhoto, rawFields: unknown): Promise<{ photo: FieldPhoto; alreadyStored: boolean }> {
  const parsed = fieldPhotoFieldsSchema.safeParse(rawFields);
  if (!parsed.success) throw badRequest(`${parsed.error.issues[0].path.join('.')}: ${parsed.error.issues[0].message}`, parsed.error.issues);
  const fields = parsed.data;
  const survey = getSurveyRow(deps.db, user, surveyId);
  const earlier = deps.db.select().from(fieldPhotos).where(and(eq(fieldPhotos.surveyId, survey.id), eq(fieldPhotos.idempotencyKey, fields.idempotencyKey))).get();
  if (earlier) return { photo: presentPhoto(earlier), alreadyStored: true };
  assertSurveyAcceptsFieldRecords(survey);
  if (fields.zoneId !== undefined) zoneOfSurveySite(deps.db, survey, fields.zoneId);
  // A photo of a planned point belongs to that point's zone (unless the phone named a zone).
  const planned = fields.plannedPointId !== undefined ? plannedPointOfSurvey(deps.db, user, survey, fields.plannedPointId) : null;
  const zoneId = fields.zoneId ?? planned?.zoneId ?? null;
  await sniffFile(file.path, 'image', 'A photo');

  let pipeline = sharp(file.path, { failOn: 'error' }).rotate().resize({ width: FIELD_PHOTO_MAX_SIDE_PX, height: FIELD_PHOTO_MAX_SIDE_PX, fit: 'inside', withoutEnlargement: true });
  // sharp writes no metadata unless asked: keepMetadata() carries EXIF (with any GPS tags) across.
  if (fields.keepLocation) pipeline = pipeline.keepMetadata();
  let out: { data: Buffer; info: OutputInfo };
  try {
    out = await pipeline.flatten({ background: '#ffffff' }).jpeg({ quality: 82, mozjpeg: true }).toBuffer({ resolveWithObject: true });
  } catch (e) {
    throw unprocessable(`The photo could not be read: ${e instanceof Error ? e.message : String(e)}`);
  }
  const tmp = path.join(deps.config.dataDir, 'uploads', `photo-${crypto.randomUUID()}.jpg`);
  fs.mkdirSync(path.dirname(tmp), { recursive: true });
  fs.writeFileSync(tmp, out.data);
  const stored = await keepUploadedFile(deps, { organizationId: user.organizationId, userId: user.id, tmpPath: tmp, filename: `${(file.originalname || 'photo').replace(/\.[^.]*$/, '')}.jpg`, contentType: 'image/jpeg' });
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const created = tx.insert(fieldPhotos).values({
      organizationId: user.organizationId, surveyId: survey.id, idempotencyKey: fields.idempotencyKey, fileId: stored.id, point: planned?.label ?? fields.point ?? null,
      plannedPointId: planned?.id ?? null, zoneId, note: fields.note ?? null, widthPx: out.info.width, heightPx: out.info.height,
      locationKept: fields.keepLocation, takenAt: Date.parse(fields.takenAt), createdBy: user.id, createdAt: now,
    }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'field_photo', entityId: created.id, surveyId: survey.id, action: 'recorded', after: { ...fields, sha256: stored.sha256 }, at: now });
    return created;
  });
  return { photo: presentPhoto(row), alreadyStored: false };
}

/** The stored photo file (404 for another organisation's photo or a survey out of the user's sites). */
export function fieldPhotoFile(deps: Deps, user: SessionUser, photoId: number) {
  const row = deps.db.select({ photo: fieldPhotos, file: storedFiles }).from(fieldPhotos).innerJoin(storedFiles, eq(storedFiles.id, fieldPhotos.fileId))
    .where(and(eq(fieldPhotos.id, photoId), eq(fieldPhotos.organizationId, user.organizationId))).get();
  if (!row) throw notFound('Photo');
  getSurveyRow(deps.db, user, row.photo.surveyId);
  return { filePath: storedPath(deps, row.file.sha256), sha256: row.file.sha256, size: row.file.size, contentType: row.file.contentType };
}

/** A photo as the report's appendix embeds it. */
export type ReportPhoto = { zoneName: string | null; point: string | null; note: string | null; takenAt: number; filePath: string; widthPx: number; heightPx: number };

/** The survey's photos for the report's appendix, in the order taken, with their zone's name. */
export function reportPhotos(deps: Deps, surveyId: number): ReportPhoto[] {
  return deps.db.select({ photo: fieldPhotos, sha256: storedFiles.sha256, zoneName: zones.name }).from(fieldPhotos)
    .innerJoin(storedFiles, eq(storedFiles.id, fieldPhotos.fileId)).leftJoin(zones, eq(zones.id, fieldPhotos.zoneId))
    .where(eq(fieldPhotos.surveyId, surveyId)).orderBy(asc(fieldPhotos.takenAt), asc(fieldPhotos.id)).all()
    .map((r) => ({ zoneName: r.zoneName, point: r.photo.point, note: r.photo.note, takenAt: r.photo.takenAt, filePath: storedPath(deps, r.sha256), widthPx: r.photo.widthPx, heightPx: r.photo.heightPx }));
}

/** A note on a whole zone as the report's appendix prints it. */
export type ReportZoneNote = { zoneName: string; note: string; recordedAt: number };

/** The survey's zone notes for the report's appendix, in the order written (the zone's current name, else the one it had then). */
export function reportZoneNotes(db: Deps['db'], surveyId: number): ReportZoneNote[] {
  return db.select({ r: fieldRecords, zoneName: zones.name }).from(fieldRecords).leftJoin(zones, eq(zones.id, fieldRecords.zoneId))
    .where(and(eq(fieldRecords.surveyId, surveyId), eq(fieldRecords.kind, 'zone_note'))).orderBy(asc(fieldRecords.timeMs), asc(fieldRecords.id)).all()
    .map(({ r, zoneName }) => ({ zoneName: zoneName ?? r.point, note: r.note ?? '', recordedAt: r.timeMs }));
}

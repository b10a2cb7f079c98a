import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { fileTypeFromFile } from 'file-type';
import { and, eq } from 'drizzle-orm';
import type { Deps } from '../deps';
import { storedFiles } from '../db/schema/organizations';
import { unsupportedMediaType } from '../http/errors';
import { textEncodingOfFile } from './text-encoding';

export type FileKind = 'csv' | 'pdf' | 'image';

const IMAGE_TYPES = new Set(['image/png', 'image/jpeg', 'image/webp']);

/**
 * Decides a file's type from its content, never from its name or the browser's claim.
 * CSV is text: UTF-8, UTF-16 or Windows-1252 in its first 64 KiB (text-encoding.ts).
 */
export async function sniffFile(filePath: string, expected: FileKind, what = 'A plan'): Promise<string> {
  const detected = await fileTypeFromFile(filePath);
  if (expected === 'pdf') {
    if (detected?.mime !== 'application/pdf') throw unsupportedMediaType('The certificate must be a PDF file');
    return 'application/pdf';
  }
  if (expected === 'image') {
    if (!detected || !IMAGE_TYPES.has(detected.mime)) throw unsupportedMediaType(`${what} must be a PNG, JPEG or WebP image${detected ? ` (this looks like ${detected.mime})` : ''}`);
    return detected.mime;
  }
  // Text by its bytes, whatever a magic-number guess says (UTF-16's mark FF FE also starts an MPEG frame).
  if (textEncodingOfFile(filePath) === null) {
    if (detected && SPREADSHEET_TYPES.has(detected.mime)) throw unsupportedMediaType('This is a spreadsheet workbook, not a CSV file: save the sheet as "CSV UTF-8" (or CSV) from the spreadsheet program and upload that');
    throw unsupportedMediaType(`This is not a text CSV file${detected ? ` (it looks like ${detected.mime})` : ''}`);
  }
  return 'text/csv';
}

/** Workbooks people upload for a CSV: Office Open XML, the older binary Excel format (a compound file), OpenDocument. */
const SPREADSHEET_TYPES = new Set(['application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', 'application/x-cfb', 'application/vnd.ms-excel', 'application/vnd.oasis.opendocument.spreadsheet']);

export async function sha256OfFile(filePath: string): Promise<string> {
  const hash = crypto.createHash('sha256');
  for await (const chunk of fs.createReadStream(filePath)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export function storedPath(deps: Deps, sha256: string): string {
  return path.join(deps.config.dataDir, 'files', sha256.slice(0, 2), sha256);
}

/**
 * Keeps an uploaded file by content hash (one copy per content) and records it.
 * Moves the temporary upload into place; the row is the caller's to tie to its record.
 */
export async function keepUploadedFile(deps: Deps, input: { organizationId: number; userId: number | null; tmpPath: string; filename: string; contentType: string; /** When the caller has already hashed the file. */ sha256?: string }) {
  const sha256 = input.sha256 ?? await sha256OfFile(input.tmpPath);
  const target = storedPath(deps, sha256);
  fs.mkdirSync(path.dirname(target), { recursive: true });
  if (fs.existsSync(target)) fs.rmSync(input.tmpPath, { force: true });
  else fs.renameSync(input.tmpPath, target);
  const size = fs.statSync(target).size;
  const row = deps.db.insert(storedFiles).values({
    organizationId: input.organizationId, sha256, filename: input.filename.slice(0, 200), contentType: input.contentType, size, createdBy: input.userId, createdAt: deps.clock.now(),
  }).returning().get();
  return row;
}

export function findStoredFile(deps: Deps, organizationId: number, fileId: number) {
  return deps.db.select().from(storedFiles).where(and(eq(storedFiles.id, fileId), eq(storedFiles.organizationId, organizationId))).get();
}

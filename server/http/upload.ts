import multer from 'multer';
import path from 'node:path';
import fs from 'node:fs';
import type { RequestHandler } from 'express';
import type { Deps } from '../deps';
import { badRequest } from './errors';

/** Temporary uploads, under the data directory; emptied at start-up (server/start-up.ts). */
export const UPLOADS_DIR = 'uploads';

/**
 * Multer to disk under the data directory, one file in `field`, size-limited.
 * Handlers then check the content with sniffFile and keep it with keepUploadedFile.
 */
export function singleFileUpload(deps: Deps, field: string, maxBytes: number): RequestHandler[] {
  const dir = path.join(deps.config.dataDir, UPLOADS_DIR);
  fs.mkdirSync(dir, { recursive: true });
  const upload = multer({ dest: dir, limits: { fileSize: maxBytes, files: 1, fields: 20 } }).single(field);
  const requireFile: RequestHandler = (req, res, next) => {
    if (!req.file) return next(badRequest(`Attach the file in the multipart field "${field}"`));
    // Whatever the outcome (validation error, refusal, crash), no temporary upload outlives
    // its request: services move what they keep into the file store before answering.
    const tmpPath = req.file.path;
    res.on('close', () => fs.rm(tmpPath, { force: true }, () => {}));
    next();
  };
  return [upload, requireFile];
}

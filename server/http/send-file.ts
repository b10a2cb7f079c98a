import fs from 'node:fs';
import type { Request, Response } from 'express';

/** Sends a stored file as a download and resolves once it is on its way (so the route adds nothing). */
export function sendStoredFile(res: Response, file: { path: string; filename: string }, contentType: string): Promise<void> {
  const safeName = file.filename.replace(/[^\w.-]/g, '_');
  return new Promise((resolve, reject) => {
    res.sendFile(file.path, { headers: { 'Content-Type': contentType, 'Content-Disposition': `attachment; filename="${safeName}"`, 'X-Content-Type-Options': 'nosniff' } }, (err) => (err ? reject(err) : resolve()));
  });
}

/**
 * Streams a file kept by content hash: the hash is its ETag (304 on If-None-Match), private to
 * the signed-in user (Vary: Cookie), cacheable for maxAgeS since the content never changes.
 */
export function sendHashedFile(req: Request, res: Response, file: { filePath: string; sha256: string; size: number; contentType: string }, maxAgeS: number): Promise<void> | void {
  res.setHeader('ETag', `"${file.sha256}"`);
  res.setHeader('Cache-Control', `private, max-age=${maxAgeS}`);
  res.setHeader('Vary', 'Cookie');
  if (req.fresh) { res.status(304).end(); return; }
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Length', String(file.size));
  return new Promise<void>((resolve, reject) => {
    fs.createReadStream(file.filePath).on('error', reject).pipe(res).on('finish', () => resolve()).on('error', reject);
  });
}

import type { Response } from 'express';

/** Sends a stored file as a download and resolves once it is on its way (so the route adds nothing). */
export function sendStoredFile(res: Response, file: { path: string; filename: string }, contentType: string): Promise<void> {
  const safeName = file.filename.replace(/[^\w.-]/g, '_');
  return new Promise((resolve, reject) => {
    res.sendFile(file.path, { headers: { 'Content-Type': contentType, 'Content-Disposition': `attachment; filename="${safeName}"`, 'X-Content-Type-Options': 'nosniff' } }, (err) => (err ? reject(err) : resolve()));
  });
}

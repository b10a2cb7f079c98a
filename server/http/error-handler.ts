import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
import { HttpError } from './errors';

/** The one place errors become HTTP answers, all in the shape `{ error: { code, message, details? } }`. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let httpError: HttpError;
  if (err instanceof HttpError) httpError = err;
  else if (err instanceof multer.MulterError) {
    httpError = err.code === 'LIMIT_FILE_SIZE'
      ? new HttpError(413, 'payload_too_large', 'The file is larger than the upload limit')
      : new HttpError(400, 'bad_request', `Upload problem: ${err.message}${err.field ? ` (field "${err.field}")` : ''}`);
  } else if (err?.type === 'entity.too.large') httpError = new HttpError(413, 'payload_too_large', 'The request body is too large');
  else if (err?.type === 'entity.parse.failed') httpError = new HttpError(400, 'bad_request', 'The request body is not valid JSON');
  else {
    req.log?.error({ err }, 'unhandled error');
    httpError = new HttpError(500, 'internal', 'Something went wrong on our side; the error was logged');
  }
  res.status(httpError.status).json({ error: { code: httpError.code, message: httpError.message, ...(httpError.details !== undefined ? { details: httpError.details } : {}) } });
};

export const apiNotFound: RequestHandler = (req, _res, next) => next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}`));

import { FOUR_EYES, type SurveyRefusal } from '@shared/survey-abilities';

/** Typed errors the one error handler turns into `{ error: { code, message, details? } }`. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details?: unknown) => new HttpError(400, 'bad_request', message, details);
export const unauthenticated = (message = 'Sign in to continue') => new HttpError(401, 'unauthenticated', message);
export const forbidden = (message = 'Your role does not allow this') => new HttpError(403, 'forbidden', message);
export const notFound = (what = 'That record') => new HttpError(404, 'not_found', `${what} was not found`);
export const conflict = (message: string, details?: unknown) => new HttpError(409, 'conflict', message, details);
/** Separation of duties (403 `four_eyes`): someone else must do this, whatever the role allows. */
export const fourEyes = (message: string) => new HttpError(403, FOUR_EYES, message);
/** A refusal of shared/survey-abilities.ts as the error the handler answers with. */
export const refused = (r: SurveyRefusal) => new HttpError(r.status, r.code, r.message);
export const payloadTooLarge = (message: string) => new HttpError(413, 'payload_too_large', message);
export const unsupportedMediaType = (message: string) => new HttpError(415, 'unsupported_media_type', message);
export const unprocessable = (message: string, details?: unknown) => new HttpError(422, 'unprocessable', message, details);
export const tooManyRequests = (message: string) => new HttpError(429, 'too_many_requests', message);

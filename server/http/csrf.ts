import type { RequestHandler } from 'express';
import { HttpError } from './errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request forgery guard for state-changing requests: the Origin (or, failing
 * that, the Referer) must be the app's own. Browsers always send Origin on cross-site POSTs,
 * so a forged form is refused; an API client that sends the app's own Origin still works.
 */
export function sameOriginOnly(allowedOrigins: string[]): RequestHandler {
  const allowed = new Set(allowedOrigins.map((o) => new URL(o).origin));
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin') ?? originOf(req.get('referer'));
    const own = `${req.protocol}://${req.get('host')}`;
    if (origin && (allowed.has(origin) || origin === own)) return next();
    next(new HttpError(403, 'cross_origin_refused', origin
      ? `Requests from ${origin} may not change data here`
      : 'State-changing requests must carry an Origin header naming this app'));
  };
}

function originOf(url: string | undefined): string | undefined {
  if (!url) return undefined;
  try { return new URL(url).origin; } catch { return undefined; }
}

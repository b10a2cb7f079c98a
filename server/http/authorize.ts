import type { RequestHandler } from 'express';
import { can, type Capability } from '@shared/policy';
import { forbidden, unauthenticated } from './errors';

export type Access = 'public' | 'signed_in' | Capability;

/** Enforces shared/policy.ts: the only place a route's permission is checked. */
export function authorize(access: Access): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next();
    if (!req.user) return next(unauthenticated());
    if (access === 'signed_in' || can(req.user.role, access)) return next();
    next(forbidden());
  };
}

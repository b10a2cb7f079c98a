import type { RequestHandler } from 'express';
import { z } from 'zod';
import { badRequest } from './errors';

type Schemas = { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType };

export type Parsed<S extends Schemas> = {
  params: S['params'] extends z.ZodType ? z.infer<S['params']> : Record<string, never>;
  query: S['query'] extends z.ZodType ? z.infer<S['query']> : Record<string, never>;
  body: S['body'] extends z.ZodType ? z.infer<S['body']> : Record<string, never>;
};

/** Where each request part's parsed value is kept for the handler. */
const PARSED = Symbol('parsed');

/**
 * Validates params, query and body with zod schemas from shared/ and keeps the parsed
 * values (defaults and coercions applied) for the handler: read them with `parsed(req)`.
 */
export function validate<S extends Schemas>(schemas: S): RequestHandler {
  return (req, _res, next) => {
    const out: Record<string, unknown> = {};
    const problems: { part: string; path: string; message: string }[] = [];
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(part === 'body' ? (req.body ?? {}) : req[part]);
      if (result.success) out[part] = result.data;
      else for (const issue of result.error.issues) problems.push({ part, path: issue.path.join('.'), message: issue.message });
    }
    if (problems.length > 0) {
      const first = problems[0];
      return next(badRequest(`Invalid ${first.part}${first.path ? ` field "${first.path}"` : ''}: ${first.message}`, problems));
    }
    (req as unknown as Record<symbol, unknown>)[PARSED] = out;
    next();
  };
}

export function parsed<S extends Schemas>(req: Express.Request, _schemas: S): Parsed<S> {
  const out = (req as unknown as Record<symbol, unknown>)[PARSED] as Partial<Parsed<S>> | undefined;
  return { params: {}, query: {}, body: {}, ...out } as Parsed<S>;
}

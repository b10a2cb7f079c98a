import express, { type Request, type Response, type RequestHandler, type Router } from 'express';
import { OpenAPIRegistry, OpenApiGeneratorV3 } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { apiErrorSchema } from '@shared/schemas/common';
import type { Capability } from '@shared/policy';
import type { SessionUser } from '@shared/schemas/auth';
import { authorize, type Access } from './authorize';
import { validate, parsed } from './validate';
import { PackedAnswer } from './packed-json';

export type RouteSpec<P extends z.ZodType | undefined, Q extends z.ZodType | undefined, B extends z.ZodType | undefined, R extends z.ZodType | undefined = undefined> = {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** Express path below /api, e.g. `/probes/:id`. */
  path: string;
  /** `public`, `signed_in`, or the capability from shared/policy.ts the caller must hold. */
  access: Access;
  summary: string;
  tag: string;
  params?: P;
  query?: Q;
  body?: B;
  /** The JSON answer's schema: documents it and types the handler's return value. */
  response?: R;
  status?: number;
  /** Runs after authorisation and before validation (multer for uploads). */
  before?: RequestHandler[];
  /** Describes a multipart body in the OpenAPI document. */
  multipart?: Record<string, 'file' | 'string'>;
  /** A non-JSON answer (file, CSV, PDF), for the OpenAPI document. */
  produces?: string;
};

type Infer<T> = T extends z.ZodType ? z.infer<T> : Record<string, never>;

/**
 * What a handler may return: the `response` schema's value (or that value with a kept, packed part:
 * packed-json.ts), or nothing (204, or it answered through `res`).
 */
export type RouteAnswer<R> = R extends z.ZodType ? z.input<R> | PackedAnswer<z.input<R>> : void;

export type RouteInput<P, Q, B> = {
  params: Infer<P>;
  query: Infer<Q>;
  body: Infer<B>;
  /** The signed-in user; routes with `public` access get `null`. */
  user: SessionUser;
  req: Request;
  res: Response;
};

export type RouteInfo = { method: string; path: string; access: Access };

/**
 * The API's route table. Each route declares its access and its zod schemas once: the same
 * declaration authorises, validates, and becomes the OpenAPI document, and the role-matrix
 * test walks `routes` so no route escapes it.
 */
export class Api {
  readonly router: Router = express.Router();
  readonly routes: RouteInfo[] = [];
  private readonly registry = new OpenAPIRegistry();

  route<P extends z.ZodType | undefined = undefined, Q extends z.ZodType | undefined = undefined, B extends z.ZodType | undefined = undefined, R extends z.ZodType | undefined = undefined>(
    spec: RouteSpec<P, Q, B, R>,
    handler: (input: RouteInput<P, Q, B>) => RouteAnswer<R> | Promise<RouteAnswer<R>>,
  ): void {
    this.routes.push({ method: spec.method.toUpperCase(), path: spec.path, access: spec.access });
    this.document(spec);
    const schemas = { params: spec.params, query: spec.query, body: spec.body };
    this.router[spec.method](spec.path, authorize(spec.access), ...(spec.before ?? []), validate(schemas), async (req, res, next) => {
      try {
        const input = parsed(req, schemas) as unknown as RouteInput<P, Q, B>;
        const result = await handler({ ...input, user: req.user as SessionUser, req, res });
        if (res.headersSent) return;
        if (result === undefined) res.status(spec.status ?? 204).end();
        else if (result instanceof PackedAnswer) await result.send(req, res, spec.status ?? res.statusCode);
        // A handler may choose between 200 and 201 itself (an idempotent create answers 200 for a repeat).
        else res.status(spec.status ?? res.statusCode).json(result);
      } catch (err) {
        next(err);
      }
    });
  }

  openApiDocument(): unknown {
    return new OpenApiGeneratorV3(this.registry.definitions).generateDocument({
      openapi: '3.0.3',
      info: { title: 'Luxtrail API', version: '1', description: 'Field illuminance surveys: probes, calibration, survey logs, plans, verdicts and reports.' },
      servers: [{ url: '/api' }],
    });
  }

  private document(spec: RouteSpec<z.ZodType | undefined, z.ZodType | undefined, z.ZodType | undefined, z.ZodType | undefined>) {
    const openApiPath = spec.path.replace(/:([A-Za-z]+)/g, '{$1}');
    const errorContent = { 'application/json': { schema: apiErrorSchema } };
    const responses: Record<string, { description: string; content?: Record<string, { schema: z.ZodType }> }> = {
      [String(spec.status ?? (spec.response || spec.produces ? 200 : 204))]: {
        description: 'Success',
        ...(spec.response ? { content: { 'application/json': { schema: spec.response } } } : {}),
        ...(spec.produces ? { content: { [spec.produces]: { schema: z.string() } } } : {}),
      },
      '400': { description: 'Invalid request', content: errorContent },
    };
    if (spec.access !== 'public') {
      responses['401'] = { description: 'Not signed in', content: errorContent };
      if (spec.access !== 'signed_in') responses['403'] = { description: `Needs capability ${spec.access as Capability}`, content: errorContent };
    }
    const multipart = spec.multipart
      ? z.object(Object.fromEntries(Object.entries(spec.multipart).map(([k, t]) => [k, t === 'file' ? z.string().meta({ format: 'binary' }) : z.string().optional()])))
      : undefined;
    this.registry.registerPath({
      method: spec.method,
      path: openApiPath,
      summary: spec.summary,
      tags: [spec.tag],
      request: {
        ...(spec.params ? { params: spec.params as never } : {}),
        ...(spec.query ? { query: spec.query as never } : {}),
        ...(spec.body ? { body: { content: { 'application/json': { schema: spec.body } } } } : {}),
        ...(multipart ? { body: { content: { 'multipart/form-data': { schema: multipart } } } } : {}),
      },
      responses,
    });
  }
}

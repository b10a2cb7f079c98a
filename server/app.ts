import express, { type RequestHandler } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import pino from 'pino';
import path from 'node:path';
import fs from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Deps } from './deps';
import { Api } from './http/api';
import { sameOriginOnly } from './http/csrf';
import { apiNotFound, errorHandler } from './http/error-handler';
import { SqliteSessionStore } from './http/session-store';
import { loadSessionUser } from './modules/auth/auth-service';
import { SERVER_MODULES } from './modules';

export const SESSION_TTL_MS = 8 * 3600_000;

export type AppOptions = {
  /** Serves the built client from dist/ (production); tests and dev mode leave it off. */
  serveClient?: boolean;
  /** Dev mode: Vite's middleware serves the client with hot reload. */
  clientMiddleware?: RequestHandler;
};

/** Builds the Express app from its dependencies without listening (supertest drives it in-process). */
/** Job queues whose modules' handlers are registered (server/modules.ts queueWork). */
const queuesWithWork = new WeakSet<Deps['jobs']>();

export function createApp(deps: Deps, options: AppOptions = {}) {
  const app = express();
  // X-Forwarded-For is believed only from the proxies TRUST_PROXY names (none by default).
  app.set('trust proxy', deps.config.trustProxy);
  app.disable('x-powered-by');
  const logger = pino({ level: deps.config.logLevel });

  app.use(helmet({
    contentSecurityPolicy: {
      directives: {
        defaultSrc: ["'self'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        styleSrc: ["'self'", "'unsafe-inline'"],
        scriptSrc: options.clientMiddleware ? ["'self'", "'unsafe-inline'"] : ["'self'"],
        connectSrc: ["'self'", ...(options.clientMiddleware ? ['ws:'] : [])],
        upgradeInsecureRequests: null,
      },
    },
    crossOriginEmbedderPolicy: false,
  }));
  // One line per request: method, path, status and time; no headers, so no cookies in the log.
  app.use(pinoHttp({
    logger,
    autoLogging: { ignore: (req) => req.url === '/api/health' },
    serializers: {
      req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url.split('?')[0] }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
  }));

  const store = new SqliteSessionStore(deps.db, deps.clock, SESSION_TTL_MS);
  const api = new Api();
  app.use('/api', express.json({ limit: '2mb' }));
  app.use('/api', session({
    name: 'luxtrail.sid',
    secret: deps.config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: 'lax', secure: deps.config.secureCookies, maxAge: SESSION_TTL_MS },
  }));
  app.use('/api', (req, _res, next) => {
    // The user is read afresh each request, so a disabled account or a role change applies at once.
    req.user = req.session.userId ? loadSessionUser(deps.db, req.session.userId) : null;
    next();
  });
  app.use('/api', sameOriginOnly([deps.config.publicUrl]));

  for (const m of SERVER_MODULES) m.routes?.(api, deps);
  // Once per job queue: a second app on the same deps (a restarted server in tests) shares its handlers.
  if (!queuesWithWork.has(deps.jobs)) {
    queuesWithWork.add(deps.jobs);
    for (const m of SERVER_MODULES) for (const w of m.queueWork ?? []) deps.jobs.work(w.name, (data) => w.run(deps, data));
  }

  const openApi = api.openApiDocument();
  app.get('/api/openapi.json', (_req, res) => { res.json(openApi); });
  app.use('/api', api.router);
  app.use('/api', apiNotFound);

  if (options.clientMiddleware) app.use(options.clientMiddleware);
  else if (options.serveClient) serveBuiltClient(app);
  app.use(errorHandler);

  return { app, routes: api.routes, sessionStore: store };
}

function serveBuiltClient(app: express.Express) {
  const dist = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../dist');
  const indexHtml = path.join(dist, 'index.html');
  if (!fs.existsSync(indexHtml)) throw new Error(`The client is not built (${indexHtml} is missing): run "npm run build" first`);
  app.use('/assets', express.static(path.join(dist, 'assets'), { immutable: true, maxAge: '1y' }));
  // The service worker and the manifest are checked on every visit, so a new build reaches phones at once.
  const revalidate = /[\\/](sw\.js|workbox-[\w-]+\.js|manifest\.webmanifest)$/;
  app.use(express.static(dist, { index: false, maxAge: '1h', setHeaders: (res, file) => { if (revalidate.test(file)) res.setHeader('Cache-Control', 'no-cache'); } }));
  app.get('/{*splat}', (_req, res) => { res.sendFile(indexHtml); });
}

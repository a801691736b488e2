// Builds the Express app. Middleware order: request ids and logs, security headers, body
// parsing, sessions, CSRF, API routes, API 404, the web app, the one error handler.
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import compression from 'compression';
import express, { type Express } from 'express';
import expressStaticGzip from 'express-static-gzip';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import type { Pool } from 'mysql2/promise';
import { authRoutes } from './auth/routes';
import { caseRoutes } from './cases/routes';
import { csrfProtection, installSessions } from './auth/session';
import type { AppContext } from './context';
import { errorHandler, notFoundHandler } from './http/errors';
import { safeLogger } from './http/safe-log';
import { healthRoutes } from './health/routes';
import { outboxRoutes } from './mail/outbox';
import { rejectMalformedPath, repairingReviver } from './http/text-edge';
import { patternRoutes } from './patterns/routes';
import { vehicleRoutes } from './vehicles/routes';
import { homeRoutes } from './home/routes';
import { shopRoutes } from './shop/routes';
import { userRoutes } from './users/routes';
import { searchRoutes } from './search/routes';
import { stopSearch } from './search/client';
import { walkRoutes } from './walks/routes';
import { treeRoutes } from './trees/routes';
import { codeRoutes, vinRoutes } from './codes/routes';
import { platformRoutes } from './platforms/routes';
import { scanReportRoutes } from './scan-reports/routes';
import { readinessRoutes } from './readiness/routes';

export interface AppOptions {
  ctx: AppContext;
  pool: Pool;
  sessionSecret: string;
}

export const contentSecurityPolicy = {
  useDefaults: false,
  directives: {
    defaultSrc: ["'self'"],
    scriptSrc: ["'self'"],
    // react-native-web writes its styles into a <style> element at run time.
    styleSrc: ["'self'", "'unsafe-inline'"],
    imgSrc: ["'self'", 'data:', 'blob:'],
    fontSrc: ["'self'", 'data:'],
    connectSrc: ["'self'"],
    mediaSrc: ["'self'", 'blob:'],
    objectSrc: ["'none'"],
    baseUri: ["'none'"],
    frameAncestors: ["'none'"],
    formAction: ["'self'"],
  },
};

/** npm run dev only: Metro's hot reload needs eval and a websocket. Never used for a built app. */
const devContentSecurityPolicy = {
  ...contentSecurityPolicy,
  directives: { ...contentSecurityPolicy.directives, scriptSrc: ["'self'", "'unsafe-eval'"], connectSrc: ["'self'", 'ws:'] },
};

/** The API routers, in one list so the policy test can walk every route. */
export function apiRouters(ctx: AppContext) {
  return [
    healthRoutes(ctx),
    authRoutes(ctx),
    userRoutes(ctx),
    outboxRoutes(ctx),
    searchRoutes(ctx),
    caseRoutes(ctx),
    walkRoutes(ctx),
    treeRoutes(ctx),
    codeRoutes(ctx),
    vinRoutes(ctx),
    platformRoutes(ctx),
    scanReportRoutes(ctx),
    readinessRoutes(ctx),
    patternRoutes(ctx),
    vehicleRoutes(ctx),
    homeRoutes(ctx),
    shopRoutes(ctx),
  ];
}

/** The Express app plus shutdown(), which stops the timers its parts keep (session expiry). */
export type CausewayApp = Express & { shutdown(): Promise<void> };

export function createApp({ ctx, pool, sessionSecret }: AppOptions): CausewayApp {
  const app = express();
  const log = safeLogger(ctx.log);
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    pinoHttp({
      logger: log,
      genReqId: (req, res) => {
        const id = randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
    }),
  );
  app.use(helmet({ contentSecurityPolicy: ctx.config.webDevServer ? devContentSecurityPolicy : contentSecurityPolicy, crossOriginEmbedderPolicy: false }));
  // API answers are compressed on the fly; the web app's files were compressed at build time.
  app.use('/api', compression());
  app.use('/api', rejectMalformedPath);
  app.use('/api', express.json({ limit: ctx.config.limits.jsonBody, strict: true, reviver: repairingReviver }));
  const sessionStore = installSessions(app, ctx, pool, sessionSecret);
  app.use('/api', (req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  app.use('/api', csrfProtection);
  for (const router of apiRouters(ctx)) app.use('/api', router);
  app.use('/api', notFoundHandler);
  if (ctx.config.webDevServer) proxyToDevServer(app, ctx.config.webDevServer);
  else serveWebApp(app, ctx.config.webDist);
  app.use(errorHandler(log));
  return Object.assign(app, {
    shutdown: async () => {
      await stopSearch(ctx);
      await sessionStore.close();
    },
  });
}

/**
 * The exported Expo web app (output "single") with a fallback to index.html for deep links.
 * Files come precompressed (brotli, gzip: see server/cli/web-build.ts), chosen by Accept-Encoding.
 */
function serveWebApp(app: Express, dist: string) {
  const index = path.join(dist, 'index.html');
  app.use(
    expressStaticGzip(dist, {
      index: false,
      enableBrotli: true,
      orderPreference: ['br', 'gzip'],
      serveStatic: {
        index: false,
        setHeaders: (res, file) => {
          if (isHashedAsset(file)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        },
      },
    }),
  );
  app.get('/{*splat}', (_req, res) => {
    if (!existsSync(index)) {
      res.status(503).type('text').send('The web app is not built yet. Run npm start (it builds it) or npm run build:web.');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}

/** Build output whose names carry a content hash: safe to cache for a year. */
function isHashedAsset(file: string): boolean {
  return file.includes(`${path.sep}_expo${path.sep}`) || file.includes(`${path.sep}assets${path.sep}`);
}

/** Development only: everything that is not /api goes to Expo's dev server (plain node:http). */
function proxyToDevServer(app: Express, target: string) {
  const { hostname, port } = new URL(target);
  app.use((req, res) => {
    const upstream = http.request({ hostname, port, path: req.originalUrl, method: req.method, headers: req.headers }, (up) => {
      res.writeHead(up.statusCode ?? 502, up.headers);
      up.pipe(res);
    });
    upstream.on('error', () => res.status(502).type('text').send('The Expo dev server is still starting. Reload in a few seconds.'));
    req.pipe(upstream);
  });
}

import express from 'express';
import helmet from 'helmet';
import cookieParser from 'cookie-parser';
import compression from 'compression';
import { existsSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { AppDeps } from './deps';
import type { ApiRouter, HotRoute, RouteSpec } from './http/api-router';
import type { SessionResolver } from './auth/types';
import { serveClient } from './http/static-files';
import { fullPath } from '../shared/contracts/contract';
import { authenticate, sessionCookie } from './auth/authenticate';
import { crossSiteRefusal, csrfGuard } from './middleware/csrf';
import { hostCheck, knownHost } from './middleware/host-check';
import { directRoutes, type DirectOptions } from './http/direct-routes';
import { errorHandler, notFoundApi } from './middleware/error-handler';
import { requestLog } from './middleware/request-log';
import { authService } from './services/auth.service';
import { authRoutes } from './routes/auth.routes';
import { healthRoutes } from './routes/health.routes';
import { usersRoutes } from './routes/users.routes';
import { venuesRoutes } from './routes/venues.routes';
import { stripsRoutes } from './routes/strips.routes';
import { READINGS_BATCH_BODY_LIMIT, readingsRoutes } from './routes/readings.routes';
import { faultsRoutes } from './routes/faults.routes';
import { boardRoutes } from './routes/board.routes';
import { equipmentRoutes } from './routes/equipment.routes';
import { labelsRoutes } from './routes/labels.routes';
import { planRoutes } from './routes/plan.routes';
import { profilesRoutes } from './routes/profiles.routes';
import { readingsTableRoutes } from './routes/readings-table.routes';
import { auditRoutes } from './routes/audit.routes';
import { attachmentsRoutes } from './routes/attachments.routes';
import { equipmentImportRoutes } from './routes/equipment-import.routes';
import { faultLocationRoutes } from './routes/fault-location.routes';
import { signOffRoutes } from './routes/sign-off.routes';
import { certificatesRoutes, wellKnownRoutes } from './routes/certificates.routes';
import { incidentsRoutes } from './routes/incidents.routes';

const builtClient = resolve(dirname(fileURLToPath(import.meta.url)), '../dist');

/** The largest JSON body the API reads, but for a batch of readings (readings.routes.ts). */
export const API_BODY_LIMIT_BYTES = 100 * 1024;

/** Answers smaller than this go as they are: compressing them costs more time than it saves. */
export const COMPRESS_MIN_BYTES = 1024;

/** Security headers: our own resources only, no framing; helmet's defaults are not used. */
function securityHeaders(appOrigin: string) {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        // WebAssembly compiled from our own files only: the label scanner's QR reader (no JS eval).
        scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
        styleSrc: ["'self'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'"],
        connectSrc: ["'self'"],
        workerSrc: ["'self'"],
        manifestSrc: ["'self'"],
        objectSrc: ["'none'"],
        frameAncestors: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        // No upgrade-insecure-requests: the app is served over plain HTTP on venue networks.
      },
    },
    // HSTS only means something over HTTPS.
    strictTransportSecurity: appOrigin.startsWith('https://'),
  });
}

/** `distDir`: the built client to serve (tests give a folder of their own). */
export function createApp(deps: AppDeps, opts: { distDir?: string } = {}) {
  const distDir = opts.distDir ?? builtClient;
  const app = express();
  app.disable('x-powered-by');
  // API answers are no-store, so a body hash as ETag on each (Express's default) serves no one;
  // version ETags for optimistic concurrency are set explicitly (server/http/etag.ts), and static
  // files keep their own from express.static.
  app.set('etag', false);
  app.set('trust proxy', 'loopback');
  app.use(hostCheck(deps.env.APP_ORIGIN, deps.env.ALLOWED_HOSTS));

  app.use(securityHeaders(deps.env.APP_ORIGIN));
  const logLine = requestLogLine(deps);
  if (logLine) app.use(requestLog(logLine));
  // gzip or brotli, as the browser asks, for answers from 1 KB (lists, strips, batches of readings);
  // a file the build compressed already is sent as it is (the middleware leaves encoded answers alone).
  const compress = compression({ threshold: COMPRESS_MIN_BYTES });

  const auth = authService(deps);
  const cookie = sessionCookie(deps.env.APP_ORIGIN);

  // Express tries routers in this order: readings come first because a venue's morning is
  // thousands of them (each router passed costs every request a little).
  const routers: ApiRouter[] = [
    readingsRoutes(deps),
    healthRoutes(deps),
    authRoutes(deps, auth),
    usersRoutes(deps, auth),
    venuesRoutes(deps),
    stripsRoutes(deps),
    faultsRoutes(deps),
    boardRoutes(deps),
    labelsRoutes(deps),
    equipmentRoutes(deps),
    planRoutes(deps),
    profilesRoutes(deps),
    readingsTableRoutes(deps),
    auditRoutes(deps),
    attachmentsRoutes(deps),
    equipmentImportRoutes(deps),
    faultLocationRoutes(deps),
    signOffRoutes(deps),
    certificatesRoutes(deps),
    incidentsRoutes(deps),
  ];

  const api = express.Router();
  // No caching of API answers by browsers or proxies: they hold people's data (refusals included).
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  // strict: false so a bare JSON value (5, "x") reaches the schema and gets its 422, not a parse error.
  // A batch of readings has a larger allowance; the general parser then leaves its parsed body alone.
  api.use('/readings/batch', express.json({ limit: READINGS_BATCH_BODY_LIMIT, strict: false }));
  api.use(express.json({ limit: API_BODY_LIMIT_BYTES, strict: false }));
  api.use(cookieParser());
  // Checking a certificate file stores nothing and is public: outside tools (a script, curl) may
  // send it without our Origin header.
  api.use(csrfGuard(deps.env.APP_ORIGIN, new Set(['/verify/file'])));
  api.use(authenticate(auth, cookie.name));
  // A single reading's answer is under 1 KB and is the most frequent request: it skips the
  // middleware altogether rather than paying for its wrapping on every write.
  api.use((req, res, next) => (req.method === 'POST' && req.path === '/readings' ? next() : compress(req, res, next)));
  for (const r of routers) api.use(r.router);
  api.use(notFoundApi);
  app.use('/api', api);
  // Public keys for outside verifiers of certificates, at the standard place (outside /api).
  const wellKnown = wellKnownRoutes(deps);
  app.use(wellKnown.router);

  if (existsSync(distDir)) {
    // The service worker's own files are not compressed by the build (they are written after it).
    app.use(compress);
    serveClient(app, distDir);
  }
  app.use(errorHandler((msg, err) => deps.log.error(msg, err)));

  const routes: RouteSpec[] = [...[...routers, wellKnown].flatMap((r) => r.routes.map((s) => ({ ...s, path: fullPath(s.contract) })))];
  const listener = directRoutes(
    directOptions(
      deps,
      auth,
      routers.flatMap((r) => r.hot),
    ),
    (req, res) => app(req as express.Request, res as express.Response),
  );
  return Object.assign(listener, {
    routes,
    /** Express alone, without the direct path (tests compare the two). */
    express: app,
    listen: (port: number, host?: string, onListening?: () => void): Server => createServer(listener).listen(port, host, onListening),
  });
}

/** What the direct path checks a request against: the same host, origin, headers, session and limits as Express. */
export function directOptions(deps: AppDeps, sessions: SessionResolver, routes: HotRoute[]): DirectOptions {
  const origin = deps.env.APP_ORIGIN;
  return {
    routes,
    hostAllowed: knownHost(origin, deps.env.ALLOWED_HOSTS),
    crossSiteRefusal: (header, protocol) => crossSiteRefusal(origin, header, protocol),
    securityHeaders: securityHeaders(origin),
    sessions,
    cookieName: sessionCookie(origin).name,
    bodyLimitBytes: API_BODY_LIMIT_BYTES,
    log: (msg, err) => deps.log.error(msg, err),
    requestLog: requestLogLine(deps),
  };
}

const requestLogLine = (deps: AppDeps) => (deps.env.LOG_REQUESTS === 'on' ? (line: string) => deps.log.info(line) : undefined);
export type App = ReturnType<typeof createApp>;

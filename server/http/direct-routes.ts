import type { IncomingMessage, ServerResponse } from 'node:http';
import type { RequestHandler } from 'express';
import type { ZodType } from 'zod';
import cookieParser from 'cookie-parser';
import type { SessionResolver } from '../auth/types';
import { sessionToken } from '../auth/authenticate';
import { fullPath } from '../../shared/contracts/contract';
import { answerForError, problemBody } from '../middleware/error-handler';
import { requestLine } from '../middleware/request-log';
import { roleAllowed, type HotRoute } from './api-router';

// The reading write is most of a venue's morning, and on this machine Express's handling of a
// request costs several times Node's own (bench/writes.bench.ts prints both floors). So a hot
// route is served here, by Node's HTTP server, when every header is in order: a host we answer
// for, our own origin, a live session allowed by the contract, a JSON body of a declared length
// within the limit. Anything else goes on to Express, where the same route answers it as before:
// each refusal keeps a single implementation, and both paths share the contract, the handler and
// the problem answers (tests/api/direct-routes.test.ts compares them).

export interface DirectOptions {
  routes: HotRoute[];
  hostAllowed: (host: string | undefined) => boolean;
  crossSiteRefusal: (header: (name: string) => string | undefined, protocol: string) => string | null;
  /** The app's security headers (helmet: it only sets headers, so it runs on Node's own objects). */
  securityHeaders: RequestHandler;
  sessions: SessionResolver;
  cookieName: string;
  bodyLimitBytes: number;
  log: (msg: string, err: unknown) => void;
  /** Where request log lines go when LOG_REQUESTS is on. */
  requestLog?: (line: string) => void;
}

type Listener = (req: IncomingMessage, res: ServerResponse) => void;

/** A JSON content type in UTF-8 (what the tablet sends); any other goes to Express's body parser. */
function plainJson(type: string | undefined): boolean {
  if (!type) return false;
  const [mime, ...params] = type.toLowerCase().split(';');
  if (mime.trim() !== 'application/json') return false;
  return params.every((p) => p.trim() === 'charset=utf-8');
}

/** A request listener that serves the hot routes it can and hands every other request to `next`. */
export function directRoutes(opts: DirectOptions, next: Listener): Listener {
  const byPath = new Map(opts.routes.map((r) => [`${r.contract.method} ${fullPath(r.contract)}`, r]));
  const parseCookies = cookieParser();
  const noop = () => {};

  const inOrder = (req: IncomingMessage): boolean => {
    const h = req.headers;
    // Behind a proxy the host and protocol come from forwarded headers: Express reads those.
    if (h['x-forwarded-host'] !== undefined || h['x-forwarded-proto'] !== undefined) return false;
    if (!opts.hostAllowed(h.host)) return false;
    if (opts.crossSiteRefusal((name) => h[name] as string | undefined, 'http') !== null) return false;
    if (!plainJson(h['content-type']) || h['transfer-encoding'] !== undefined) return false;
    if (h['content-encoding'] !== undefined && h['content-encoding'] !== 'identity') return false;
    const length = Number(h['content-length']);
    return h['content-length'] !== undefined && Number.isInteger(length) && length <= opts.bodyLimitBytes;
  };

  return (req, res) => {
    const route = byPath.get(`${req.method} ${req.url}`);
    if (!route || !inOrder(req)) return next(req, res);
    parseCookies(req as never, res as never, noop);
    const token = sessionToken((req as { cookies?: Record<string, unknown> }).cookies, opts.cookieName);
    if (!token) return next(req, res);
    const started = process.hrtime.bigint();
    opts.sessions.resolve(token).then(
      (found) => {
        if (!found || !roleAllowed(route.contract.access, found.user.role)) return next(req, res);
        try {
          serve(route, found.user, req, res, started);
        } catch (err) {
          fail(res, err);
        }
      },
      () => next(req, res),
    );
  };

  function serve(route: HotRoute, user: Parameters<HotRoute['handler']>[0], req: IncomingMessage, res: ServerResponse, started: bigint) {
    opts.securityHeaders(req as never, res as never, noop);
    res.setHeader('Cache-Control', 'no-store');
    if (opts.requestLog) {
      const write = opts.requestLog;
      res.on('finish', () => write(requestLine(req.method ?? '', req.url ?? '', res.statusCode, started, user.id)));
    }
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      answer(route, user, Buffer.concat(chunks))
        .then((a) => {
          if (a.location) res.setHeader('Location', a.location);
          send(res, a.status, 'application/json', a.body);
        })
        .catch((err: unknown) => fail(res, err));
    });
  }

  /** The body read as express.json reads it, parsed by the contract, and the handler's answer. */
  async function answer(route: HotRoute, user: Parameters<HotRoute['handler']>[0], bytes: Buffer) {
    // UTF-8 without a byte-order mark; an empty body is {} (the schema then names what is missing).
    let text = bytes.toString('utf8');
    if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
    let value: unknown = {};
    if (text.length > 0) {
      try {
        value = JSON.parse(text);
      } catch {
        throw Object.assign(new SyntaxError('The request body is not valid JSON.'), { type: 'entity.parse.failed' });
      }
    }
    return route.handler(user, (route.contract.body as ZodType).parse(value) as never);
  }

  function fail(res: ServerResponse, err: unknown) {
    if (res.headersSent) return void res.destroy();
    const { problem, retryAfter } = answerForError(err, opts.log);
    if (retryAfter) res.setHeader('Retry-After', retryAfter);
    send(res, problem.status, 'application/problem+json', problemBody(problem));
  }
}

function send(res: ServerResponse, status: number, type: string, body: unknown) {
  const text = JSON.stringify(body);
  res.statusCode = status;
  res.setHeader('Content-Type', `${type}; charset=utf-8`);
  res.setHeader('Content-Length', Buffer.byteLength(text));
  res.end(text);
}

import express, { type Request, type RequestHandler, type Response } from 'express';
import type { ZodType } from 'zod';
import type { AuthUser } from '../auth/types';
import { AppError, forbidden, unauthorized } from '../lib/app-error';
import { bodyBytes } from './body-bytes';
import { ReceivedBody } from '../workers/parcel';
import {
  bodyKindOf,
  fullPath,
  type Access,
  type AnswerIn,
  type BodyOut,
  type Contract,
  type MultipartBody,
  type ParamsOut,
  type QueryOut,
  type TextBody,
} from '../../shared/contracts/contract';

export type { Access };
export { STAFF } from '../../shared/contracts/contract';

// Every route is registered from its contract (shared/contracts): there is no way to add a route
// without an access policy, and the list of declared routes is kept so tests can enumerate them
// (deny by default) and check that every contract has its route.
export interface RouteSpec {
  method: Contract['method'];
  path: string;
  access: Access;
  contract: Contract;
}

export function requireAccess(access: Access): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next();
    if (!req.user) return next(unauthorized());
    if (!roleAllowed(access, req.user.role)) return next(forbidden());
    next();
  };
}

/** Whether a signed-in caller's role may call a route of this access. */
export const roleAllowed = (access: Access, role: AuthUser['role']) =>
  access === 'signed-in' || (access !== 'public' && access.includes(role));

/** What a handler gets: the caller, and params, query and body parsed by the contract's schemas. */
export interface RouteInput<C extends Contract> {
  user: C['access'] extends 'public' ? AuthUser | undefined : AuthUser;
  params: ParamsOut<C>;
  query: QueryOut<C>;
  body: BodyOut<C>;
  req: Request;
  /** For headers (ETag, Location) and, among the declared ones, another success status. */
  res: Response;
}
export type Handler<C extends Contract> = (input: RouteInput<C>) => AnswerIn<C> | Promise<AnswerIn<C>>;

/** What a hot route's handler answers: the status (one the contract declares), a Location if any, the body. */
export interface HotAnswer<B = unknown> {
  status: number;
  location?: string;
  body: B;
}
/** A hot route as the direct path serves it (http/direct-routes.ts): the caller and the parsed body in, the answer out. */
export interface HotRoute {
  contract: Contract;
  handler: (user: AuthUser, body: never) => Promise<HotAnswer>;
}

/** Middleware of one route, in the order they run around the contract's parsing. */
export interface RouteOptions {
  /** Right after the access check: limits that count attempts whatever their input. */
  first?: RequestHandler[];
  /** After params and query are parsed, before the body is: an object-level check, an upload. */
  before?: RequestHandler[];
  /** After the body is parsed (req.body is the parsed value): a throttle keyed on it. */
  after?: RequestHandler[];
}

export interface RouterOptions {
  /** Check every answer against its schema (tests and development): a mismatch is a 500 and a log line. */
  checkAnswers: boolean;
  /** Where a mismatch goes once a file has already started to be sent (it cannot become a 500 then). */
  log: (msg: string, err: unknown) => void;
}

/** A JSON body absent from the request is parsed as {} so the schema names the missing fields. */
function parseBody(c: Contract, req: Request): unknown {
  const kind = bodyKindOf(c);
  if (kind === 'none') return undefined;
  if (kind === 'multipart') {
    const { fields } = c.body as MultipartBody;
    return fields ? fields.parse(req.body ?? {}) : undefined;
  }
  if (kind === 'text') {
    const spec = c.body as TextBody;
    if (!(req.body instanceof ReceivedBody)) {
      throw new AppError(
        415,
        'unsupported-type',
        `Send ${spec.what} as the request body with Content-Type ${spec.contentTypes.join(', ')}.`,
      );
    }
    return req.body;
  }
  return (c.body as ZodType).parse(req.body === undefined ? {} : req.body);
}

/** Params and query replaced by their parsed values; a ZodError is answered 422 by the error handler. */
function parseUrl(c: Contract): RequestHandler {
  return (req, _res, next) => {
    if (c.params) (req as { params: unknown }).params = c.params.parse(req.params);
    // Express 5 makes req.query a getter: the parsed value is put in its place.
    if (c.query) Object.defineProperty(req, 'query', { value: c.query.parse(req.query), writable: true });
    next();
  };
}

function answerMismatch(c: Contract, detail: string): Error {
  return new Error(`The answer of ${c.method} ${fullPath(c)} does not match its contract: ${detail}`);
}

function checkAnswer(c: Contract, res: Response, body: unknown, log: RouterOptions['log']) {
  const a = c.answer;
  if (a.kind === 'json') {
    if (!a.status.includes(res.statusCode)) throw answerMismatch(c, `status ${res.statusCode}, declared ${a.status.join(', ')}`);
    const result = (a.schema as ZodType).safeParse(body);
    if (!result.success) {
      throw answerMismatch(c, result.error.issues.map((i) => `${i.path.join('.') || '(answer)'}: ${i.message}`).join('; '));
    }
  } else if (a.kind === 'file') {
    const type = String(res.get('Content-Type') ?? '');
    if (a.contentTypes.some((t) => type.startsWith(t))) return;
    const err = answerMismatch(c, `Content-Type ${type || 'none'}, declared ${a.contentTypes.join(', ')}`);
    if (!res.headersSent) throw err;
    log('answer mismatch', err);
  }
}

/** The router of one area, checking answers when CHECK_RESPONSES is on (tests, npm run dev, e2e). */
export const apiRouter = (deps: { env: { CHECK_RESPONSES: 'on' | 'off' }; log: { error(msg: string, err?: unknown): void } }) =>
  new ApiRouter({ checkAnswers: deps.env.CHECK_RESPONSES === 'on', log: (msg, err) => deps.log.error(msg, err) });

export class ApiRouter {
  readonly router = express.Router();
  readonly routes: RouteSpec[] = [];
  readonly hot: HotRoute[] = [];
  constructor(private readonly opts: RouterOptions) {}

  route<const C extends Contract>(c: C, handler: Handler<C>, opts: RouteOptions = {}): this {
    const chain: RequestHandler[] = [requireAccess(c.access), ...(opts.first ?? [])];
    if (c.params || c.query) chain.push(parseUrl(c));
    chain.push(...(opts.before ?? []));
    if (bodyKindOf(c) === 'text') {
      const text = c.body as TextBody;
      chain.push(bodyBytes(text));
    }
    const parsedFirst = (opts.after ?? []).length > 0;
    if (parsedFirst) {
      chain.push((req, _res, next) => {
        req.body = parseBody(c, req);
        next();
      });
      chain.push(...opts.after!);
    }
    chain.push(this.finish(c, handler as Handler<Contract>, parsedFirst));
    this.routes.push({ method: c.method, path: c.path, access: c.access, contract: c });
    this.router[c.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete'](c.path, ...chain);
    return this;
  }

  /**
   * The route of a hot contract (the reading write): registered with Express like any other, and
   * also served straight from Node's HTTP server when its request is in order (http/direct-routes.ts).
   * One handler for both, with no middleware of its own, so the two cannot answer differently.
   */
  hotRoute<const C extends Contract & { hot: true }>(
    c: C,
    handler: (user: AuthUser, body: BodyOut<C>) => Promise<HotAnswer<AnswerIn<C>>>,
  ): this {
    if (bodyKindOf(c) !== 'json' || c.access === 'public')
      throw new Error(`${c.method} ${c.path}: a hot route takes a JSON body from a signed-in caller`);
    this.route(c, async ({ user, body, res }) => {
      const answer = await handler(user as AuthUser, body);
      res.status(answer.status);
      if (answer.location) res.location(answer.location);
      return answer.body;
    });
    this.hot.push({ contract: c, handler: handler as HotRoute['handler'] });
    return this;
  }

  /** Parses the body, calls the handler and sends its answer (a file route has sent its own). */
  private finish(c: Contract, handler: Handler<Contract>, parsedFirst: boolean): RequestHandler {
    const check = this.opts.checkAnswers && !c.hot;
    const log = this.opts.log;
    const a = c.answer;
    const send = (res: Response, body: unknown) => {
      if (check) checkAnswer(c, res, body, log);
      if (a.kind === 'json') res.json(body);
      else if (a.kind === 'empty') res.status(204).end();
    };
    return (req, res) => {
      const body = parsedFirst ? req.body : parseBody(c, req);
      if (a.kind === 'json') res.status(a.status[0]);
      const input = { user: req.user, params: req.params, query: req.query, body, req, res } as unknown as RouteInput<Contract>;
      const out = handler(input);
      // Only a handler that is async waits: the others answer in the same turn, as before contracts.
      if (out instanceof Promise) return out.then((value) => send(res, value));
      send(res, out);
    };
  }
}

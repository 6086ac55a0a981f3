// One fetch wrapper: JSON in and out, problem+json turned into ApiError, cookies sent. Fetchers are
// built from the route's contract (shared/contracts): the path, the body and the answer's type.
import type { AnswerOf, BodyIn, Contract, ParamsIn, QueryIn } from '@shared/contracts/contract';

export interface FieldError {
  path: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly errors: FieldError[] = [],
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

type Json = object | string | number | boolean | null;

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: Json | FormData | Blob | string;
  headers?: Record<string, string>;
  contentType?: string;
  signal?: AbortSignal;
}

let onUnauthenticated: (() => void) | null = null;
export function setUnauthenticatedHandler(fn: () => void) {
  onUnauthenticated = fn;
}

let onReach: ((answered: boolean) => void) | null = null;
/** Told after each request whether the server answered at all (the tablet's online state). */
export function setReachabilityObserver(fn: (answered: boolean) => void) {
  onReach = fn;
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The ApiError for a refusal: the problem+json body's code, sentence and field errors when there is one. */
export function problemError(status: number, data: unknown): ApiError {
  const p = isRecord(data) ? data : {};
  const errors = Array.isArray(p.errors)
    ? p.errors.filter((e): e is FieldError => isRecord(e) && typeof e.path === 'string' && typeof e.message === 'string')
    : [];
  return new ApiError(
    status,
    typeof p.code === 'string' ? p.code : 'error',
    typeof p.detail === 'string' ? p.detail : `The server answered ${status}.`,
    errors,
    p,
  );
}

export async function apiRequest(path: string, opts: RequestOptions = {}): Promise<unknown> {
  const headers: Record<string, string> = { Accept: 'application/json', ...opts.headers };
  let body: BodyInit | undefined;
  if (opts.body instanceof FormData || opts.body instanceof Blob) body = opts.body;
  else if (typeof opts.body === 'string' && opts.contentType) {
    body = opts.body;
    headers['Content-Type'] = opts.contentType;
  } else if (opts.body !== undefined) {
    body = JSON.stringify(opts.body);
    headers['Content-Type'] = 'application/json';
  }
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      method: opts.method ?? (body ? 'POST' : 'GET'),
      headers,
      body,
      credentials: 'same-origin',
      signal: opts.signal,
    });
  } catch (err) {
    // A request we cancelled says nothing about the network.
    if (!opts.signal?.aborted) onReach?.(false);
    throw err;
  }
  onReach?.(true);
  if (res.status === 204) return undefined;
  const isJson = (res.headers.get('content-type') ?? '').includes('json');
  const data: unknown = isJson ? await res.json() : await res.text();
  if (!res.ok) {
    const error = problemError(res.status, isJson ? data : {});
    // Only a lost session signs the user out; other 401s (a wrong password re-entered at sign-off) do not.
    if (res.status === 401 && error.code === 'unauthenticated' && !path.startsWith('/auth/')) onUnauthenticated?.();
    throw error;
  }
  return data;
}

// ---------- fetchers from contracts ----------

/** Answers are parsed with the contract's schema in development and tests; the production build trusts the server. */
const CHECK_ANSWERS = import.meta.env.DEV;

/** The answer of a route, typed by its contract (and, in development and tests, parsed by its schema). */
export function answerOf<C extends Contract>(c: C, data: unknown): AnswerOf<C> {
  if (CHECK_ANSWERS && c.answer.kind === 'json') c.answer.schema.parse(data);
  return data as AnswerOf<C>;
}

type Query = Record<string, string | number | boolean | null | undefined>;

/** The path of a route under /api, params filled in (encoded) and the query's set values appended. */
export function pathOf<C extends Contract>(c: C, params?: ParamsIn<C>, query?: QueryIn<C>): string {
  const values: Record<string, unknown> = isRecord(params) ? params : {};
  const path = c.path.replace(/:(\w+)/g, (_m, name: string) => {
    if (values[name] === undefined || values[name] === null) throw new Error(`${c.method} ${c.path} needs the path parameter ${name}.`);
    return encodeURIComponent(String(values[name]));
  });
  const set = Object.entries((query ?? {}) as Query).filter(
    (e): e is [string, string | number | boolean] => e[1] !== undefined && e[1] !== null && e[1] !== '',
  );
  return set.length > 0 ? `${path}?${new URLSearchParams(set.map(([k, v]) => [k, String(v)]))}` : path;
}

/** The address of a route for a plain link (CSV, PDF, ZIP downloads): the browser sends the cookie. */
export const urlOf = <C extends Contract>(c: C, params?: ParamsIn<C>, query?: QueryIn<C>) =>
  c.mount === 'root' ? pathOf(c, params, query) : `/api${pathOf(c, params, query)}`;

type NeedsParams<C extends Contract> = C['path'] extends `${string}:${string}` ? true : false;
export type CallInput<C extends Contract> = (NeedsParams<C> extends true ? { params: ParamsIn<C> } : { params?: undefined }) &
  (QueryIn<C> extends undefined ? { query?: undefined } : { query?: QueryIn<C> }) &
  (BodyIn<C> extends undefined ? { body?: undefined } : { body: BodyIn<C> }) & {
    headers?: Record<string, string>;
    signal?: AbortSignal;
  };
type Args<C extends Contract> =
  NeedsParams<C> extends true ? [CallInput<C>] : BodyIn<C> extends undefined ? [CallInput<C>?] : [CallInput<C>];

/** Calls the route of a contract. */
export async function call<C extends Contract>(c: C, ...[input]: Args<C>): Promise<AnswerOf<C>> {
  const { params, query, body, headers, signal } = (input ?? {}) as CallInput<Contract>;
  const opts: RequestOptions = { method: c.method, headers, signal };
  if (body !== undefined) {
    opts.body = body as RequestOptions['body'];
    if (typeof body === 'string' && typeof c.body === 'object' && 'kind' in c.body && c.body.kind === 'text')
      opts.contentType = c.body.contentTypes[0];
  } else if (c.method !== 'GET' && c.method !== 'DELETE') {
    // A write without a body of its own sends {} (JSON), as it always has.
    opts.body = {};
  }
  return answerOf(c, await apiRequest(pathOf(c, params as ParamsIn<C>, query as QueryIn<C>), opts));
}

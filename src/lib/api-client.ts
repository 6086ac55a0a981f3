// One fetch wrapper: JSON in and out, problem+json turned into ApiError, cookies sent.
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

type Json = Record<string, unknown> | unknown[] | string | number | boolean | null;

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

export async function apiRequest<T>(path: string, opts: RequestOptions = {}): Promise<T> {
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
  if (res.status === 204) return undefined as T;
  const isJson = (res.headers.get('content-type') ?? '').includes('json');
  const data = isJson ? await res.json() : await res.text();
  if (!res.ok) {
    const p = (isJson ? data : {}) as { code?: string; detail?: string; errors?: FieldError[] };
    // Only a missing session signs the user out; a wrong re-entered password (sign-off) does not.
    // Only a lost session signs the user out; other 401s (a wrong password re-entered at sign-off) do not.
    if (res.status === 401 && p.code === 'unauthenticated' && !path.startsWith('/auth/')) onUnauthenticated?.();
    throw new ApiError(res.status, p.code ?? 'error', p.detail ?? `The server answered ${res.status}.`, p.errors ?? [], p as Record<string, unknown>);
  }
  return data as T;
}

export const api = {
  get: <T>(path: string, signal?: AbortSignal) => apiRequest<T>(path, { signal }),
  post: <T>(path: string, body?: Json, headers?: Record<string, string>) =>
    apiRequest<T>(path, { method: 'POST', body: body ?? {}, headers }),
  put: <T>(path: string, body: Json, headers?: Record<string, string>) => apiRequest<T>(path, { method: 'PUT', body, headers }),
  patch: <T>(path: string, body: Json, headers?: Record<string, string>) =>
    apiRequest<T>(path, { method: 'PATCH', body, headers }),
  delete: <T>(path: string, headers?: Record<string, string>) => apiRequest<T>(path, { method: 'DELETE', headers }),
};

import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError, type FieldError } from '../lib/app-error';

// RFC 9457 problem details for every API error.
export function sendProblem(
  res: Parameters<RequestHandler>[1],
  status: number,
  code: string,
  detail: string,
  extra: Record<string, unknown> = {},
) {
  res.status(status).type('application/problem+json').json(problemBody({ status, code, detail, extra }));
}

function titleFor(status: number): string {
  return (
    {
      400: 'Bad request',
      401: 'Not signed in',
      403: 'Not allowed',
      404: 'Not found',
      409: 'Conflict',
      412: 'Changed meanwhile',
      413: 'Too large',
      415: 'Unsupported type',
      421: 'Misdirected request',
      422: 'Invalid input',
      428: 'Precondition required',
      429: 'Too many requests',
      503: 'Busy',
    }[status] ?? (status >= 500 ? 'Server error' : 'Error')
  );
}

export function zodFieldErrors(err: ZodError): FieldError[] {
  return err.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || '(body)',
    message: issue.code === 'unrecognized_keys' ? `Unknown field(s): ${issue.keys.join(', ')}` : issue.message,
  }));
}

export const notFoundApi: RequestHandler = (req, res) =>
  sendProblem(res, 404, 'no-such-route', `There is no API route ${req.method} ${req.path}.`);

export interface Problem {
  status: number;
  code: string;
  detail: string;
  extra?: Record<string, unknown>;
}

/** An error as an RFC 9457 problem: status, code, a sentence, extra members; null for an unexpected error (a bug). */
export function problemFor(err: unknown): Problem | null {
  if (err instanceof ZodError) {
    const errors = zodFieldErrors(err);
    const summary = errors.map((e) => `${e.path}: ${e.message}`).join('; ');
    return { status: 422, code: 'invalid-input', detail: `Some fields are not right — ${summary}`, extra: { errors } };
  }
  if (err instanceof AppError) return { status: err.status, code: err.code, detail: err.message, extra: err.extra };
  // body-parser and multer errors carry a status and a type.
  const e = err as { status?: number; type?: string; code?: string; message?: string };
  if (e.type === 'entity.parse.failed') return { status: 400, code: 'malformed-json', detail: 'The request body is not valid JSON.' };
  if (e.type === 'entity.too.large') return { status: 413, code: 'body-too-large', detail: 'The request body is too large.' };
  if (e.type === 'charset.unsupported' || e.type === 'encoding.unsupported')
    return { status: 415, code: 'unsupported-encoding', detail: 'The request body encoding is not supported.' };
  if (e.code === 'LIMIT_FILE_SIZE') return { status: 413, code: 'file-too-large', detail: 'The file is too large.' };
  if (typeof e.code === 'string' && e.code.startsWith('LIMIT_'))
    return { status: 400, code: 'bad-upload', detail: e.message ?? 'The upload is not acceptable.' };
  if (typeof e.status === 'number' && e.status >= 400 && e.status < 500)
    return { status: e.status, code: 'bad-request', detail: e.message ?? 'The request is not acceptable.' };
  return null;
}

export const SERVER_ERROR = { status: 500, code: 'server-error', detail: 'Something went wrong on our side. It has been logged.' } as const;

/** The problem+json body itself, for answers that carry several (a batch of readings). */
export function problemBody(p: Problem) {
  return { type: `/problems/${p.code}`, title: titleFor(p.status), status: p.status, code: p.code, detail: p.detail, ...p.extra };
}

/** The problem an error is answered with and, if it says when to come back, its Retry-After; a bug is logged. */
export function answerForError(err: unknown, log: (msg: string, err: unknown) => void): { problem: Problem; retryAfter?: string } {
  // A refusal that says when to come back (a full worker pool) says so in the standard header too.
  const retryAfter =
    err instanceof AppError && typeof err.extra.retryAfterSeconds === 'number' ? String(err.extra.retryAfterSeconds) : undefined;
  const problem = problemFor(err);
  if (problem) return { problem, retryAfter };
  log('unhandled error', err);
  return { problem: SERVER_ERROR, retryAfter };
}

export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    if (res.headersSent) return;
    const { problem, retryAfter } = answerForError(err, log);
    if (retryAfter) res.set('Retry-After', retryAfter);
    return sendProblem(res, problem.status, problem.code, problem.detail, problem.extra);
  };
}

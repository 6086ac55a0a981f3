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
  res
    .status(status)
    .type('application/problem+json')
    .json({ type: `/problems/${code}`, title: titleFor(status), status, code, detail, ...extra });
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

export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    if (res.headersSent) return;
    if (err instanceof ZodError) {
      const errors = zodFieldErrors(err);
      const summary = errors.map((e) => `${e.path}: ${e.message}`).join('; ');
      return sendProblem(res, 422, 'invalid-input', `Some fields are not right — ${summary}`, { errors });
    }
    if (err instanceof AppError) {
      if (typeof err.extra.retryAfterSeconds === 'number') res.set('Retry-After', String(err.extra.retryAfterSeconds));
      return sendProblem(res, err.status, err.code, err.message, err.extra);
    }
    // body-parser and multer errors carry a status and a type.
    const e = err as { status?: number; type?: string; code?: string; message?: string };
    if (e.type === 'entity.parse.failed')
      return sendProblem(res, 400, 'malformed-json', 'The request body is not valid JSON.');
    if (e.type === 'entity.too.large') return sendProblem(res, 413, 'body-too-large', 'The request body is too large.');
    if (e.type === 'charset.unsupported' || e.type === 'encoding.unsupported')
      return sendProblem(res, 415, 'unsupported-encoding', 'The request body encoding is not supported.');
    if (e.code === 'LIMIT_FILE_SIZE') return sendProblem(res, 413, 'file-too-large', 'The file is too large.');
    if (typeof e.code === 'string' && e.code.startsWith('LIMIT_'))
      return sendProblem(res, 400, 'bad-upload', e.message ?? 'The upload is not acceptable.');
    if (typeof e.status === 'number' && e.status >= 400 && e.status < 500)
      return sendProblem(res, e.status, 'bad-request', e.message ?? 'The request is not acceptable.');
    log('unhandled error', err);
    return sendProblem(res, 500, 'server-error', 'Something went wrong on our side. It has been logged.');
  };
}

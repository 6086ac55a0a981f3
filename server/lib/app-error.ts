// One error model: a status, a stable code, a sentence a person understands.
export interface FieldError {
  path: string;
  message: string;
}

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly extra: { errors?: FieldError[]; [key: string]: unknown } = {},
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const badRequest = (code: string, message: string, extra?: AppError['extra']) => new AppError(400, code, message, extra);
export const unauthorized = (message = 'Please sign in first.') => new AppError(401, 'unauthenticated', message);
export const forbidden = (message = 'You are not allowed to do this.') => new AppError(403, 'forbidden', message);
export const notFound = (what = 'That item') => new AppError(404, 'not-found', `${what} was not found.`);
export const conflict = (code: string, message: string, extra?: AppError['extra']) => new AppError(409, code, message, extra);
export const unprocessable = (code: string, message: string, extra?: AppError['extra']) => new AppError(422, code, message, extra);
export const preconditionFailed = (message: string, extra?: AppError['extra']) => new AppError(412, 'stale-version', message, extra);

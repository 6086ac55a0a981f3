import type { RequestHandler } from 'express';

// One line per request: method, path without query (which may carry tokens), status, time.
// Never bodies, cookies or authorization headers.
export function requestLog(write: (line: string) => void): RequestHandler {
  return (req, res, next) => {
    const started = process.hrtime.bigint();
    res.on('finish', () => write(requestLine(req.method, req.originalUrl, res.statusCode, started, req.user?.id)));
    next();
  };
}

/** The log line of one request that started at `started` (process.hrtime.bigint()) and has finished. */
export function requestLine(method: string, url: string, status: number, started: bigint, userId?: string): string {
  const ms = Number(process.hrtime.bigint() - started) / 1e6;
  const path = url.split('?')[0].replace(/\/set-password\/[^/]+/, '/set-password/…');
  return `${method} ${path} ${status} ${ms.toFixed(1)}ms${userId ? ` user=${userId}` : ''}`;
}

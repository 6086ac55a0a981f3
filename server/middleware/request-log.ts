import type { RequestHandler } from 'express';

// One line per request: method, path without query (which may carry tokens), status, time.
// Never bodies, cookies or authorization headers.
export function requestLog(write: (line: string) => void): RequestHandler {
  return (req, res, next) => {
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      const path = req.originalUrl.split('?')[0].replace(/\/set-password\/[^/]+/, '/set-password/…');
      write(`${req.method} ${path} ${res.statusCode} ${ms.toFixed(1)}ms${req.user ? ` user=${req.user.id}` : ''}`);
    });
    next();
  };
}

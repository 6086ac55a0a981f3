import type { RequestHandler } from 'express';
import type { z } from 'zod';

// Parses req.body / req.query / req.params with the shared schema and replaces them with the parsed
// value; a ZodError goes to the error handler, which answers 422 problem+json with field errors.
type Part = 'body' | 'query' | 'params';

export function validate<S extends z.ZodType>(schema: S, part: Part = 'body'): RequestHandler {
  return (req, _res, next) => {
    const parsed = schema.parse(part === 'body' && req.body === undefined ? {} : req[part]);
    if (part === 'query') Object.defineProperty(req, 'query', { value: parsed, writable: true });
    else (req as unknown as Record<Part, unknown>)[part] = parsed;
    next();
  };
}

/** The value a validate() middleware left on the request, typed. */
export function parsed<S extends z.ZodType>(_schema: S, value: unknown): z.output<S> {
  return value as z.output<S>;
}

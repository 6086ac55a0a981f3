import { z } from 'zod';
import { contract, json } from './contract';

export const healthContracts = {
  /** 503 with db: error when the database does not answer. */
  get: contract({
    method: 'GET',
    path: '/health',
    access: 'public',
    answer: json(z.strictObject({ status: z.enum(['ok', 'degraded']), db: z.enum(['ok', 'error']), version: z.string() }), 200, 503),
  }),
};

import { z } from 'zod';

// Validated once at start; every bad variable is listed, then the process stops.
const envSchema = z
  .object({
    NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    HOST: z.string().default('0.0.0.0'),
    APP_ORIGIN: z.url().optional(),
    DATABASE_PATH: z.string().min(1).default('data/stripwarden.db'),
    DATA_DIR: z.string().min(1).optional(),
    SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
    SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).default(12 * 60),
    SESSION_ABSOLUTE_HOURS: z.coerce.number().int().min(1).default(7 * 24),
    PASSWORD_HASH_COST: z.enum(['default', 'test']).default('default'),
    SMTP_URL: z.string().optional(),
    SMTP_FAKE_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
    MAIL_FROM: z.string().default('Stripwarden <no-reply@stripwarden.localhost>'),
    SIGNIN_RATE_LIMIT: z.coerce.number().int().min(1).default(10),
    SIGNING_KEY_PATH: z.string().optional(),
    SEED_DEMO: z.enum(['auto', 'never']).default('auto'),
    LOG_REQUESTS: z.enum(['on', 'off']).default('on'),
    // The longest result a fault-location method may give when no cable length is sent.
    FAULT_MAX_CABLE_LENGTH_M: z.coerce.number().positive().max(1e6).default(2000),
  })
  .transform((e) => ({
    ...e,
    APP_ORIGIN: (e.APP_ORIGIN ?? `http://localhost:${e.PORT}`).replace(/\/$/, ''),
    DATA_DIR: e.DATA_DIR ?? dirnameOf(e.DATABASE_PATH),
  }));

function dirnameOf(path: string): string {
  const i = path.lastIndexOf('/');
  return i <= 0 ? '.' : path.slice(0, i);
}

export type Env = z.output<typeof envSchema>;

export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.') || '(env)'}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  return parsed.data;
}

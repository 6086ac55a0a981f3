import { isIP } from 'node:net';
import { z } from 'zod';

/**
 * A whole-number variable. An empty value (`PORT=`) is refused like any other bad one: zod's
 * coercion would read it as 0, and a server on port 0 listens somewhere nobody knows.
 */
const wholeNumber = (name: string, min: number, max: number) =>
  z
    .string()
    .trim()
    .regex(/^\d+$/, `${name} must be a whole number from ${min} to ${max}`)
    .transform(Number)
    .pipe(z.number().int().min(min, `${name} must be at least ${min}`).max(max, `${name} must be at most ${max}`));

const HOST_NAME = /^(?=.{1,253}$)[a-z0-9]([a-z0-9-]{0,61}[a-z0-9])?(\.[a-z0-9]([a-z0-9-]{0,61}[a-z0-9])?)*$/;

/** ALLOWED_HOSTS: host names (no port, no scheme), separated by commas or spaces. */
const allowedHosts = z
  .string()
  .default('')
  .transform((s) =>
    s
      .split(/[\s,]+/)
      .map((h) => h.trim().toLowerCase().replace(/\.$/, ''))
      .filter(Boolean),
  )
  .superRefine((hosts, ctx) => {
    for (const h of hosts) {
      if (!HOST_NAME.test(h) && !isIP(h.replace(/^\[|\]$/g, ''))) {
        ctx.addIssue({
          code: 'custom',
          message: `ALLOWED_HOSTS: "${h}" is not a host name (give names like tablets.example.org, without scheme or port)`,
        });
      }
    }
  });

// Validated once at start; every bad variable is listed, then the process stops.
const envSchema = z
  .object({
    NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
    PORT: wholeNumber('PORT', 1, 65535).default(3000),
    HOST: z.string().default('0.0.0.0'),
    APP_ORIGIN: z.url().optional(),
    ALLOWED_HOSTS: allowedHosts,
    DATABASE_PATH: z.string().min(1).default('data/stripwarden.db'),
    DATA_DIR: z.string().min(1).optional(),
    SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
    SESSION_IDLE_MINUTES: wholeNumber('SESSION_IDLE_MINUTES', 1, 10_000_000).default(12 * 60),
    SESSION_ABSOLUTE_HOURS: wholeNumber('SESSION_ABSOLUTE_HOURS', 1, 1_000_000).default(7 * 24),
    PASSWORD_HASH_COST: z.enum(['default', 'test']).default('default'),
    SMTP_URL: z.string().optional(),
    // 0 is allowed here: the local fake then takes any free port (the tests use that).
    SMTP_FAKE_PORT: wholeNumber('SMTP_FAKE_PORT', 0, 65535).default(2525),
    MAIL_FROM: z.string().default('Stripwarden <no-reply@stripwarden.localhost>'),
    SIGNIN_RATE_LIMIT: wholeNumber('SIGNIN_RATE_LIMIT', 1, 10_000_000).default(10),
    SIGNING_KEY_PATH: z.string().optional(),
    SEED_DEMO: z.enum(['auto', 'never']).default('auto'),
    LOG_REQUESTS: z.enum(['on', 'off']).default('on'),
    // Every API answer checked against its contract (shared/contracts): on in tests, npm run dev and
    // the end-to-end run; off by default, so a venue's server does no extra work per request.
    CHECK_RESPONSES: z.enum(['on', 'off']).optional(),
    // The longest result a fault-location method may give when no cable length is sent.
    FAULT_MAX_CABLE_LENGTH_M: z.coerce.number().positive().max(1e6).default(2000),
  })
  .transform((e) => ({
    ...e,
    APP_ORIGIN: (e.APP_ORIGIN ?? `http://localhost:${e.PORT}`).replace(/\/$/, ''),
    DATA_DIR: e.DATA_DIR ?? dirnameOf(e.DATABASE_PATH),
    CHECK_RESPONSES: e.CHECK_RESPONSES ?? (e.NODE_ENV === 'test' ? ('on' as const) : ('off' as const)),
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

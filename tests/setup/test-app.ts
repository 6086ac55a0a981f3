import { copyFileSync, mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { loadEnv } from '../../server/config/env';
import { openDatabase } from '../../server/db/client';
import { createApp } from '../../server/app';
import { TEST_SCRYPT } from '../../server/auth/password';
import { startFakeSmtp } from '../../server/mail/fake-smtp';
import { createMailer } from '../../server/mail/mailer';
import type { AppDeps, Logger } from '../../server/deps';
import { seedDemo } from '../../server/db/seed-demo';
import { TEMPLATE_DIR } from './global-setup';

export const ORIGIN = 'http://localhost:3999';
export const DEMO_PASSWORD = 'demo-strip-2026';
export const DEMO = {
  admin: 'ada@lakeshore.example',
  organiser: 'nina@lakeshore.example',
  director: 'marco@lakeshore.example',
  technician: 'sam@lakeshore.example',
  annexTechnician: 'lee@lakeshore.example',
} as const;

const quietLog: Logger = { info: () => {}, error: (msg, err) => console.error(msg, err) };

/** A real SQLite file per test file, copied from the migrated template, with the demo scenario. */
export async function createTestApp(opts: { seed?: boolean; env?: Record<string, string>; distDir?: string } = {}) {
  const dir = resolve('.tmp/test-db', randomUUID());
  mkdirSync(dir, { recursive: true });
  const dbPath = resolve(dir, 'test.db');
  copyFileSync(resolve(TEMPLATE_DIR, 'template.db'), dbPath);
  const env = loadEnv({
    NODE_ENV: 'test',
    DATABASE_PATH: dbPath,
    APP_ORIGIN: ORIGIN,
    PASSWORD_HASH_COST: 'test',
    LOG_REQUESTS: 'off',
    SIGNIN_RATE_LIMIT: '1000',
    ...opts.env,
  });
  const { db, sqlite } = openDatabase(dbPath);
  const smtp = await startFakeSmtp(db, 0);
  const deps: AppDeps = {
    env,
    db,
    sqlite,
    mailer: createMailer(`smtp://127.0.0.1:${smtp.port}`, env.MAIL_FROM),
    sessionSecret: new TextEncoder().encode('test-secret-test-secret-test-secret!'),
    scrypt: TEST_SCRYPT,
    log: quietLog,
    version: '0.0.0-test',
  };
  if (opts.seed !== false) await seedDemo(db, TEST_SCRYPT);
  const app = createApp(deps, { distDir: opts.distDir });
  const request = supertest(app);

  /** A supertest agent signed in as the given demo user, sending our Origin on every write. */
  async function agentFor(email: string, password = DEMO_PASSWORD) {
    const agent = supertest.agent(app).set('Origin', ORIGIN);
    const res = await agent.post('/api/auth/sign-in').send({ email, password });
    if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return agent;
  }

  async function close() {
    deps.mailer.close();
    await smtp.close();
    sqlite.close();
  }
  return { app, deps, db, sqlite, request, agentFor, close, dir };
}
export type TestApp = Awaited<ReturnType<typeof createTestApp>>;

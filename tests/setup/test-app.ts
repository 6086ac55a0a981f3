import { copyFileSync, mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { loadEnv } from '../../server/config/env';
import { openDatabase } from '../../server/db/client';
import { createApp } from '../../server/app';
import { TEST_SCRYPT } from '../../server/auth/password';
import { startFakeSmtp, type OneTimeLink } from '../../server/mail/fake-smtp';
import { createMailer } from '../../server/mail/mailer';
import type { AppDeps, Logger } from '../../server/deps';
import { seedDemo } from '../../server/db/seed-demo';
import { endPhotoMetadataTool } from '../../server/storage/photo-metadata';
import { createWorkerPool, type WorkerPoolOptions } from '../../server/workers/pool';
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
export async function createTestApp(
  opts: { seed?: boolean; env?: Record<string, string>; distDir?: string; workers?: WorkerPoolOptions } = {},
) {
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
  // What the server would print on its console: the one-time links the local SMTP fake withheld.
  const oneTimeLinks: OneTimeLink[] = [];
  const smtp = await startFakeSmtp(db, 0, { onOneTimeLink: (l) => oneTimeLinks.push(l) });
  const deps: AppDeps = {
    env,
    db,
    sqlite,
    mailer: createMailer(`smtp://127.0.0.1:${smtp.port}`, env.MAIL_FROM, { localFake: true }),
    sessionSecret: new TextEncoder().encode('test-secret-test-secret-test-secret!'),
    scrypt: TEST_SCRYPT,
    log: quietLog,
    version: '0.0.0-test',
    workers: createWorkerPool(opts.workers ?? { threads: 1, queue: 8 }),
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

  /**
   * The latest one-time link mailed to this address, as the server prints it on its console; waits
   * for it (a reset link is sent after the answer), at most 10 s.
   */
  async function linkSentTo(email: string, opts: { after?: number } = {}): Promise<{ link: string; token: string }> {
    for (let i = 0; i < 500; i++) {
      const found = oneTimeLinks
        .slice(opts.after ?? 0)
        .filter((l) => l.to.includes(email))
        .at(-1);
      if (found) return { link: found.link, token: found.link.split('/set-password/')[1]! };
      await new Promise((r) => setTimeout(r, 20));
    }
    throw new Error(`no one-time link was sent to ${email}`);
  }

  async function close() {
    await deps.workers.close();
    // The ExifTool process the photos started (server/index.ts ends it at shutdown the same way).
    await endPhotoMetadataTool();
    deps.mailer.close();
    await smtp.close();
    sqlite.close();
  }
  return { app, deps, db, sqlite, request, agentFor, close, dir, oneTimeLinks, linkSentTo };
}
export type TestApp = Awaited<ReturnType<typeof createTestApp>>;

import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { createRequire } from 'node:module';
import type { Env } from './config/env';
import type { AppDeps, Logger } from './deps';
import { openDatabase } from './db/client';
import { createMailer } from './mail/mailer';
import { startFakeSmtp } from './mail/fake-smtp';
import { DEFAULT_SCRYPT, TEST_SCRYPT } from './auth/password';
import { PRIVATE_FILE_MODE, privateDir, tighten } from './storage/private-files';
import { createWorkerPool, defaultWorkerPoolOptions } from './workers/pool';

const pkg = createRequire(import.meta.url)('../package.json') as { version: string };

export const consoleLogger: Logger = {
  info: (msg) => console.log(`${new Date().toISOString()} ${msg}`),
  error: (msg, err) => console.error(`${new Date().toISOString()} ERROR ${msg}`, err ?? ''),
};

/** A secret kept in the data folder with owner-only permissions, made on first start. */
export function loadOrCreateSecret(dataDir: string, file: string): Buffer {
  privateDir(dataDir, { tightenExisting: false });
  const path = join(dataDir, file);
  if (existsSync(path)) {
    tighten(path, PRIVATE_FILE_MODE);
    const text = readFileSync(path, 'utf8').trim();
    const secret = Buffer.from(text, 'base64');
    // Never the file's content in the message: it is a secret, however damaged.
    if (!/^[A-Za-z0-9+/]+={0,2}$/.test(text) || secret.length < 32) {
      throw new Error(
        `The secret file ${path} is not valid: it must hold the base64 text of at least 32 random bytes. ` +
          'Restore it from a backup, or delete it to have a new one made (everyone is then signed out).',
      );
    }
    return secret;
  }
  const secret = randomBytes(32);
  writeFileSync(path, secret.toString('base64'), { mode: PRIVATE_FILE_MODE, flag: 'wx' });
  return secret;
}

export async function buildDeps(env: Env, log: Logger = consoleLogger) {
  const { db, sqlite } = openDatabase(env.DATABASE_PATH);
  const sessionSecret = env.SESSION_SECRET
    ? new TextEncoder().encode(env.SESSION_SECRET)
    : new Uint8Array(loadOrCreateSecret(env.DATA_DIR, 'session-secret'));
  let fakeSmtp: Awaited<ReturnType<typeof startFakeSmtp>> | null = null;
  let smtpUrl = env.SMTP_URL;
  if (!smtpUrl) {
    // The console belongs to whoever runs this machine: the one place a demo's one-time links are shown.
    fakeSmtp = await startFakeSmtp(db, env.SMTP_FAKE_PORT, {
      onOneTimeLink: (l) => log.info(`One-time link for ${l.to} ("${l.subject}"; local SMTP fake, not shown in the outbox): ${l.link}`),
    });
    smtpUrl = `smtp://127.0.0.1:${fakeSmtp.port}`;
  }
  const deps: AppDeps = {
    env,
    db,
    sqlite,
    mailer: createMailer(smtpUrl, env.MAIL_FROM, { localFake: fakeSmtp !== null }),
    sessionSecret,
    scrypt: env.PASSWORD_HASH_COST === 'test' ? TEST_SCRYPT : DEFAULT_SCRYPT,
    log,
    version: pkg.version,
    workers: createWorkerPool(defaultWorkerPoolOptions()),
  };
  const close = async () => {
    await deps.workers.close();
    deps.mailer.close();
    await fakeSmtp?.close();
    sqlite.close();
  };
  return { deps, close, fakeSmtpPort: fakeSmtp?.port ?? null };
}

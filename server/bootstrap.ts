import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { createRequire } from 'node:module';
import type { Env } from './config/env';
import type { AppDeps, Logger } from './deps';
import { openDatabase } from './db/client';
import { createMailer } from './mail/mailer';
import { startFakeSmtp } from './mail/fake-smtp';
import { DEFAULT_SCRYPT, TEST_SCRYPT } from './auth/password';

const pkg = createRequire(import.meta.url)('../package.json') as { version: string };

export const consoleLogger: Logger = {
  info: (msg) => console.log(`${new Date().toISOString()} ${msg}`),
  error: (msg, err) => console.error(`${new Date().toISOString()} ERROR ${msg}`, err ?? ''),
};

/** A secret kept in the data folder with owner-only permissions, made on first start. */
export function loadOrCreateSecret(dataDir: string, file: string): Buffer {
  mkdirSync(dataDir, { recursive: true });
  const path = join(dataDir, file);
  if (existsSync(path)) return Buffer.from(readFileSync(path, 'utf8').trim(), 'base64');
  const secret = randomBytes(32);
  writeFileSync(path, secret.toString('base64'), { mode: 0o600 });
  chmodSync(path, 0o600);
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
    fakeSmtp = await startFakeSmtp(db, env.SMTP_FAKE_PORT);
    smtpUrl = `smtp://127.0.0.1:${fakeSmtp.port}`;
  }
  const deps: AppDeps = {
    env,
    db,
    sqlite,
    mailer: createMailer(smtpUrl, env.MAIL_FROM),
    sessionSecret,
    scrypt: env.PASSWORD_HASH_COST === 'test' ? TEST_SCRYPT : DEFAULT_SCRYPT,
    log,
    version: pkg.version,
  };
  const close = async () => {
    deps.mailer.close();
    await fakeSmtp?.close();
    sqlite.close();
  };
  return { deps, close, fakeSmtpPort: fakeSmtp?.port ?? null };
}

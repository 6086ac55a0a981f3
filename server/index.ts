import { loadEnv, type Env } from './config/env';
import { buildDeps, consoleLogger } from './bootstrap';
import { createApp } from './app';
import { seedDemo } from './db/seed-demo';
import { currentSigningKey } from './signing/signing-keys';
import { endPhotoMetadataTool } from './storage/photo-metadata';

// listen + graceful shutdown only; everything else is in createApp().
let env;
try {
  env = loadEnv();
} catch (err) {
  console.error((err as Error).message);
  process.exit(1);
}

// A start-up failure prints its sentence, not a stack: the messages name the file and what is
// wrong with it, and never its content (a key or a secret).
async function start(e: Env) {
  const built = await buildDeps(e);
  if (e.SEED_DEMO === 'auto') {
    const seeded = await seedDemo(built.deps.db, built.deps.scrypt);
    if (seeded) consoleLogger.info('Empty database: the demo scenario was created.');
  }
  // The certificate signing key exists from the first start (generated into DATA_DIR if not configured).
  await currentSigningKey(built.deps.db, e);
  return built;
}
let built;
try {
  built = await start(env);
} catch (err) {
  console.error(`Stripwarden could not start: ${(err as Error).message}`);
  process.exit(1);
}
const { deps, close, fakeSmtpPort } = built;
const app = createApp(deps);
const server = app.listen(env.PORT, env.HOST, () => {
  const url = env.APP_ORIGIN;
  console.log(`
  Stripwarden is running at ${url}
  E-mail: ${fakeSmtpPort ? `local fake SMTP on 127.0.0.1:${fakeSmtpPort} (messages under People › Outbox; one-time links are printed here)` : 'SMTP_URL'}

  Demo sign-ins (password demo-strip-2026, demo only):
    ada@lakeshore.example    admin
    nina@lakeshore.example   organiser
    marco@lakeshore.example  technical director
    sam@lakeshore.example    technician (Riverside Sports Hall)
    lee@lakeshore.example    technician (Riverside Annex)
`);
});

let stopping = false;
function shutdown(signal: string) {
  if (stopping) return;
  stopping = true;
  consoleLogger.info(`${signal}: finishing open requests, then stopping.`);
  server.close(async () => {
    await Promise.all([close(), endPhotoMetadataTool()]);
    process.exit(0);
  });
  server.closeIdleConnections();
  // Do not hang forever on a stuck connection.
  setTimeout(() => process.exit(0), 10_000).unref();
}
process.on('SIGINT', () => shutdown('SIGINT'));
process.on('SIGTERM', () => shutdown('SIGTERM'));

// Online backup of the SQLite database while the app keeps running (better-sqlite3's backup API,
// which copies pages under SQLite's own locking, so writes may go on meanwhile).
import Database from 'better-sqlite3';
import { mkdirSync, existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { loadEnv } from '../server/config/env';

const env = loadEnv();
const source = resolve(env.DATABASE_PATH);
if (!existsSync(source)) {
  console.error(`No database at ${source}.`);
  process.exit(1);
}
const stamp = new Date().toISOString().replace(/[:.]/g, '-');
const target = resolve(process.argv[2] ?? join(env.DATA_DIR, 'backups', `stripwarden-${stamp}.db`));
mkdirSync(dirname(target), { recursive: true });

const db = new Database(source, { fileMustExist: true });
db.pragma('busy_timeout = 5000');
await db.backup(target);
db.close();

const check = new Database(target, { readonly: true });
const result = check.pragma('integrity_check', { simple: true });
check.close();
if (result !== 'ok') {
  console.error(`Backup written to ${target}, but its integrity check says: ${String(result)}`);
  process.exit(1);
}
console.log(`Backup written to ${target} (integrity check: ok)`);

// `npm run backup` while the server keeps taking readings: the backup opens, passes SQLite's
// integrity check, and holds every reading acknowledged before the backup began.
import { afterAll, describe, expect, test } from 'vitest';
import Database from 'better-sqlite3';
import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { hallSteps, postReading, signIn, startChildServer, type ChildServer } from './child-server';

const PORT = 4411;
let server: ChildServer | null = null;
afterAll(async () => {
  await server?.stop('SIGKILL');
});

function runBackup(dbPath: string, target: string): Promise<{ code: number | null; out: string }> {
  return new Promise((resolve, reject) => {
    const p = spawn('npm', ['run', '--silent', 'backup', '--', target], {
      env: { ...process.env, DATABASE_PATH: dbPath },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    p.stdout.on('data', (c: Buffer) => (out += c.toString()));
    p.stderr.on('data', (c: Buffer) => (out += c.toString()));
    p.on('error', reject);
    p.on('exit', (code) => resolve({ code, out }));
  });
}

describe('npm run backup', () => {
  test(
    'when writes go on during the backup, then the backup opens, passes integrity_check and holds every reading acknowledged before it began',
    { timeout: 90_000 },
    async () => {
      server = await startChildServer(PORT);
      const { base, dir, dbPath } = server;
      const cookie = await signIn(base, 'sam@lakeshore.example');
      const { steps } = await hallSteps(base, cookie);

      const acknowledged: string[] = [];
      let writing = true;
      const writer = async (w: number) => {
        for (let i = 0; writing; i++) {
          const step = steps[(w * 131 + i) % steps.length];
          const id = randomUUID();
          const res = await postReading(base, cookie, { id, stepId: step.id, value: step.value });
          expect(res.status).toBe(201);
          await res.arrayBuffer();
          acknowledged.push(id);
        }
      };
      const writers = Array.from({ length: 8 }, (_, w) => writer(w));
      while (acknowledged.length < 200) await new Promise((r) => setTimeout(r, 10));
      const beforeBackup = [...acknowledged];
      const target = join(dir, 'backups', 'during-writes.db');
      const backup = await runBackup(dbPath, target);
      const duringBackup = acknowledged.length - beforeBackup.length;
      writing = false;
      await Promise.all(writers);

      expect(backup.code, backup.out).toBe(0);
      expect(backup.out).toContain('integrity check: ok');
      expect(existsSync(target)).toBe(true);
      expect(duringBackup, 'writes went on while the backup ran').toBeGreaterThan(0);

      const copy = new Database(target, { readonly: true });
      expect(copy.pragma('integrity_check', { simple: true })).toBe('ok');
      const has = copy.prepare('select 1 from readings where id = ?').pluck();
      const missing = beforeBackup.filter((id) => !has.get(id));
      const users = copy.prepare('select count(*) from users').pluck().get() as number;
      copy.close();
      expect(missing).toEqual([]);
      expect(users).toBeGreaterThan(0);

      await server.stop('SIGTERM');
      server = null;
    },
  );
});

// Fifty technicians, each with their own account and session, posting readings for a minute
// (LOAD_SECONDS to change it): no errors, nothing lost. Too long for every `npm test`, so it runs
// with `npm run test:reliability` (vitest.reliability.config.ts), which CI runs as well.
import { afterAll, describe, expect, test } from 'vitest';
import Database from 'better-sqlite3';
import { randomUUID } from 'node:crypto';
import { hashPassword, TEST_SCRYPT } from '../../server/auth/password';
import { DEMO_PASSWORD, hallSteps, postReading, signIn, startChildServer, type ChildServer } from './child-server';

const PORT = 4412;
const TECHNICIANS = 50;
const SECONDS = Number(process.env.LOAD_SECONDS ?? 60);
let server: ChildServer | null = null;
afterAll(async () => {
  await server?.stop('SIGKILL');
});

describe('load: 50 technicians for a minute', () => {
  test(
    `when ${TECHNICIANS} technicians post readings for ${SECONDS} s, then every answer is 201 and every acknowledged reading is stored`,
    { timeout: (SECONDS + 120) * 1000 },
    async () => {
      server = await startChildServer(PORT);
      const { base, dbPath } = server;
      const sam = await signIn(base, 'sam@lakeshore.example');
      const { hallId, steps } = await hallSteps(base, sam);

      // Fifty technician accounts assigned to the Sports Hall, put straight into the database.
      const hash = await hashPassword(DEMO_PASSWORD, TEST_SCRYPT);
      const db = new Database(dbPath);
      db.pragma('busy_timeout = 5000');
      const orgId = db.prepare("select org_id from users where email = 'sam@lakeshore.example'").pluck().get() as string;
      const emails: string[] = [];
      db.transaction(() => {
        for (let i = 1; i <= TECHNICIANS; i++) {
          const id = randomUUID();
          const email = `tech${i}@lakeshore.example`;
          emails.push(email);
          db.prepare("insert into users (id, org_id, email, name, role, password_hash) values (?, ?, ?, ?, 'technician', ?)").run(
            id,
            orgId,
            email,
            `Technician ${i}`,
            hash,
          );
          db.prepare('insert into venue_technicians (venue_id, user_id) values (?, ?)').run(hallId, id);
        }
      })();
      db.close();
      const cookies = await Promise.all(emails.map((e) => signIn(base, e)));

      const acknowledged: string[] = [];
      const failures: string[] = [];
      const latencies: number[] = [];
      const until = Date.now() + SECONDS * 1000;
      const technician = async (k: number) => {
        for (let i = 0; Date.now() < until; i++) {
          const step = steps[(k * 37 + i) % steps.length];
          const id = randomUUID();
          const t0 = performance.now();
          try {
            const res = await postReading(base, cookies[k], { id, stepId: step.id, value: step.value });
            const text = await res.text();
            latencies.push(performance.now() - t0);
            if (res.status === 201) acknowledged.push(id);
            else failures.push(`${res.status} ${text.slice(0, 200)}`);
          } catch (err) {
            failures.push(String(err));
          }
        }
      };
      await Promise.all(cookies.map((_, k) => technician(k)));
      await server.stop('SIGTERM');
      server = null;

      expect(failures.slice(0, 5), `${failures.length} failed requests`).toEqual([]);
      const check = new Database(dbPath, { readonly: true });
      expect(check.pragma('integrity_check', { simple: true })).toBe('ok');
      const has = check.prepare('select 1 from readings where id = ?').pluck();
      const lost = acknowledged.filter((id) => !has.get(id));
      const stored = check
        .prepare(`select count(*) from readings r join users u on u.id = r.taken_by where u.email like 'tech%@lakeshore.example'`)
        .pluck()
        .get() as number;
      check.close();
      expect(lost).toEqual([]);
      expect(stored).toBe(acknowledged.length);
      latencies.sort((a, b) => a - b);
      console.log(
        `load: ${acknowledged.length} readings in ${SECONDS} s (${Math.round(acknowledged.length / SECONDS)}/s) from ${TECHNICIANS} sessions; ` +
          `p50 ${latencies[Math.floor(latencies.length / 2)].toFixed(1)} ms, p99 ${latencies[Math.floor(latencies.length * 0.99)].toFixed(1)} ms`,
      );
    },
  );
});

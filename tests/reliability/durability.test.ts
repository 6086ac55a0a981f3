// The promise to technicians: a reading the server acknowledged is kept, even if the server dies.
// The real server takes concurrent reading writes and is killed with SIGKILL in the middle; after
// a restart every acknowledged reading is there and the database passes its integrity check.
import { afterAll, describe, expect, test } from 'vitest';
import Database from 'better-sqlite3';
import { randomUUID } from 'node:crypto';
import { hallSteps, postReading, signIn, startChildServer, type ChildServer } from './child-server';

const PORT = 4410;
const WRITERS = 16;
let server: ChildServer | null = null;

afterAll(async () => {
  await server?.stop('SIGKILL');
});

describe('durability under SIGKILL', () => {
  test('when the server is killed during concurrent writes, then every acknowledged reading is there after restart and integrity_check is ok', { timeout: 90_000 }, async () => {
    server = await startChildServer(PORT);
    const { base, dir, dbPath } = server;
    const cookie = await signIn(base, 'sam@lakeshore.example');
    const { steps } = await hallSteps(base, cookie);

    const acknowledged: string[] = [];
    let sent = 0;
    let failedAfterKill = 0;
    let killed = false;
    const stopAll = new AbortController();
    const writer = async (w: number) => {
      for (let i = 0; !stopAll.signal.aborted; i++) {
        const step = steps[(w * 997 + i) % steps.length];
        const id = randomUUID();
        sent++;
        try {
          const res = await postReading(base, cookie, { id, stepId: step.id, value: step.value }, stopAll.signal);
          if (res.status === 201) acknowledged.push(id);
          else if (!killed) throw new Error(`unexpected ${res.status}: ${await res.text()}`);
          await res.arrayBuffer().catch(() => undefined);
        } catch (err) {
          if (!killed) throw err;
          failedAfterKill++;
          return;
        }
      }
    };
    const writers = Array.from({ length: WRITERS }, (_, w) => writer(w));
    // Kill once a good number of writes have been acknowledged, with many more in flight.
    while (acknowledged.length < 300) await new Promise((r) => setTimeout(r, 20));
    killed = true;
    await server.stop('SIGKILL');
    stopAll.abort();
    await Promise.allSettled(writers);
    const ackedAtKill = [...acknowledged];
    expect(ackedAtKill.length).toBeGreaterThanOrEqual(300);

    // Opening the file runs SQLite's recovery of the write-ahead log, as a restart would.
    const db = new Database(dbPath);
    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    const has = db.prepare('select 1 from readings where id = ?').pluck();
    const lost = ackedAtKill.filter((id) => !has.get(id));
    db.close();
    expect(lost, `${lost.length} acknowledged readings lost of ${ackedAtKill.length}`).toEqual([]);

    // The restarted server answers them too.
    server = await startChildServer(PORT, dir);
    for (const id of ackedAtKill.slice(-20)) {
      const res = await fetch(`${base}/api/readings/${id}`, { headers: { Cookie: cookie } });
      expect(res.status, id).toBe(200);
      expect(((await res.json()) as { id: string }).id).toBe(id);
    }
    await server.stop('SIGTERM');
    server = null;
    expect(sent).toBeGreaterThan(ackedAtKill.length);
    void failedAfterKill;
  });
});

// The promise to technicians: a reading the server acknowledged is kept, even if the server dies.
// The real server takes concurrent reading writes and is killed with SIGKILL in the middle; after
// a restart every acknowledged reading is there and the database passes its integrity check.
import { afterAll, describe, expect, test } from 'vitest';
import Database from 'better-sqlite3';
import { randomUUID } from 'node:crypto';
import { hallSteps, postBatch, postReading, signIn, startChildServer, type ChildServer } from './child-server';

const PORT = 4410;
const WRITERS = 16;
const BATCH_WRITERS = 6;
const BATCH = 60;
let server: ChildServer | null = null;

afterAll(async () => {
  await server?.stop('SIGKILL');
});

describe('durability under SIGKILL', () => {
  test(
    'when the server is killed during concurrent writes, then every acknowledged reading is there after restart and integrity_check is ok',
    { timeout: 90_000 },
    async () => {
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
    },
  );

  test(
    'when the server is killed while batches of readings are written, then every reading a batch reported 201 or 200 is there, and each batch is stored whole or not at all',
    { timeout: 90_000 },
    async () => {
      server = await startChildServer(PORT);
      const { base, dbPath } = server;
      const cookie = await signIn(base, 'sam@lakeshore.example');
      const { steps } = await hallSteps(base, cookie);

      const acknowledged: string[] = [];
      const batches: string[][] = [];
      let killed = false;
      const stopAll = new AbortController();
      const writer = async (w: number) => {
        for (let b = 0; !stopAll.signal.aborted; b++) {
          // A tablet's queue, in typing order; six of them in flight are more than one group takes (256).
          const readings = Array.from({ length: BATCH }, (_, i) => {
            const step = steps[(w * 131 + b * BATCH + i) % steps.length];
            return { id: randomUUID(), stepId: step.id, value: step.value };
          });
          batches.push(readings.map((r) => r.id));
          try {
            const res = await postBatch(base, cookie, readings, stopAll.signal);
            if (res.status !== 200) {
              if (!killed) throw new Error(`unexpected ${res.status}: ${await res.text()}`);
              return;
            }
            const { results } = (await res.json()) as { results: { id: string; status: number }[] };
            for (const r of results) {
              if (r.status === 201 || r.status === 200) acknowledged.push(r.id);
              else if (!killed) throw new Error(`a reading answered ${r.status}`);
            }
          } catch (err) {
            if (!killed) throw err;
            return;
          }
        }
      };
      const writers = Array.from({ length: BATCH_WRITERS }, (_, w) => writer(w));
      while (acknowledged.length < 400) await new Promise((r) => setTimeout(r, 20));
      killed = true;
      await server.stop('SIGKILL');
      stopAll.abort();
      await Promise.allSettled(writers);
      const ackedAtKill = [...acknowledged];

      const db = new Database(dbPath);
      expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
      const has = db.prepare('select 1 from readings where id = ?').pluck();
      const lost = ackedAtKill.filter((id) => !has.get(id));
      // One commit per batch: after the crash a batch is there entirely or not at all.
      const partial = batches.map((ids) => ids.filter((id) => has.get(id)).length).filter((n) => n !== 0 && n !== BATCH);
      db.close();
      server = null;
      expect(lost, `${lost.length} acknowledged readings lost of ${ackedAtKill.length}`).toEqual([]);
      expect(partial, 'batches stored in part').toEqual([]);
      expect(batches.length * BATCH).toBeGreaterThan(ackedAtKill.length);
    },
  );
});

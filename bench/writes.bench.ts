// Reading writes through the API (signed in once, 32 connections, a fixed count) against the raw
// rate of durable single-row commits with better-sqlite3 on the same file system.
import autocannon from 'autocannon';
import Database from 'better-sqlite3';
import { v7 as uuidv7 } from 'uuid';
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { signInCookie, startServer, type BenchResult } from './lib';

// autocannon notices that a fixed-count run is over only at its next sample: with the default 1 s
// samples a 2.3 s run is reported as 3 s. Sampling every 20 ms keeps the measured duration honest.
const SAMPLE_MS = 20;
const PORT = 4401;
// Long enough (several seconds) that start and finish are a small part of the figure.
const COUNT = 20_000;
const WARM_UP = 500;

function rawCommitsPerSecond(dir: string, n: number, k: number): number {
  const db = new Database(join(dir, `raw-${k}.db`));
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = FULL');
  db.exec('create table r (id text primary key, step_id text not null, value text not null, taken_at text not null)');
  const insert = db.prepare('insert into r values (?, ?, ?, ?)');
  const t0 = performance.now();
  // The same kind of ids as the API's readings (time-ordered UUIDv7), so neither side is favoured.
  for (let i = 0; i < n; i++) insert.run(uuidv7(), 'step', '0.45', new Date().toISOString());
  const ms = performance.now() - t0;
  db.close();
  return n / (ms / 1000);
}

/** The same load against bench/http-floor-server.ts: what Express alone allows on this machine. */
async function httpFloorPerSecond(body: () => string): Promise<number> {
  const port = PORT + 50;
  const child = spawn(process.execPath, ['--import', 'tsx', 'bench/http-floor-server.ts'], {
    env: { ...process.env, PORT: String(port) },
    stdio: 'ignore',
  });
  try {
    for (let i = 0; i < 100; i++) {
      if (
        await fetch(`http://localhost:${port}/api/health`).then(
          (r) => r.ok,
          () => false,
        )
      )
        break;
      await new Promise((r) => setTimeout(r, 100));
    }
    const run = (amount: number) =>
      autocannon({
        url: `http://localhost:${port}`,
        connections: 32,
        amount,
        sampleInt: SAMPLE_MS,
        requests: [
          {
            method: 'POST',
            path: '/api/readings',
            headers: { 'Content-Type': 'application/json', Cookie: 'sw_session=x' },
            setupRequest: (req) => ({ ...req, body: body() }),
          },
        ],
      });
    await run(WARM_UP);
    const r = await run(COUNT);
    return r.requests.total / r.duration;
  } finally {
    child.kill('SIGTERM');
  }
}

export async function run(): Promise<BenchResult> {
  const server = await startServer(PORT);
  try {
    const cookie = await signInCookie(server.base, 'sam@lakeshore.example');
    const headers = { Cookie: cookie, Origin: server.base, 'Content-Type': 'application/json' };
    const venues = (await (await fetch(`${server.base}/api/venues`, { headers })).json()) as { id: string }[];
    const strips = (await (await fetch(`${server.base}/api/venues/${venues[0].id}/strips`, { headers })).json()) as { id: string }[];
    const steps: { id: string; value: string }[] = [];
    for (const s of strips) {
      const strip = (await (await fetch(`${server.base}/api/strips/${s.id}`, { headers })).json()) as {
        positions: { steps: { id: string; testKind: string }[] }[];
      };
      for (const p of strip.positions)
        for (const st of p.steps) steps.push({ id: st.id, value: st.testKind === 'insulation' ? 'OL' : '0.45' });
    }
    // The tablet nulls the test leads once and names that null in every reading.
    const leadNullId = uuidv7();
    const lead = await fetch(`${server.base}/api/lead-nulls`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ id: leadNullId, value: '0.05', meter: 'Meter 1' }),
    });
    if (!lead.ok) throw new Error(`the test-lead null was refused: ${lead.status}`);
    let i = 0;
    const load = (amount: number) =>
      autocannon({
        url: server.base,
        connections: 32,
        amount,
        sampleInt: SAMPLE_MS,
        requests: [
          {
            method: 'POST',
            path: '/api/readings',
            headers,
            setupRequest: (req) => {
              const step = steps[i++ % steps.length];
              // As the tablet sends it: its own id, the time it was typed and the lead null it used.
              return {
                ...req,
                body: JSON.stringify({ id: uuidv7(), stepId: step.id, value: step.value, takenAt: new Date().toISOString(), leadNullId }),
              };
            },
          },
        ],
      });
    await load(WARM_UP); // the server's JIT warms up on the first few hundred requests
    // Three API runs and three raw runs, taken in turns so that both see the same moments of this
    // shared machine (its disk and CPU speed drift by a fifth within minutes); the median of each.
    const apis = [];
    const raws: number[] = [];
    for (let k = 0; k < 3; k++) {
      apis.push(await load(COUNT));
      raws.push(rawCommitsPerSecond(server.dir, 5000, k));
    }
    apis.sort((a, b) => a.requests.total / a.duration - b.requests.total / b.duration);
    const api = apis[1];
    raws.sort((a, b) => a - b);
    const raw = raws[1];
    const floor = await httpFloorPerSecond(() => JSON.stringify({ id: uuidv7(), stepId: steps[0].id, value: '0.45' }));
    // requests.average is a mean of per-second buckets: coarse for a run of a few seconds.
    const writesPerSecond = api.requests.total / api.duration;
    const ratio = writesPerSecond / raw;
    const p99 = api.latency.p99;
    return {
      name: 'Reading writes through the API',
      ratio,
      ratioMeaning: 'API writes/s ÷ raw durable single-row commits/s (better-sqlite3, WAL, synchronous=FULL)',
      target: '≥ 0.5, p99 < 50 ms',
      pass: ratio >= 0.5 && p99 < 50 && apis.every((r) => r.non2xx === 0 && r.errors === 0),
      figures: {
        requests: api.requests.total,
        non2xx: api.non2xx,
        errors: api.errors,
        writesPerSecond: Math.round(writesPerSecond),
        rawCommitsPerSecond: Math.round(raw),
        // Express answering without a database (autocannon shares the two cores): the ceiling a
        // reading write served through Express would have, and why it is served directly
        // (server/http/direct-routes.ts).
        expressFloorPerSecond: Math.round(floor),
        expressFloorRatioToRaw: +(floor / raw).toFixed(3),
        p50Ms: api.latency.p50,
        p99Ms: p99,
        apiSeconds: +api.duration.toFixed(2),
        apiRunsPerSecond: apis.map((r) => Math.round(r.requests.total / r.duration)).join(' / '),
        rawRunsPerSecond: raws.map(Math.round).join(' / '),
        non2xxAllRuns: apis.reduce((n, r) => n + r.non2xx, 0),
        stepsCycled: steps.length,
      },
    };
  } finally {
    await server.stop();
  }
}

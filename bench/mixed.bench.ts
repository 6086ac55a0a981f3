// Readings while the server does large jobs: the p99 of reading writes at a steady rate, alone and
// while a 2-million-sample trace is analysed and a 120-strip venue is signed off (its certificates
// rendered) over and over. Those jobs run on the worker pool; the readings must barely notice.
// The rate is paced evenly (one reading every 1/RATE s, whatever the answers), as tablets send
// them: autocannon's overallRate sends each second's quota at once at the top of the second, which
// measures how fast a burst drains rather than what one reading waits. The large jobs are sent
// from a process of their own at the lowest priority (bench/large-jobs.ts): in a hall they come
// from tablets, whose CPU is not the server's.
import { execFile, spawn } from 'node:child_process';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import type { PacedResult } from './paced-readings';
import { fetchOnce, type LargeJobsReport, type LargeJobsSetup } from './large-jobs';
import { v7 as uuidv7 } from 'uuid';
import { signInCookie, startServer, type BenchResult } from './lib';

const PORT = 4403;
const PACED = fileURLToPath(new URL('./paced-readings.ts', import.meta.url));
const LARGE_JOBS = fileURLToPath(new URL('./large-jobs.ts', import.meta.url));
const execFileAsync = promisify(execFile);
/** Each measured run, seconds; runs alone and mixed are taken in turns. */
const RUN_SECONDS = 8;
const ROUNDS = 2;
/** Readings offered per second: many tablets at once, well below what the server sustains. */
const RATE = 300;
const STRIPS = 120;
const TRACE_SAMPLES = 2_000_000;
const PASSWORD = 'demo-strip-2026';

type Json = Record<string, unknown>;

function client(base: string, cookie: string) {
  const headers = { Cookie: cookie, Origin: base, 'Content-Type': 'application/json' };
  const call = async (method: string, path: string, body?: unknown, extra: Record<string, string> = {}) => {
    const res = await fetchOnce(`${base}${path}`, {
      method,
      headers: { ...headers, ...extra },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    return { status: res.status, etag: res.headers.get('etag') ?? '', body: (text ? JSON.parse(text) : null) as Json & Json[] };
  };
  return { headers, call };
}

/** A new venue of the demo event with 120 strips, every step with a passing reading: ready to sign off. */
async function readyVenue(base: string, marco: ReturnType<typeof client>) {
  const events = (await marco.call('GET', '/api/events')).body as unknown as { id: string }[];
  const profiles = (await marco.call('GET', '/api/profiles')).body as unknown as { id: string }[];
  const venue = await marco.call('POST', `/api/events/${events[0]!.id}/venues`, { name: 'Bench Arena', profileId: profiles[0]!.id });
  if (venue.status !== 201) throw new Error(`venue: ${venue.status} ${JSON.stringify(venue.body)}`);
  const venueId = (venue.body.venue as { id: string }).id;
  const bulk = await marco.call(
    'POST',
    `/api/venues/${venueId}/strips/bulk`,
    { count: STRIPS, prefix: 'Strip ', startAt: 1 },
    { 'If-Match': venue.etag },
  );
  if (bulk.status !== 201) throw new Error(`strips: ${bulk.status} ${JSON.stringify(bulk.body)}`);
  const strips = bulk.body.strips as { positions: { steps: { id: string; testKind: string }[] }[] }[];
  const steps = strips.flatMap((s) => s.positions.flatMap((p) => p.steps));
  // The director records them (as a technician would), 32 at a time.
  for (let i = 0; i < steps.length; i += 32) {
    const batch = steps
      .slice(i, i + 32)
      .map((st) =>
        marco.call('POST', '/api/readings', { id: uuidv7(), stepId: st.id, value: st.testKind === 'insulation' ? 'OL' : '0.45' }),
      );
    for (const r of await Promise.all(batch)) if (r.status !== 201) throw new Error(`reading: ${r.status} ${JSON.stringify(r.body)}`);
  }
  return { venueId, steps };
}

export async function run(): Promise<BenchResult> {
  const server = await startServer(PORT);
  try {
    const sam = client(server.base, await signInCookie(server.base, 'sam@lakeshore.example'));
    const marco = client(server.base, await signInCookie(server.base, 'marco@lakeshore.example'));

    // The readings load: the Sports Hall's steps, as the tablets send them.
    const venues = (await sam.call('GET', '/api/venues')).body as unknown as { id: string; name: string }[];
    const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
    const hallStrips = (await sam.call('GET', `/api/venues/${hall.id}/strips`)).body as unknown as { id: string }[];
    const hallSteps: { id: string; value: string }[] = [];
    for (const s of hallStrips) {
      const strip = (await sam.call('GET', `/api/strips/${s.id}`)).body as unknown as {
        positions: { steps: { id: string; testKind: string }[] }[];
      };
      for (const p of strip.positions)
        for (const st of p.steps) hallSteps.push({ id: st.id, value: st.testKind === 'insulation' ? 'OL' : '0.45' });
    }
    let next = 0;
    // In a process of its own: this one's event loop is busy sending the trace and reading answers,
    // and a late send here would be counted against the server.
    const readings = async (seconds: number): Promise<PacedResult> => {
      const steps = Array.from({ length: Math.ceil(seconds * RATE) }, () => hallSteps[next++ % hallSteps.length]!);
      const child = execFileAsync(process.execPath, ['--import', 'tsx', PACED], { maxBuffer: 1 << 24 });
      child.child.stdin!.end(JSON.stringify({ base: server.base, headers: sam.headers, seconds, rate: RATE, steps }));
      return JSON.parse((await child).stdout) as PacedResult;
    };

    const arena = await readyVenue(server.base, marco);
    const large = largeJobsProcess({
      base: server.base,
      technician: { Cookie: sam.headers.Cookie, Origin: server.base },
      director: { Cookie: marco.headers.Cookie, Origin: server.base },
      venueId: arena.venueId,
      password: PASSWORD,
      traceSamples: TRACE_SAMPLES,
      certificates: STRIPS + 1,
    });

    try {
      // Warm-up: the JIT, the worker threads (they start on first use) and both jobs once.
      await readings(2);
      await large.send('warm');

      const alone: PacedResult[] = [];
      const mixed: PacedResult[] = [];
      for (let round = 0; round < ROUNDS; round++) {
        alone.push(await readings(RUN_SECONDS));
        await large.send('start');
        mixed.push(await readings(RUN_SECONDS));
        await large.send('stop');
      }
      const jobs = (await large.send('report')) as unknown as LargeJobsReport;
      return result(alone, mixed, jobs, arena.steps.length);
    } finally {
      large.close();
    }
  } finally {
    await server.stop();
  }
}

/** bench/large-jobs.ts as a child process, driven one command line at a time. */
function largeJobsProcess(setup: LargeJobsSetup) {
  const child = spawn(process.execPath, ['--import', 'tsx', LARGE_JOBS], { stdio: ['pipe', 'pipe', 'inherit'] });
  const answers = createInterface({ input: child.stdout });
  const waiting: ((line: string) => void)[] = [];
  answers.on('line', (line) => waiting.shift()?.(line));
  const send = (line: string) =>
    new Promise<Json>((resolve, reject) => {
      waiting.push((answer) => {
        const parsed = JSON.parse(answer) as Json;
        if (typeof parsed.error === 'string') reject(new Error(`large jobs: ${parsed.error}`));
        else resolve(parsed);
      });
      child.stdin.write(`${line}\n`);
    });
  void send(JSON.stringify(setup));
  return { send, close: () => child.kill() };
}

function result(alone: PacedResult[], mixed: PacedResult[], jobs: LargeJobsReport, readingsCertified: number): BenchResult {
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
  const p99Alone = mean(alone.map((r) => r.p99));
  const p99Mixed = mean(mixed.map((r) => r.p99));
  const ratio = p99Mixed / p99Alone;
  const failures = [...alone, ...mixed].reduce((n, r) => n + r.failures, 0);
  return {
    name: 'Readings while a trace is analysed and a 120-strip venue is signed off',
    ratio,
    ratioMeaning: 'reading p99 with the large jobs running ÷ reading p99 alone (same rate, runs taken in turns)',
    target: '≤ 1.5',
    pass: ratio <= 1.5 && failures === 0,
    figures: {
      readingsPerSecondOffered: RATE,
      runSeconds: RUN_SECONDS,
      rounds: ROUNDS,
      p99AloneMs: +p99Alone.toFixed(1),
      p99MixedMs: +p99Mixed.toFixed(1),
      p99AloneRunsMs: alone.map((r) => r.p99.toFixed(1)).join(' / '),
      p99MixedRunsMs: mixed.map((r) => r.p99.toFixed(1)).join(' / '),
      p50AloneMs: +mean(alone.map((r) => r.p50)).toFixed(1),
      p50MixedMs: +mean(mixed.map((r) => r.p50)).toFixed(1),
      readingsSent: [...alone, ...mixed].reduce((n, r) => n + r.sent, 0),
      readingFailures: failures,
      traceSamples: TRACE_SAMPLES,
      traceMiB: +(jobs.traceBytes / 2 ** 20).toFixed(1),
      analysesDone: jobs.analyses,
      analysisMedianMs: Math.round([...jobs.analysisMs].sort((a, b) => a - b)[Math.floor(jobs.analysisMs.length / 2)] ?? NaN),
      signOffsDone: jobs.signOffs,
      signOffMedianMs: Math.round([...jobs.signOffMs].sort((a, b) => a - b)[Math.floor(jobs.signOffMs.length / 2)] ?? NaN),
      certificatesPerSignOff: STRIPS + 1,
      readingsCertified,
      busyRefusals: jobs.refused,
    },
  };
}

// The large jobs of bench/mixed.bench.ts, sent from a process of their own at the lowest CPU
// priority: a trace analysis and a sign-off, each again and again while told to. They stand for a
// technician's tablet uploading a scope export and a director signing off, on devices of their
// own: building a 38 MiB request here costs CPU the server does not pay in a hall, and on a
// two-core machine it would otherwise be taken from the server's event loop.
//
// Commands arrive one per line on stdin and are answered one line each on stdout (JSON):
// "warm" runs each job once; "start" starts both loops; "stop" waits for the jobs in hand to end;
// "report" answers the counts and times since the last warm-up.
import { readdirSync } from 'node:fs';
import { setPriority } from 'node:os';
import { createInterface } from 'node:readline';

export interface LargeJobsSetup {
  base: string;
  /** Sam's headers (the trace) and Marco's (the sign-off): cookie and origin. */
  technician: Record<string, string>;
  director: Record<string, string>;
  venueId: string;
  password: string;
  traceSamples: number;
  /** Certificates each sign-off must issue (strips + the venue's). */
  certificates: number;
}

export interface LargeJobsReport {
  analyses: number;
  signOffs: number;
  analysisMs: number[];
  signOffMs: number[];
  refused: number;
  traceBytes: number;
}

/** Every thread of this process at nice 19: on Linux a nice value belongs to each thread. */
function lowestPriority() {
  try {
    for (const tid of readdirSync('/proc/self/task')) setPriority(Number(tid), 19);
  } catch {
    setPriority(19);
  }
}

/** A scope export with an incident edge and a short's reflection, as a CSV. */
export function syntheticCsv(samples: number, noiseSeed = 7): string {
  const dt = 0.1e-9;
  const lines: string[] = ['time,volts'];
  let seed = noiseSeed;
  const noise = () => {
    seed = (seed * 1664525 + 1013904223) % 4294967296;
    return (seed / 4294967296 - 0.5) * 0.01;
  };
  for (let i = 0; i < samples; i++) {
    const t = i * dt;
    lines.push(`${t.toExponential(6)},${((t > 5e-6 ? 0.5 : 0) + (t > 5.09e-6 ? -0.4 : 0) + noise()).toFixed(5)}`);
  }
  return lines.join('\n');
}

/**
 * fetch, sent again once when the server had closed the idle keep-alive connection just as the
 * request went out (undici: "other side closed", nothing read): the request never reached it.
 */
export async function fetchOnce(url: string, init: RequestInit): Promise<Response> {
  try {
    return await fetch(url, init);
  } catch (err) {
    const cause = (err as { cause?: { code?: string; socket?: { bytesRead?: number } } }).cause;
    if (cause?.code !== 'UND_ERR_SOCKET' || cause.socket?.bytesRead !== 0) throw err;
    return fetch(url, init);
  }
}

function largeJobs(setup: LargeJobsSetup) {
  // Encoded once: the same bytes are sent each time.
  const trace = Buffer.from(syntheticCsv(setup.traceSamples));
  const report: LargeJobsReport = { analyses: 0, signOffs: 0, analysisMs: [], signOffMs: [], refused: 0, traceBytes: trace.length };
  const json = (headers: Record<string, string>) => ({ ...headers, 'Content-Type': 'application/json' });

  const analyse = async () => {
    const t0 = performance.now();
    const res = await fetchOnce(`${setup.base}/api/waveforms/analyse?velocityFactor=0.66`, {
      method: 'POST',
      headers: { ...setup.technician, 'Content-Type': 'text/csv' },
      body: trace,
    });
    await res.arrayBuffer();
    if (res.status === 503) report.refused++;
    else if (res.status !== 200) throw new Error(`analysis: ${res.status}`);
    else report.analysisMs.push(performance.now() - t0);
  };

  let renames = 0;
  const signOffAndReopen = async () => {
    const t0 = performance.now();
    const res = await fetchOnce(`${setup.base}/api/venues/${setup.venueId}/sign-off`, {
      method: 'POST',
      headers: json(setup.director),
      body: JSON.stringify({ password: setup.password }),
    });
    const body = (await res.json()) as { certificates?: unknown[] };
    if (res.status === 503) report.refused++;
    else if (res.status !== 201) throw new Error(`sign-off: ${res.status} ${JSON.stringify(body)}`);
    else {
      report.signOffMs.push(performance.now() - t0);
      if (body.certificates?.length !== setup.certificates) throw new Error(`sign-off issued ${body.certificates?.length} certificates`);
    }
    // A change to the plan re-opens the venue for the next round (a reading would only put its
    // strip out of service).
    const plan = await fetchOnce(`${setup.base}/api/venues/${setup.venueId}`, { headers: setup.director });
    await plan.arrayBuffer();
    const renamed = await fetchOnce(`${setup.base}/api/venues/${setup.venueId}`, {
      method: 'PATCH',
      headers: { ...json(setup.director), 'If-Match': plan.headers.get('etag') ?? '' },
      body: JSON.stringify({ name: `Bench Arena ${++renames}` }),
    });
    if (renamed.status !== 200) throw new Error(`re-open: ${renamed.status} ${await renamed.text()}`);
    await renamed.arrayBuffer().catch(() => undefined);
  };

  let stop = false;
  let loops: Promise<unknown> = Promise.resolve();
  const loop = async (job: () => Promise<void>, count: 'analyses' | 'signOffs') => {
    while (!stop) {
      await job();
      report[count]++;
    }
  };
  return {
    async warm() {
      await analyse();
      await signOffAndReopen();
      Object.assign(report, { analyses: 0, signOffs: 0, analysisMs: [], signOffMs: [], refused: 0 });
    },
    start() {
      stop = false;
      loops = Promise.all([loop(analyse, 'analyses'), loop(signOffAndReopen, 'signOffs')]);
    },
    async stop() {
      stop = true;
      await loops;
    },
    report: () => report,
  };
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop()!)) {
  lowestPriority();
  const lines = createInterface({ input: process.stdin });
  let jobs: ReturnType<typeof largeJobs> | null = null;
  const answer = (x: unknown) => process.stdout.write(`${JSON.stringify(x)}\n`);
  lines.on('line', (line) => {
    void (async () => {
      try {
        if (!jobs) {
          jobs = largeJobs(JSON.parse(line) as LargeJobsSetup);
          return answer({ ok: true });
        }
        if (line === 'warm') await jobs.warm();
        else if (line === 'start') jobs.start();
        else if (line === 'stop') await jobs.stop();
        else if (line === 'report') return answer(jobs.report());
        answer({ ok: true });
      } catch (err) {
        answer({ error: String(err instanceof Error ? err.message : err) });
      }
    })();
  });
  lines.on('close', () => process.exit(0));
}

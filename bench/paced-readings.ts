// Readings sent open-loop at a steady rate, as a process of its own (bench/mixed.bench.ts starts
// it): the i-th leaves at start + i/rate whether or not the earlier ones were answered, and its time
// is counted from that moment to its answer, so a late send or one waiting for a free connection
// counts against the server, as the tablet would see it. Reads its job as JSON on stdin, writes the
// result as JSON on stdout.
import { Agent, request } from 'node:http';
import { setTimeout as sleep } from 'node:timers/promises';
import { v7 as uuidv7 } from 'uuid';

export interface PacedJob {
  base: string;
  headers: Record<string, string>;
  seconds: number;
  rate: number;
  /** One step per reading to send, in order. */
  steps: { id: string; value: string }[];
}

export interface PacedResult {
  sent: number;
  failures: number;
  p50: number;
  p99: number;
}

/** The value below which the given share of the sorted list lies (nearest rank). */
const percentile = (sorted: number[], share: number) => sorted[Math.max(0, Math.ceil(share * sorted.length) - 1)] ?? NaN;

async function paced(job: PacedJob): Promise<PacedResult> {
  const url = new URL('/api/readings', job.base);
  const agent = new Agent({ keepAlive: true, maxSockets: 32 });
  const latencies: number[] = [];
  let failures = 0;
  const send = (due: number, step: { id: string; value: string }) =>
    new Promise<void>((resolve) => {
      const body = JSON.stringify({ id: uuidv7(), stepId: step.id, value: step.value, takenAt: new Date().toISOString() });
      const req = request(url, { method: 'POST', agent, headers: { ...job.headers, 'Content-Length': Buffer.byteLength(body) } }, (res) => {
        res.resume();
        res.on('end', () => {
          if (res.statusCode !== 201) failures++;
          latencies.push(performance.now() - due);
          resolve();
        });
      });
      req.on('error', () => {
        failures++;
        resolve();
      });
      req.end(body);
    });
  // The connections are opened before the clock starts, as a tablet's already are when it sends a
  // reading: a TCP handshake of this process's own is not the server's latency.
  await Promise.all(
    Array.from(
      { length: 32 },
      () =>
        new Promise<void>((resolve, reject) =>
          request(new URL('/api/health', job.base), { agent }, (res) => res.resume().on('end', resolve))
            .on('error', reject)
            .end(),
        ),
    ),
  );
  const interval = 1000 / job.rate;
  const total = Math.min(job.steps.length, Math.round(job.seconds * job.rate));
  const start = performance.now();
  const inFlight: Promise<void>[] = [];
  for (let i = 0; i < total;) {
    const now = performance.now();
    for (; i < total && start + i * interval <= now; i++) inFlight.push(send(start + i * interval, job.steps[i]!));
    await sleep(1);
  }
  await Promise.all(inFlight);
  agent.destroy();
  const sorted = latencies.sort((a, b) => a - b);
  return { sent: total, failures, p50: percentile(sorted, 0.5), p99: percentile(sorted, 0.99) };
}

let input = '';
process.stdin.setEncoding('utf8');
process.stdin.on('data', (c: string) => (input += c));
process.stdin.on('end', () => {
  void paced(JSON.parse(input) as PacedJob).then((r) => process.stdout.write(JSON.stringify(r)));
});

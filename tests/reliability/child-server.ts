// The real server as a child process on a temporary database (ports 4400–4499 are this suite's),
// for the tests that kill it, back it up while it writes, or load it from many sessions.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import { join, resolve } from 'node:path';

export const DEMO_PASSWORD = 'demo-strip-2026';

export interface ChildServer {
  base: string;
  dir: string;
  dbPath: string;
  child: ChildProcess;
  /** Stops the server: SIGKILL (a crash) or SIGTERM (a normal stop); resolves when it has exited. */
  stop(signal?: NodeJS.Signals): Promise<void>;
}

const running = new Set<ChildProcess>();
// Whatever happens to the test run, no server is left behind.
process.once('exit', () => {
  for (const c of running) c.kill('SIGKILL');
});

export interface ChildServerOptions {
  env?: Record<string, string>;
  /** Each line the server prints on its console (standard output). */
  onLine?: (line: string) => void;
}

export async function startChildServer(
  port: number,
  dir = resolve('.tmp/reliability', randomUUID()),
  opts: ChildServerOptions = {},
): Promise<ChildServer> {
  mkdirSync(dir, { recursive: true });
  const dbPath = join(dir, 'sw.db');
  const base = `http://localhost:${port}`;
  const busy = await fetch(`${base}/api/health`).then(
    () => true,
    () => false,
  );
  if (busy) throw new Error(`Port ${port} is in use; the reliability suite needs it.`);
  // node itself, not npx, so that the pid we kill is the server's own.
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      PORT: String(port),
      HOST: '127.0.0.1',
      APP_ORIGIN: base,
      DATABASE_PATH: dbPath,
      PASSWORD_HASH_COST: 'test',
      SMTP_FAKE_PORT: '0',
      SIGNIN_RATE_LIMIT: '100000',
      LOG_REQUESTS: 'off',
      ...opts.env,
    },
    stdio: ['ignore', opts.onLine ? 'pipe' : 'ignore', 'pipe'],
  });
  running.add(child);
  if (opts.onLine) {
    let pending = '';
    child.stdout!.on('data', (c: Buffer) => {
      const lines = (pending + c.toString()).split('\n');
      pending = lines.pop() ?? '';
      for (const line of lines) opts.onLine!(line);
    });
  }
  let stderr = '';
  child.stderr!.on('data', (c: Buffer) => (stderr += c.toString()));
  let exited = false;
  const exit = new Promise<void>((r) =>
    child.once('exit', () => {
      exited = true;
      running.delete(child);
      r();
    }),
  );
  for (let i = 0; i < 240 && !exited; i++) {
    const up = await fetch(`${base}/api/health`).then(
      (r) => r.ok,
      () => false,
    );
    if (up) break;
    await new Promise((r) => setTimeout(r, 250));
  }
  if (exited) throw new Error(`The server on port ${port} did not start:\n${stderr}`);
  return {
    base,
    dir,
    dbPath,
    child,
    stop: (signal = 'SIGTERM') => {
      if (!exited) child.kill(signal);
      return exit;
    },
  };
}

export async function signIn(base: string, email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: base },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in as ${email} failed: ${res.status}`);
  return res.headers.get('set-cookie')!.split(';')[0];
}

/** The steps of the Sports Hall, with a passing value for each. */
export async function hallSteps(base: string, cookie: string) {
  const headers = { Cookie: cookie };
  const venues = (await (await fetch(`${base}/api/venues`, { headers })).json()) as { id: string; name: string }[];
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
  const strips = (await (await fetch(`${base}/api/venues/${hall.id}/strips`, { headers })).json()) as { id: string }[];
  const steps: { id: string; value: string }[] = [];
  for (const s of strips) {
    const strip = (await (await fetch(`${base}/api/strips/${s.id}`, { headers })).json()) as {
      positions: { steps: { id: string; testKind: string }[] }[];
    };
    for (const p of strip.positions)
      for (const st of p.steps) steps.push({ id: st.id, value: st.testKind === 'insulation' ? 'OL' : '0.45' });
  }
  return { hallId: hall.id, steps };
}

export function postReading(base: string, cookie: string, body: { id: string; stepId: string; value: string }, signal?: AbortSignal) {
  return fetch(`${base}/api/readings`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: base, Cookie: cookie },
    body: JSON.stringify(body),
    signal,
  });
}

export function postBatch(base: string, cookie: string, readings: { id: string; stepId: string; value: string }[], signal?: AbortSignal) {
  return fetch(`${base}/api/readings/batch`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: base, Cookie: cookie },
    body: JSON.stringify({ readings }),
    signal,
  });
}

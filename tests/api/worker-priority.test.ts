// The worker threads give way to the event loop (server/workers/task-worker.ts): the nice value and
// the idle scheduling class are set on the calling thread alone, read back from the kernel (proc(5):
// /proc/[pid]/task/[tid]/stat, field 19 is the nice value, field 41 the policy; sched(7) and
// linux/sched.h: SCHED_IDLE is 5, SCHED_OTHER 0), and the process's main thread keeps its own.
import { expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { Worker } from 'node:worker_threads';

// Fields after the command name's closing parenthesis, counted from field 3 (proc(5)).
const statField = (statPath: string, field: number) => Number(readFileSync(statPath, 'utf8').split(') ')[1]!.split(' ')[field - 3]);
const niceOf = (statPath: string) => statField(statPath, 19);
const policyOf = (statPath: string) => statField(statPath, 41);
const SCHED_IDLE = 5;

test.runIf(process.platform === 'linux')(
  'a worker thread that lowers its priority is nice 19 in the idle class; the main thread stays as it was',
  async () => {
    const mainBefore = niceOf(`/proc/${process.pid}/stat`);
    const mainPolicy = policyOf(`/proc/${process.pid}/stat`);
    // A thread of its own, so the test runner's threads keep their priority.
    const code = `
    const { parentPort } = require('node:worker_threads');
    const url = ${JSON.stringify(new URL('../../server/workers/thread-priority.ts', import.meta.url).href)};
    import('tsx/esm/api')
      .then(({ tsImport }) => tsImport(url, url))
      .then((m) => parentPort.postMessage({ tid: m.lowerThreadPriority(19) }))
      .catch((e) => parentPort.postMessage({ error: String(e) }));`;
    const worker = new Worker(code, { eval: true });
    const answer = await new Promise<{ tid?: number; error?: string }>((r) => worker.once('message', r));
    expect(answer.error).toBeUndefined();
    expect(niceOf(`/proc/${process.pid}/task/${answer.tid}/stat`)).toBe(19);
    expect(policyOf(`/proc/${process.pid}/task/${answer.tid}/stat`)).toBe(SCHED_IDLE);
    expect(niceOf(`/proc/${process.pid}/stat`)).toBe(mainBefore);
    expect(policyOf(`/proc/${process.pid}/stat`)).toBe(mainPolicy);
    await worker.terminate();
  },
);

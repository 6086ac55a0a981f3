// One worker thread of the pool (pool.ts): runs a named job and answers its value, or the AppError
// it threw as plain data (an Error's own fields do not cross threads), so the request answers the
// same 4xx it would have answered on the main thread. Any other error is rethrown: a bug, a 500.
import { AppError } from '../lib/app-error';
import { jobs, type JobName } from './jobs';
import { lowerThreadPriority } from './thread-priority';

// Readings first: this thread takes the CPU the event loop leaves.
lowerThreadPriority();

export type WorkerOutcome =
  { ok: true; value: unknown } | { ok: false; appError: { status: number; code: string; message: string; extra: AppError['extra'] } };

export default async function runJob(task: { job: JobName; input: unknown }): Promise<WorkerOutcome> {
  const job = jobs[task.job] as (input: unknown) => unknown;
  if (!job) throw new Error(`no such job: ${task.job}`);
  try {
    return { ok: true, value: await job(task.input) };
  } catch (err) {
    if (err instanceof AppError)
      return { ok: false, appError: { status: err.status, code: err.code, message: err.message, extra: err.extra } };
    throw err;
  }
}

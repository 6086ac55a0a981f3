// The worker pool (piscina): trace analysis, spreadsheet reading and certificate rendering run on
// worker threads, so the event loop that answers readings and the health check is never held for
// seconds by one large file. Jobs in flight are bounded: past `threads` running and `queue`
// waiting, a request is answered 503 with Retry-After at once rather than piling up memory.
import { Piscina } from 'piscina';
import { availableParallelism } from 'node:os';
import type { MessagePort } from 'node:worker_threads';
import { AppError } from '../lib/app-error';
import type { JobName, Jobs } from './jobs';
import type { WorkerOutcome } from './task-worker';

export interface WorkerPoolOptions {
  /** Worker threads at most (they start when first needed and stop after idling). */
  threads: number;
  /** Jobs that may wait for a thread; one more is refused. */
  queue: number;
  idleTimeoutMs?: number;
}

/** One core stays for the event loop; at most four workers. */
export const defaultWorkerPoolOptions = (): WorkerPoolOptions => ({
  threads: Math.max(1, Math.min(4, availableParallelism() - 1)),
  queue: 8,
});

const BUSY_RETRY_SECONDS = 5;

export function createWorkerPool(opts: WorkerPoolOptions) {
  const piscina = new Piscina({
    filename: new URL('./worker-entry.mjs', import.meta.url).href,
    minThreads: 0,
    maxThreads: opts.threads,
    // The bound is kept below (inFlight); piscina's own queue also holds jobs waiting for a thread
    // that is still starting, so it gets room for all of them.
    maxQueue: opts.threads + opts.queue,
    idleTimeout: opts.idleTimeoutMs ?? 5 * 60_000,
    // Not the parent's flags: the entry file registers what the thread needs (see worker-entry.mjs).
    execArgv: [],
  });
  let inFlight = 0;
  const limit = opts.threads + opts.queue;

  return {
    /** Runs a job of jobs.ts on a worker; rethrows the AppError it threw; 503 when the pool is full. */
    async run<N extends JobName>(
      job: N,
      input: Parameters<Jobs[N]>[0],
      transfer: (ArrayBuffer | MessagePort)[] = [],
    ): Promise<Awaited<ReturnType<Jobs[N]>>> {
      if (inFlight >= limit) {
        throw new AppError(
          503,
          'busy',
          `The server is busy with other large jobs (traces, spreadsheets, certificates). Try again in ${BUSY_RETRY_SECONDS} seconds.`,
          { retryAfterSeconds: BUSY_RETRY_SECONDS },
        );
      }
      inFlight++;
      try {
        // Transferred buffers are moved to the worker (no copy); they are unusable here afterwards.
        const out = (await piscina.run({ job, input }, transfer.length ? { transferList: transfer } : undefined)) as WorkerOutcome;
        if (!out.ok) throw new AppError(out.appError.status, out.appError.code, out.appError.message, out.appError.extra);
        return out.value as Awaited<ReturnType<Jobs[N]>>;
      } finally {
        inFlight--;
      }
    },
    /** Jobs running or waiting (tests and the benchmark look at it). */
    get inFlight() {
      return inFlight;
    },
    close: () => piscina.destroy(),
  };
}
export type WorkerPool = ReturnType<typeof createWorkerPool>;

// A worker thread's scheduling priority, lowered so it takes the CPU the event loop leaves.
import { execFileSync } from 'node:child_process';
import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';

/**
 * How nice a worker thread is to the rest (Linux nice values, 19 the nicest): on a two-core machine
 * a busy worker and the event loop share the cores, and readings must not wait behind a PDF.
 */
export const WORKER_NICE = 19;

/**
 * Lowers the calling thread's priority, not the process's: on Linux a nice value belongs to a
 * thread, named by its id (/proc/thread-self points at it). The thread also goes to the idle
 * scheduling class (sched(7), SCHED_IDLE, set with util-linux's chrt): the kernel then treats a
 * core running only such threads as free, so a request waking the event loop runs at once there
 * instead of waiting for a slice; nice 19 alone only shrinks the worker's share. Answers the thread
 * id, or null where threads cannot be told apart (elsewhere they stay equals).
 */
export function lowerThreadPriority(nice = WORKER_NICE): number | null {
  let tid: number;
  try {
    tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    if (!Number.isInteger(tid) || tid <= 0) return null;
    setPriority(tid, nice);
  } catch {
    return null;
  }
  try {
    execFileSync('chrt', ['--idle', '--pid', '0', String(tid)], { stdio: 'ignore', timeout: 5_000 });
  } catch {
    // Without chrt the thread stays at nice 19, which still gives way, less promptly.
  }
  return tid;
}

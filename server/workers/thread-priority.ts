// A worker thread's scheduling priority, lowered so it takes the CPU the event loop leaves.
import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';

/**
 * How nice a worker thread is to the rest (Linux nice values, 19 the nicest): on a two-core machine
 * a busy worker and the event loop share the cores, and readings must not wait behind a PDF.
 */
export const WORKER_NICE = 19;

/**
 * Lowers the calling thread's priority, not the process's: on Linux a nice value belongs to a
 * thread, named by its id (/proc/thread-self points at it). Answers the thread id, or null where
 * threads cannot be told apart (elsewhere they stay equals).
 */
export function lowerThreadPriority(nice = WORKER_NICE): number | null {
  try {
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    if (!Number.isInteger(tid) || tid <= 0) return null;
    setPriority(tid, nice);
    return tid;
  } catch {
    return null;
  }
}

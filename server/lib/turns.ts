// Long synchronous work on the event loop, cut into pieces of a few milliseconds with a turn of
// the loop between them: a reading arriving meanwhile waits for one piece, not for the whole of a
// 120-strip sign-off. Pieces are measured in time, not counted: on a loaded two-core machine the
// same 20 strips took 5 ms one moment and 80 the next.
import { setImmediate } from 'node:timers/promises';

/** Milliseconds of work between two turns. */
export const TURN_BUDGET_MS = 4;

export type Turn = () => Promise<void>;

/**
 * A function to await between small steps: it gives the event loop a turn once `budgetMs` have
 * passed since the last one, and costs a clock read otherwise.
 */
export function turns(budgetMs = TURN_BUDGET_MS): Turn {
  let since = performance.now();
  return async () => {
    if (performance.now() - since < budgetMs) return;
    await setImmediate();
    since = performance.now();
  };
}

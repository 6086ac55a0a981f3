// When a reading was taken. The tablet stamps a reading when it is typed; one typed offline may
// reach the server much later, and must still count at the time it was measured: otherwise it
// would pass as newer than a reading taken after it, or as a retest after a repair it preceded.
// A tablet's clock can be wrong, so its time is trusted only within a window around the server's.

/** A tablet a little ahead of the server (clocks drift; common practice is to allow minutes). */
export const MAX_AHEAD_MS = 2 * 60_000;
/** The oldest a queued reading can plausibly be: the tablet keeps its data for 7 days. */
export const MAX_AGE_MS = 7 * 24 * 3_600_000;

export type TakenAtDecision =
  | { takenAt: string; source: 'server' }
  | { takenAt: string; source: 'tablet' }
  | { takenAt: string; source: 'server'; refused: { claimed: string; why: 'ahead' | 'too-old' | 'unreadable' } };

/**
 * The time a reading counts at, in the server's own format (UTC, milliseconds, `Z`), so that times
 * sort as text. `claimed` is the tablet's ISO 8601 time (any offset), `receivedAt` the server's.
 */
export function decideTakenAt(claimed: string | undefined | null, receivedAt: string): TakenAtDecision {
  if (claimed == null) return { takenAt: receivedAt, source: 'server' };
  const claimedMs = Date.parse(claimed);
  const receivedMs = Date.parse(receivedAt);
  if (Number.isNaN(claimedMs)) return { takenAt: receivedAt, source: 'server', refused: { claimed, why: 'unreadable' } };
  if (claimedMs > receivedMs + MAX_AHEAD_MS) return { takenAt: receivedAt, source: 'server', refused: { claimed, why: 'ahead' } };
  if (claimedMs < receivedMs - MAX_AGE_MS) return { takenAt: receivedAt, source: 'server', refused: { claimed, why: 'too-old' } };
  // A tablet slightly ahead is taken as "now": a reading cannot count after it arrived.
  return { takenAt: new Date(Math.min(claimedMs, receivedMs)).toISOString(), source: 'tablet' };
}

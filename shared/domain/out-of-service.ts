// How long a strip was out of service, one rule for the server's answers and the tablet's live count.

/**
 * Whole minutes from `fromIso` to `to` (an ISO time or epoch milliseconds), rounded up: a strip dark
 * for 20 s was out for a minute. Never negative (a tablet clock behind the server's).
 */
export function minutesOutOfService(fromIso: string, to: string | number): number {
  const end = typeof to === 'number' ? to : Date.parse(to);
  return Math.max(0, Math.ceil((end - Date.parse(fromIso)) / 60_000));
}

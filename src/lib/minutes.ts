/**
 * Whole minutes from `fromIso` to `now` (or to `toIso` when it ended), rounded up as the server
 * counts minutes out of service (a strip dark for 20 s was out for a minute), never negative.
 */
export function minutesBetween(fromIso: string, now: number, toIso?: string | null): number {
  const end = toIso ? Date.parse(toIso) : now;
  return Math.max(0, Math.ceil((end - Date.parse(fromIso)) / 60_000));
}

/** "4 min", "1 h 05 min": how long a strip has been out of service. */
export function minutesText(minutes: number): string {
  if (minutes < 60) return `${minutes} min`;
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`;
}

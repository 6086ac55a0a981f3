/** "4 min", "1 h 05 min": how long a strip has been out of service. */
export function minutesText(minutes: number): string {
  if (minutes < 60) return `${minutes} min`;
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`;
}

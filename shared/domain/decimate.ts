// Decimation of a long trace for plotting: a scope exports millions of samples, a plot needs a
// few thousand, and the edges a technician looks for must survive the thinning.

/** A plot needs a few thousand points, not the 2 million a scope exports. */
export const PLOT_MAX_POINTS = 4000;

/**
 * Min/max decimation: each bucket keeps its lowest and highest sample (in time order), so spikes
 * and edges survive. The samples either side of each `keepTimesS` are kept as well, so a marker
 * drawn at its interpolated time sits on the plotted edge. At most `maxPoints` points.
 */
export function decimateMinMax(
  timeS: ArrayLike<number>,
  volts: ArrayLike<number>,
  maxPoints: number,
  keepTimesS: readonly number[] = [],
): { timeS: number[]; volts: number[] } {
  const n = timeS.length;
  if (n <= maxPoints) return { timeS: Array.from(timeS), volts: Array.from(volts) };
  const kept = new Set<number>();
  for (const t of keepTimesS) {
    const i = indexAtOrBefore(timeS, t);
    for (let j = i - 1; j <= i + 2; j++) if (j >= 0 && j < n) kept.add(j);
  }
  const buckets = Math.floor((maxPoints - kept.size - 2) / 2);
  kept.add(0);
  kept.add(n - 1);
  for (let b = 0; b < buckets; b++) {
    const start = Math.floor((b * n) / buckets);
    const end = Math.floor(((b + 1) * n) / buckets);
    let lo = start;
    let hi = start;
    for (let i = start + 1; i < end; i++) {
      if (volts[i]! < volts[lo]!) lo = i;
      if (volts[i]! > volts[hi]!) hi = i;
    }
    kept.add(lo);
    kept.add(hi);
  }
  const indices = [...kept].sort((a, b) => a - b);
  return { timeS: indices.map((i) => timeS[i]!), volts: indices.map((i) => volts[i]!) };
}

/** The last index whose time is at or before `t` (0 when `t` is before the first sample); times ascending. */
export function indexAtOrBefore(timeS: ArrayLike<number>, t: number): number {
  let lo = 0;
  let hi = timeS.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (timeS[mid]! <= t) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

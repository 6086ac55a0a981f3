import { FaultLocationError, runFaultLocation, type FaultLocationAnswer } from '../../shared/domain/fault-location';
import { analyseWaveform, parseTraceCsv, WaveformError, type WaveformAnalysis } from '../../shared/domain/waveform';
import type { FaultLocationRequest } from '../../shared/schemas/fault-location';
import type { WaveformAnswer, WaveformQuery } from '../../shared/schemas/waveforms';
import { unprocessable } from '../lib/app-error';

/** A plot needs a few thousand points, not the 2 million a scope exports. */
export const PLOT_MAX_POINTS = 4000;

/**
 * Pure computation, no database: any signed-in user may ask where a fault is. The engine in
 * shared/domain is the authority; this service turns its refusals into 422 with the field named.
 */
export function faultLocationService() {
  function locate(request: FaultLocationRequest): FaultLocationAnswer {
    let answer: FaultLocationAnswer;
    try {
      answer = runFaultLocation(request);
    } catch (err) {
      throw asUnprocessable(err);
    }
    // The schema has no upper bounds, so absurd magnitudes (1e308 m) could overflow to Infinity,
    // which JSON would turn into null. Refuse them rather than answer nonsense.
    for (const key of ['distanceM', 'fromOtherEndM', 'uncertaintyM', 'faultOhm', 'velocityFactor'] as const) {
      const value = answer[key];
      if (value !== undefined && !Number.isFinite(value)) {
        throw unprocessable('fault-location-refused', 'These numbers are too large to give a distance; check the units of each reading.', {
          errors: [{ path: '(body)', message: `The computed ${key} is not a finite number.` }],
        });
      }
    }
    return answer;
  }

  function analyse(csv: string, query: WaveformQuery): WaveformAnswer {
    let analysis: WaveformAnalysis;
    let parsed: ReturnType<typeof parseTraceCsv>;
    try {
      parsed = parseTraceCsv(csv);
      analysis = analyseWaveform(parsed, { velocityFactor: query.velocityFactor, lengthM: query.lengthM });
    } catch (err) {
      throw asUnprocessable(err);
    }
    const { estimate, ...rest } = analysis;
    const keep = [analysis.markers.incident.timeS];
    if (analysis.markers.reflection) keep.push(analysis.markers.reflection.timeS);
    return {
      ...rest,
      estimate: estimate ? withoutInputs(estimate) : null,
      sampleCount: parsed.timeS.length,
      skippedLines: parsed.skippedLines,
      plot: decimateMinMax(parsed.timeS, parsed.volts, PLOT_MAX_POINTS, keep),
    };
  }

  return { locate, analyse };
}

function withoutInputs(estimate: NonNullable<WaveformAnalysis['estimate']>): FaultLocationAnswer {
  const { inputs: _inputs, ...answer } = estimate;
  return answer;
}

function asUnprocessable(err: unknown): unknown {
  if (err instanceof FaultLocationError) {
    return unprocessable(err.code, err.message, { errors: [{ path: err.field, message: err.message }] });
  }
  if (err instanceof WaveformError) {
    return unprocessable(err.code, err.message, { errors: [{ path: '(body)', message: err.message }] });
  }
  return err;
}

/**
 * Min/max decimation: each bucket keeps its lowest and highest sample (in time order), so spikes
 * and edges survive. The samples either side of each `keepTimesS` are kept as well, so a marker
 * drawn at its interpolated time sits on the plotted edge. At most `maxPoints` points.
 */
export function decimateMinMax(
  timeS: Float64Array,
  volts: Float64Array,
  maxPoints: number,
  keepTimesS: number[] = [],
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

function indexAtOrBefore(timeS: Float64Array, t: number): number {
  let lo = 0;
  let hi = timeS.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (timeS[mid]! <= t) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

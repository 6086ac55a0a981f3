import { FaultLocationError, runFaultLocation, type FaultLocationAnswer } from '../../shared/domain/fault-location';
import { decimateMinMax, PLOT_MAX_POINTS } from '../../shared/domain/decimate';
import { analyseWaveform, parseTraceCsv, WaveformError, type WaveformAnalysis } from '../../shared/domain/waveform';
import type { FaultLocationRequest } from '../../shared/schemas/fault-location';
import type { WaveformAnswer, WaveformQuery } from '../../shared/schemas/waveforms';
import type { AuthUser } from '../auth/types';
import { unprocessable } from '../lib/app-error';
import type { Env } from '../config/env';

/**
 * Pure computation, no database: any signed-in user may ask where a fault is. The engine in
 * shared/domain is the authority; this service turns its refusals into 422 with the field named.
 */
export function faultLocationService(env: Pick<Env, 'FAULT_MAX_CABLE_LENGTH_M'>) {
  /** The explanation is worded in the asker's units (metres or feet); the numbers are always metres. */
  function locate(user: AuthUser, request: FaultLocationRequest): FaultLocationAnswer {
    let answer: FaultLocationAnswer;
    try {
      answer = runFaultLocation(request, user.unitSystem, { maxCableLengthM: env.FAULT_MAX_CABLE_LENGTH_M });
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

  function analyse(user: AuthUser, csv: string, query: WaveformQuery): WaveformAnswer {
    let analysis: WaveformAnalysis;
    let parsed: ReturnType<typeof parseTraceCsv>;
    try {
      parsed = parseTraceCsv(csv);
      analysis = analyseWaveform(parsed, { velocityFactor: query.velocityFactor, lengthM: query.lengthM, units: user.unitSystem });
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

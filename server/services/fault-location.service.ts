import { FaultLocationError, runFaultLocation, type FaultLocationAnswer } from '../../shared/domain/fault-location';
import type { FaultLocationRequest } from '../../shared/schemas/fault-location';
import type { WaveformQuery } from '../../shared/schemas/waveforms';
import type { WaveformAnswer } from '../../shared/contracts/fault-location';
import type { AuthUser } from '../auth/types';
import { unprocessable } from '../lib/app-error';
import type { WorkerPool } from '../workers/pool';
import { receivedBody } from '../workers/parcel';
import type { ReceivedBytes } from '../../shared/contracts/contract';
import type { Env } from '../config/env';

/**
 * Pure computation, no database: any signed-in user may ask where a fault is. The engine in
 * shared/domain is the authority; this service turns its refusals into 422 with the field named.
 */
export function faultLocationService(workers: WorkerPool, env: Pick<Env, 'FAULT_MAX_CABLE_LENGTH_M'>) {
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

  /** The trace is parsed and analysed on a worker thread (server/workers/jobs.ts): it may be 2 million samples. */
  function analyse(user: AuthUser, body: ReceivedBytes, charset: string | undefined, query: WaveformQuery): Promise<WaveformAnswer> {
    const parcel = receivedBody(body).take();
    return workers.run('waveformAnswer', { parcel, charset, query, units: user.unitSystem }, [parcel.port]);
  }

  return { locate, analyse };
}

function asUnprocessable(err: unknown): unknown {
  if (err instanceof FaultLocationError) {
    return unprocessable(err.code, err.message, { errors: [{ path: err.field, message: err.message }] });
  }
  return err;
}

import { ApiError, call } from '@/lib/api-client';
import { readingsContracts } from '@shared/contracts/readings';
import type { ReadingDto } from '@shared/schemas/readings';
import type { Answer, ReadingBody } from '../utils/queue';

/** The stored reading; stripSuspended when it put its strip of a signed-off venue out of service. */
export type SentReading = ReadingDto;

/**
 * POST /api/readings for a queued reading. Never throws: the answer (or its absence) is handed to
 * the queue's classifier. The server answers 201 the first time and 200 with the stored reading
 * for a replay of the same id and body.
 */
export async function sendReading(body: ReadingBody): Promise<{ answer: Answer; reading?: SentReading }> {
  try {
    const reading = await call(readingsContracts.record, { body });
    return { answer: { kind: 'http', status: 200, stripSuspended: reading.stripSuspended === true }, reading };
  } catch (err) {
    if (err instanceof ApiError) return { answer: { kind: 'http', status: err.status, code: err.code, message: err.message } };
    return { answer: { kind: 'network' } };
  }
}

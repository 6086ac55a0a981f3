import { api, ApiError } from '@/lib/api-client';
import type { ReadingDto } from '@shared/schemas/readings';
import type { Answer, ReadingBody } from '../utils/queue';

export type SentReading = ReadingDto & { venueReopened?: boolean };

/**
 * POST /api/readings for a queued reading. Never throws: the answer (or its absence) is handed to
 * the queue's classifier. The server answers 201 the first time and 200 with the stored reading
 * for a replay of the same id and body.
 */
export async function sendReading(body: ReadingBody): Promise<{ answer: Answer; reading?: SentReading }> {
  try {
    const reading = await api.post<SentReading>('/readings', body as unknown as Record<string, unknown>);
    return { answer: { kind: 'http', status: 200, venueReopened: reading.venueReopened === true }, reading };
  } catch (err) {
    if (err instanceof ApiError) return { answer: { kind: 'http', status: err.status, code: err.code, message: err.message } };
    return { answer: { kind: 'network' } };
  }
}

import { api, ApiError } from '@/lib/api-client';
import type { ReadingBatchResult } from '@shared/schemas/readings';
import { answersFromBatch, type BatchAnswer, type ReadingBody } from '../utils/queue';

/**
 * POST /api/readings/batch for several queued readings at once (after time offline). Never throws:
 * it gives one answer per reading, as if each had been sent alone (utils/queue.ts answersFromBatch),
 * so the queue's rules for each result are the same as for a single send.
 */
export async function sendReadingBatch(bodies: ReadingBody[]): Promise<BatchAnswer[]> {
  try {
    const { results } = await api.post<{ results: ReadingBatchResult[] }>('/readings/batch', { readings: bodies as unknown as Record<string, unknown>[] });
    return answersFromBatch(bodies, { kind: 'results', results });
  } catch (err) {
    if (err instanceof ApiError) return answersFromBatch(bodies, { kind: 'http', status: err.status, code: err.code, message: err.message });
    return answersFromBatch(bodies, { kind: 'network' });
  }
}

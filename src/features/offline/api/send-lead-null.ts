import { ApiError, call } from '@/lib/api-client';
import { readingsContracts } from '@shared/contracts/readings';
import type { Answer, LeadNullRecord } from '../utils/queue';

/**
 * POST /api/lead-nulls for a null set on this tablet. Never throws, like sendReading: the answer
 * (or its absence) goes to the queue's classifier. The same id and body again answers 200.
 */
export async function sendLeadNull(n: LeadNullRecord): Promise<Answer> {
  try {
    await call(readingsContracts.leadNull, { body: { id: n.id, value: n.value, meter: n.meter, takenAt: n.takenAt } });
    return { kind: 'http', status: 200 };
  } catch (err) {
    if (err instanceof ApiError) return { kind: 'http', status: err.status, code: err.code, message: err.message };
    return { kind: 'network' };
  }
}

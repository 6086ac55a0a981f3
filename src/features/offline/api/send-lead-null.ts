import { api, ApiError } from '@/lib/api-client';
import type { LeadNullDto } from '@shared/schemas/lead-nulls';
import type { Answer, LeadNullRecord } from '../utils/queue';

/**
 * POST /api/lead-nulls for a null set on this tablet. Never throws, like sendReading: the answer
 * (or its absence) goes to the queue's classifier. The same id and body again answers 200.
 */
export async function sendLeadNull(n: LeadNullRecord): Promise<Answer> {
  try {
    await api.post<LeadNullDto>('/lead-nulls', { id: n.id, value: n.value, meter: n.meter, takenAt: n.takenAt });
    return { kind: 'http', status: 200 };
  } catch (err) {
    if (err instanceof ApiError) return { kind: 'http', status: err.status, code: err.code, message: err.message };
    return { kind: 'network' };
  }
}

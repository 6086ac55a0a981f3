import { ApiError, call } from '@/lib/api-client';
import { incidentsContracts, type Incident } from '@shared/contracts/incidents';
import type { Answer, IncidentBody } from '../utils/queue';

export type SentIncident = Incident;

/**
 * POST /api/venues/:id/incidents for an incident opened on this tablet. Never throws, like
 * sendReading: the answer (or its absence) goes to the queue's classifier. The same clientId and
 * body again answers the incident already stored.
 */
export async function sendIncident(venueId: string, body: IncidentBody): Promise<{ answer: Answer; incident?: SentIncident }> {
  try {
    const incident = await call(incidentsContracts.open, { params: { id: venueId }, body });
    return { answer: { kind: 'http', status: 201 }, incident };
  } catch (err) {
    if (err instanceof ApiError) return { answer: { kind: 'http', status: err.status, code: err.code, message: err.message } };
    return { answer: { kind: 'network' } };
  }
}

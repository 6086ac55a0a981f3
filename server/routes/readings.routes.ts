import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { problemBody, problemFor, SERVER_ERROR } from '../middleware/error-handler';
import { readingsContracts as c } from '../../shared/contracts/readings';
import { createReadingSchema, type CreateReadingInput, type ReadingBatchResult } from '../../shared/schemas/readings';
import { readingsService } from '../services/readings.service';
import { leadNullsService } from '../services/lead-nulls.service';

/** 200 readings with long correction reasons fit; the API's usual 100 kB would refuse them whole (app.ts). */
export const READINGS_BATCH_BODY_LIMIT = '1mb';

export function readingsRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const readings = readingsService(deps);
  const leadNulls = leadNullsService(deps);
  api.hotRoute(c.record, async (user, body) => {
    const { replayed, reading } = await readings.create(user, body);
    return { status: replayed ? 200 : 201, location: `/api/readings/${reading.id}`, body: reading };
  });
  // Each reading gets the status and body it would have had on its own; the answer is 200 once
  // the commit holding them has returned (a failed commit is the whole request's error).
  api.route(c.batch, async ({ user, body }) => {
    const sent = body.readings;
    const parsed = sent.map((r) => createReadingSchema.safeParse(r));
    const valid = parsed.flatMap((p) => (p.success ? [p.data as CreateReadingInput] : []));
    const outcomes = await readings.createBatch(user, valid);
    let next = 0;
    const results: ReadingBatchResult[] = parsed.map((p, i) => {
      const raw = sent[i] as { id?: unknown } | null;
      const id = p.success ? p.data.id : typeof raw?.id === 'string' ? raw.id : null;
      const outcome = p.success ? outcomes[next++] : ({ status: 'rejected', reason: p.error } as const);
      if (outcome.status === 'fulfilled') return { id, status: outcome.value.replayed ? 200 : 201, reading: outcome.value.reading };
      let problem = problemFor(outcome.reason);
      if (!problem) {
        deps.log.error('unhandled error in a batch of readings', outcome.reason);
        problem = SERVER_ERROR;
      }
      return { id, status: problem.status, problem: problemBody(problem) };
    });
    return { results };
  });
  api.route(c.get, ({ user, params }) => readings.get(user, params.id));
  // The caller's own test-lead null: there is no venue to check, only who measured it.
  api.route(c.leadNull, ({ user, body, req, res }) => {
    const { replayed, leadNull } = leadNulls.create(user, req.sessionId, body);
    res.status(replayed ? 200 : 201);
    return leadNull;
  });
  return api;
}

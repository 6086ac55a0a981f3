import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { problemBody, problemFor, SERVER_ERROR } from '../middleware/error-handler';
import { idParams } from '../../shared/schemas/params';
import { createReadingSchema, readingsBatchSchema, type CreateReadingInput, type ProblemBody, type ReadingBatchResult } from '../../shared/schemas/readings';
import { createLeadNullSchema } from '../../shared/schemas/lead-nulls';
import { readingsService } from '../services/readings.service';
import { leadNullsService } from '../services/lead-nulls.service';

export const TESTERS = ['director', 'technician'] as const;

/** 200 readings with long correction reasons fit; the API's usual 100 kB would refuse them whole (app.ts). */
export const READINGS_BATCH_BODY_LIMIT = '1mb';

export function readingsRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const readings = readingsService(deps);
  const leadNulls = leadNullsService(deps);
  api.post('/readings', TESTERS, validate(createReadingSchema), async (req, res) => {
    const { replayed, reading } = await readings.create(req.user!, req.body);
    res.status(replayed ? 200 : 201).location(`/api/readings/${reading.id}`).json(reading);
  });
  // Each reading gets the status and body it would have had on its own; the answer is 200 once
  // the commit holding them has returned (a failed commit is the whole request's error).
  api.post('/readings/batch', TESTERS, validate(readingsBatchSchema), async (req, res) => {
    const sent = (req.body as { readings: unknown[] }).readings;
    const parsed = sent.map((r) => createReadingSchema.safeParse(r));
    const valid = parsed.flatMap((p) => (p.success ? [p.data as CreateReadingInput] : []));
    const outcomes = await readings.createBatch(req.user!, valid);
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
      return { id, status: problem.status, problem: problemBody(problem) as ProblemBody };
    });
    res.json({ results });
  });
  api.get('/readings/:id', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(readings.get(req.user!, String(req.params.id)));
  });
  // The caller's own test-lead null: there is no venue to check, only who measured it.
  api.post('/lead-nulls', TESTERS, validate(createLeadNullSchema), (req, res) => {
    const { replayed, leadNull } = leadNulls.create(req.user!, req.sessionId, req.body);
    res.status(replayed ? 200 : 201).json(leadNull);
  });
  return api;
}

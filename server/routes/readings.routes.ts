import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { createReadingSchema } from '../../shared/schemas/readings';
import { createLeadNullSchema } from '../../shared/schemas/lead-nulls';
import { readingsService } from '../services/readings.service';
import { leadNullsService } from '../services/lead-nulls.service';

export const TESTERS = ['director', 'technician'] as const;

export function readingsRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const readings = readingsService(deps);
  const leadNulls = leadNullsService(deps);
  api.post('/readings', TESTERS, validate(createReadingSchema), async (req, res) => {
    const { replayed, reading } = await readings.create(req.user!, req.body);
    res.status(replayed ? 200 : 201).location(`/api/readings/${reading.id}`).json(reading);
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

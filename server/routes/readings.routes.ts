import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { createReadingSchema } from '../../shared/schemas/readings';
import { readingsService } from '../services/readings.service';

export const TESTERS = ['director', 'technician'] as const;

export function readingsRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const readings = readingsService(deps);
  api.post('/readings', TESTERS, validate(createReadingSchema), async (req, res) => {
    const { replayed, reading } = await readings.create(req.user!, req.body);
    res.status(replayed ? 200 : 201).location(`/api/readings/${reading.id}`).json(reading);
  });
  api.get('/readings/:id', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(readings.get(req.user!, String(req.params.id)));
  });
  return api;
}

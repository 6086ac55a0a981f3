import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { venuesService } from '../services/venues.service';

export function venuesRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const venues = venuesService(deps);

  api.get('/venues', STAFF, (req, res) => {
    res.json(venues.list(req.user!));
  });
  api.get('/venues/:id/strips', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(venues.strips(req.user!, String(req.params.id)));
  });
  return api;
}

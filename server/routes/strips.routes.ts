import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { stripsService } from '../services/strips.service';

export function stripsRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const strips = stripsService(deps);
  api.get('/strips/:id', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(strips.get(req.user!, String(req.params.id)));
  });
  return api;
}

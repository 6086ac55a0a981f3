import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { readingsContracts as c } from '../../shared/contracts/readings';
import { readingsService } from '../services/readings.service';

export function readingsRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const readings = readingsService(deps);
  api.route(c.record, async ({ user, body, res }) => {
    const { replayed, reading } = await readings.create(user, body);
    res.status(replayed ? 200 : 201).location(`/api/readings/${reading.id}`);
    return reading;
  });
  api.route(c.get, ({ user, params }) => readings.get(user, params.id));
  return api;
}

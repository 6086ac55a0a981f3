import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { faultLocationContracts as c } from '../../shared/contracts/fault-location';
import { faultLocationService } from '../services/fault-location.service';

export function faultLocationRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const service = faultLocationService();
  api.route(c.locate, ({ user, body }) => service.locate(user, body));
  api.route(c.analyse, ({ user, body, query }) => service.analyse(user, body, query));
  return api;
}

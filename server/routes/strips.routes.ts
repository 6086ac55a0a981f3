import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { stripsContracts as c } from '../../shared/contracts/strips';
import { stripsService } from '../services/strips.service';

export function stripsRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const strips = stripsService(deps);
  api.route(c.get, ({ user, params }) => strips.get(user, params.id));
  return api;
}

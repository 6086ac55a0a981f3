import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { venuesContracts as c } from '../../shared/contracts/venues';
import { venuesService } from '../services/venues.service';

export function venuesRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const venues = venuesService(deps);
  api.route(c.list, ({ user }) => venues.list(user));
  api.route(c.strips, ({ user, params }) => venues.strips(user, params.id));
  return api;
}

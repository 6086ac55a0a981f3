import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { signOffContracts as c } from '../../shared/contracts/sign-off';
import { signOffService } from '../services/sign-off.service';

export function signOffRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const signOff = signOffService(deps);
  api.route(c.readiness, ({ user, params }) => signOff.readiness(user, params.id));
  api.route(c.signOff, ({ user, params, body }) => signOff.signOff(user, params.id, body));
  return api;
}

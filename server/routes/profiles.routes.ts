import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { ifMatchOf, setVersionTag } from '../http/etag';
import { profilesContracts as c } from '../../shared/contracts/profiles';
import { profilesService } from '../services/profiles.service';

export function profilesRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const profiles = profilesService(deps);
  api.route(c.list, ({ user }) => profiles.list(user));
  api.route(c.get, ({ user, params, res }) => {
    const p = profiles.get(user, params.id);
    setVersionTag(res, p.version);
    return p;
  });
  api.route(c.copy, ({ user, params, body, res }) => {
    const p = profiles.copy(user, params.id, body.name);
    setVersionTag(res, p.version);
    return p;
  });
  api.route(c.update, ({ user, params, body, req, res }) => {
    const p = profiles.update(user, params.id, ifMatchOf(req), body);
    setVersionTag(res, p.version);
    return p;
  });
  return api;
}

import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { faultLocationContracts as c } from '../../shared/contracts/fault-location';
import { faultLocationService } from '../services/fault-location.service';

export function faultLocationRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const service = faultLocationService(deps.workers, deps.env);
  api.route(c.locate, ({ user, body }) => service.locate(user, body));
  api.route(c.analyse, async ({ user, body, query, req }) => {
    const charset = /;\s*charset="?([^";\s]+)"?/i.exec(req.get('content-type') ?? '')?.[1];
    return service.analyse(user, body, charset, query);
  });
  return api;
}

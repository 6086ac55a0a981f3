import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { auditContracts as c } from '../../shared/contracts/audit';
import { auditService } from '../services/audit.service';

export function auditRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const audit = auditService(deps);
  api.route(c.list, ({ user, query }) => audit.list(user, query));
  api.route(c.ofVenue, ({ user, params }) => audit.ofVenue(user, params.id));
  return api;
}

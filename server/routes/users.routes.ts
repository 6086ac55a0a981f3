import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import type { AuthService } from '../services/auth.service';
import { mailService } from '../services/mail.service';
import { usersContracts as c } from '../../shared/contracts/users';
import { mailContracts as m } from '../../shared/contracts/mail';

export function usersRoutes(deps: AppDeps, auth: AuthService) {
  const api = apiRouter(deps);
  const mail = mailService(deps);
  api.route(c.list, ({ user }) => auth.listUsers(user.orgId));
  api.route(c.invite, ({ user, body }) => auth.invite(user, body));
  api.route(c.update, ({ user, params, body }) => auth.updateUser(user, params.id, body));
  api.route(c.endSessions, ({ user, params }) => auth.endSessions(user, params.id));
  // The outbox of the admin's own organisation only.
  api.route(m.list, ({ user }) => mail.list(user.orgId));
  api.route(m.get, ({ user, params }) => mail.get(user.orgId, Number(params.id)));
  return api;
}

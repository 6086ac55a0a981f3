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
  api.route(m.list, () => mail.list());
  api.route(m.get, ({ params }) => mail.get(Number(params.id)));
  return api;
}

import type { AppDeps } from '../deps';
import { ApiRouter } from '../http/api-router';
import { validate } from '../middleware/validate';
import type { AuthService } from '../services/auth.service';
import { inviteUserSchema, updateUserSchema } from '../../shared/schemas/auth';
import { idParams } from '../../shared/schemas/params';
import { mailService } from '../services/mail.service';

export function usersRoutes(deps: AppDeps, auth: AuthService) {
  const api = new ApiRouter();
  const mail = mailService(deps);

  api.get('/users', ['admin'], (req, res) => {
    res.json(auth.listUsers(req.user!.orgId));
  });
  api.post('/users', ['admin'], validate(inviteUserSchema), async (req, res) => {
    res.status(201).json(await auth.invite(req.user!, req.body));
  });
  api.patch('/users/:id', ['admin'], validate(idParams, 'params'), validate(updateUserSchema), (req, res) => {
    res.json(auth.updateUser(req.user!, String(req.params.id), req.body));
  });
  api.post('/users/:id/end-sessions', ['admin'], validate(idParams, 'params'), (req, res) => {
    auth.endSessions(req.user!, String(req.params.id));
    res.status(204).end();
  });

  api.get('/mail', ['admin'], (req, res) => {
    res.json(mail.list(req.user!.orgId));
  });
  api.get('/mail/:id', ['admin'], (req, res) => {
    res.json(mail.get(req.user!.orgId, Number(req.params.id)));
  });

  return api;
}

import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { signOffSchema } from '../../shared/schemas/sign-off';
import { signOffService } from '../services/sign-off.service';

export function signOffRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const signOff = signOffService(deps);

  api.get('/venues/:id/readiness', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(signOff.readiness(req.user!, String(req.params.id)));
  });
  // Directors only; the service then checks it is this event's director (object level).
  api.post('/venues/:id/sign-off', ['director'], validate(idParams, 'params'), validate(signOffSchema), async (req, res) => {
    res.status(201).json(await signOff.signOff(req.user!, String(req.params.id), req.body));
  });
  return api;
}

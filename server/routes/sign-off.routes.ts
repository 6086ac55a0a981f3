import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { signOffSchema } from '../../shared/schemas/sign-off';
import { signOffService } from '../services/sign-off.service';
import { failedPasswordLimiter } from '../auth/failed-password-limiter';
import { ACCOUNT_THROTTLE, accountThrottle, throttleAccount } from '../auth/throttle';

export function signOffRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const signOff = signOffService(deps);

  api.get('/venues/:id/readiness', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(signOff.readiness(req.user!, String(req.params.id)));
  });
  // The password re-entered at sign-off is limited like sign-in: wrong ones per address, and per
  // account slowed (a stolen session must not become a way to guess the director's password).
  const perAddress = failedPasswordLimiter(deps.env.SIGNIN_RATE_LIMIT, 'password checks');
  const perAccount = throttleAccount(accountThrottle(ACCOUNT_THROTTLE), (req) => `sign-off:${req.user!.id}`);
  // Directors only; the service then checks it is this event's director (object level).
  api.post('/venues/:id/sign-off', ['director'], perAddress, validate(idParams, 'params'), validate(signOffSchema), perAccount, async (req, res) => {
    res.status(201).json(await signOff.signOff(req.user!, String(req.params.id), req.body));
  });
  return api;
}

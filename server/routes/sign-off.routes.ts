import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { signOffContracts as c } from '../../shared/contracts/sign-off';
import { signOffService } from '../services/sign-off.service';
import { failedPasswordLimiter } from '../auth/failed-password-limiter';
import { ACCOUNT_THROTTLE, accountThrottle, throttleAccount } from '../auth/throttle';

export function signOffRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const signOff = signOffService(deps);

  api.route(c.readiness, ({ user, params }) => signOff.readiness(user, params.id));
  // The password re-entered at sign-off is limited like sign-in: wrong ones per address, and per
  // account slowed (a stolen session must not become a way to guess the director's password).
  const perAddress = failedPasswordLimiter(deps.env.SIGNIN_RATE_LIMIT, 'password checks');
  const perAccount = throttleAccount(accountThrottle(ACCOUNT_THROTTLE), (req) => `sign-off:${req.user!.id}`);
  // Directors only; the service then checks it is this event's director (object level).
  api.route(c.signOff, ({ user, params, body }) => signOff.signOff(user, params.id, body), { first: [perAddress], after: [perAccount] });
  return api;
}

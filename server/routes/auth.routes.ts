import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { sendProblem } from '../middleware/error-handler';
import { ACCOUNT_THROTTLE, accountThrottle, throttleAccount } from '../auth/throttle';
import { failedPasswordLimiter } from '../auth/failed-password-limiter';
import { unauthorized } from '../lib/app-error';
import { sessionCookie } from '../auth/authenticate';
import type { AuthService } from '../services/auth.service';
import { publicUser } from '../presenters/users';
import { authContracts as c } from '../../shared/contracts/auth';
import type { SignInInput } from '../../shared/schemas/auth';

export function authRoutes(deps: AppDeps, auth: AuthService) {
  const api = apiRouter(deps);
  const cookie = sessionCookie(deps.env.APP_ORIGIN);

  // Per address: failed sign-ins (401) from one address, whatever e-mails they name; successes
  // are not counted (express-rate-limit counts a request, then takes it back when it succeeded).
  const signInLimiter = failedPasswordLimiter(deps.env.SIGNIN_RATE_LIMIT, 'sign-in attempts');
  // Per account, across addresses: slows, never locks (server/auth/throttle.ts).
  const accounts = accountThrottle(ACCOUNT_THROTTLE);
  const perAccount = throttleAccount(accounts, (req) => `sign-in:${(req.body as SignInInput).email}`);
  // Reset requests send mail: limited per address over all of them (they all answer alike).
  const resetLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: deps.env.SIGNIN_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
    handler: (_req, res) =>
      sendProblem(res, 429, 'too-many-attempts', 'Too many reset requests from this address. Wait a few minutes and try again.'),
  });

  api.route(
    c.signIn,
    async ({ body, req, res }) => {
      const result = await auth.signIn(body.email, body.password, req.get('user-agent'));
      if (!result) throw unauthorized('The e-mail or password is not right.');
      res.cookie(cookie.name, result.token, { ...cookie.options, expires: result.expiresAt });
      return { user: publicUser(result.user) };
    },
    { first: [signInLimiter], after: [perAccount] },
  );
  api.route(c.me, ({ user }) => ({ user: publicUser(user) }));
  api.route(c.signOut, ({ req, res }) => {
    auth.signOut(req.sessionId!);
    res.clearCookie(cookie.name, cookie.options);
  });
  api.route(c.preferences, ({ user, body }) => ({ user: auth.setPreferences(user.id, body.unitSystem) }));
  api.route(
    c.requestReset,
    ({ body }) => {
      // Answer first, then look the address up and send: otherwise the time to answer tells whether
      // the address has an account (sending took ~100 ms, an unknown address ~3 ms).
      setImmediate(() => {
        auth.requestReset(body.email).catch((err) => deps.log.error('password reset: the e-mail could not be sent', err));
      });
      return { detail: 'If that address has an account, a link is on its way.' };
    },
    { first: [resetLimiter] },
  );
  api.route(c.linkInfo, ({ params }) => {
    const { user, row } = auth.checkToken(params.token);
    return { email: user.email, name: user.name, purpose: row.purpose };
  });
  api.route(c.setPassword, async ({ params, body }) => ({ user: await auth.setPassword(params.token, body.password) }));
  return api;
}

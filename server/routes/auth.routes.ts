import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { sendProblem } from '../middleware/error-handler';
import { unauthorized } from '../lib/app-error';
import { sessionCookie } from '../auth/authenticate';
import type { AuthService } from '../services/auth.service';
import { publicUser } from '../presenters/users';
import { authContracts as c } from '../../shared/contracts/auth';

export function authRoutes(deps: AppDeps, auth: AuthService) {
  const api = apiRouter(deps);
  const cookie = sessionCookie(deps.env.APP_ORIGIN);
  const signInLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: deps.env.SIGNIN_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String(req.body?.email ?? '').trim().toLowerCase()}`,
    handler: (_req, res) =>
      sendProblem(res, 429, 'too-many-attempts', 'Too many sign-in attempts. Wait a few minutes and try again.'),
  });

  api.route(
    c.signIn,
    async ({ body, req, res }) => {
      const result = await auth.signIn(body.email, body.password, req.get('user-agent'));
      if (!result) throw unauthorized('The e-mail or password is not right.');
      res.cookie(cookie.name, result.token, { ...cookie.options, expires: result.expiresAt });
      return { user: publicUser(result.user) };
    },
    { before: [signInLimiter] },
  );
  api.route(c.me, ({ user }) => ({ user: publicUser(user) }));
  api.route(c.signOut, ({ req, res }) => {
    auth.signOut(req.sessionId!);
    res.clearCookie(cookie.name, cookie.options);
  });
  api.route(c.preferences, ({ user, body }) => ({ user: auth.setPreferences(user.id, body.unitSystem) }));
  api.route(
    c.requestReset,
    async ({ body }) => {
      await auth.requestReset(body.email);
      return { detail: 'If that address has an account, a link is on its way.' };
    },
    { before: [signInLimiter] },
  );
  api.route(c.linkInfo, ({ params }) => {
    const { user, row } = auth.checkToken(params.token);
    return { email: user.email, name: user.name, purpose: row.purpose };
  });
  api.route(c.setPassword, async ({ params, body }) => ({ user: await auth.setPassword(params.token, body.password) }));
  return api;
}

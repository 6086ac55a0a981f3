import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { AppDeps } from '../deps';
import { ApiRouter } from '../http/api-router';
import { validate } from '../middleware/validate';
import { sendProblem } from '../middleware/error-handler';
import { unauthorized } from '../lib/app-error';
import { sessionCookie } from '../auth/authenticate';
import type { AuthService } from '../services/auth.service';
import { publicUser } from '../presenters/users';
import { preferencesSchema, requestResetSchema, setPasswordSchema, signInSchema, type SignInInput } from '../../shared/schemas/auth';

export function authRoutes(deps: AppDeps, auth: AuthService) {
  const api = new ApiRouter();
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

  api.post('/auth/sign-in', 'public', signInLimiter, validate(signInSchema), async (req, res) => {
    const { email, password } = req.body as SignInInput;
    const result = await auth.signIn(email, password, req.get('user-agent'));
    if (!result) throw unauthorized('The e-mail or password is not right.');
    res.cookie(cookie.name, result.token, { ...cookie.options, expires: result.expiresAt });
    res.json({ user: publicUser(result.user) });
  });

  api.get('/auth/me', 'signed-in', (req, res) => {
    res.json({ user: publicUser(req.user!) });
  });

  api.post('/auth/sign-out', 'signed-in', (req, res) => {
    auth.signOut(req.sessionId!);
    res.clearCookie(cookie.name, cookie.options);
    res.status(204).end();
  });

  api.put('/auth/preferences', 'signed-in', validate(preferencesSchema), (req, res) => {
    res.json({ user: auth.setPreferences(req.user!.id, req.body.unitSystem) });
  });

  api.post('/auth/password-reset', 'public', signInLimiter, validate(requestResetSchema), async (req, res) => {
    await auth.requestReset(req.body.email);
    res.status(202).json({ detail: 'If that address has an account, a link is on its way.' });
  });

  api.get('/auth/set-password/:token', 'public', (req, res) => {
    const { user, row } = auth.checkToken(String(req.params.token));
    res.json({ email: user.email, name: user.name, purpose: row.purpose });
  });

  api.post('/auth/set-password/:token', 'public', validate(setPasswordSchema), async (req, res) => {
    const user = await auth.setPassword(String(req.params.token), req.body.password);
    res.json({ user });
  });

  return api;
}

import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { AppDeps } from '../deps';
import { ApiRouter } from '../http/api-router';
import { validate } from '../middleware/validate';
import { sendProblem } from '../middleware/error-handler';
import { ACCOUNT_THROTTLE, accountThrottle, throttleAccount } from '../auth/throttle';
import { failedPasswordLimiter } from '../auth/failed-password-limiter';
import { unauthorized } from '../lib/app-error';
import { sessionCookie } from '../auth/authenticate';
import { publicUser, type AuthService } from '../services/auth.service';
import { preferencesSchema, requestResetSchema, setPasswordSchema, signInSchema, type SignInInput } from '../../shared/schemas/auth';

export function authRoutes(deps: AppDeps, auth: AuthService) {
  const api = new ApiRouter();
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
    handler: (_req, res) => sendProblem(res, 429, 'too-many-attempts', 'Too many reset requests from this address. Wait a few minutes and try again.'),
  });

  api.post('/auth/sign-in', 'public', signInLimiter, validate(signInSchema), perAccount, async (req, res) => {
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

  api.post('/auth/password-reset', 'public', resetLimiter, validate(requestResetSchema), (req, res) => {
    // Answer first, then look the address up and send: otherwise the time to answer tells whether
    // the address has an account (sending took ~100 ms, an unknown address ~3 ms).
    res.status(202).json({ detail: 'If that address has an account, a link is on its way.' });
    const email = (req.body as { email: string }).email;
    setImmediate(() => {
      auth.requestReset(email).catch((err) => deps.log.error('password reset: the e-mail could not be sent', err));
    });
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

import type { CookieOptions, RequestHandler } from 'express';
import type { SessionResolver } from './types';

export function sessionCookie(appOrigin: string) {
  const secure = appOrigin.startsWith('https://');
  // __Host- and Secure only where the browser will send them back (OWASP ASVS 3.3.1, 3.3.2).
  const name = secure ? '__Host-sw_session' : 'sw_session';
  const options: CookieOptions = { httpOnly: true, sameSite: 'lax', secure, path: '/' };
  return { name, options };
}

// Sets req.user when the cookie names a live session; anything else leaves it unset, and the
// route's access policy decides (401 where a user is needed).
export function authenticate(sessions: SessionResolver, cookieName: string): RequestHandler {
  return async (req, _res, next) => {
    const token = sessionToken(req.cookies, cookieName);
    if (token) {
      const found = await sessions.resolve(token);
      if (found) {
        req.user = found.user;
        req.sessionId = found.sessionId;
      }
    }
    next();
  };
}

/** The session cookie's token among parsed cookies, if it is one worth looking up (a string of sane length). */
export function sessionToken(cookies: Record<string, unknown> | undefined, cookieName: string): string | undefined {
  const token = cookies?.[cookieName];
  return typeof token === 'string' && token.length > 0 && token.length < 4096 ? token : undefined;
}

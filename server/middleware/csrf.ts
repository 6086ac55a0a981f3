import type { RequestHandler } from 'express';
import { forbidden } from '../lib/app-error';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

// CSRF defence by the standard headers (OWASP ASVS 3.5): Sec-Fetch-Site where sent, else Origin,
// else Referer, must be our own origin. A state-changing request with none of them is refused.
// "Our own" is APP_ORIGIN, or the address the request itself was sent to (its Host; OWASP CSRF
// cheat sheet, "Identifying the target origin"): a tablet that opened the app at the hall's
// network address can write even when APP_ORIGIN still says localhost. A page elsewhere cannot
// pass: its Origin names its own site, and the browser sends our cookie only to our address.
// `readOnly` lists POST paths (inside the API router) that change nothing and are for anyone, so a
// request from elsewhere cannot do harm with the visitor's cookie: they need no origin check.
export function csrfGuard(appOrigin: string, readOnly: ReadonlySet<string> = new Set()): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method) || readOnly.has(req.path)) return next();
    const refusal = crossSiteRefusal(appOrigin, (name) => req.get(name), req.protocol);
    return refusal ? next(forbidden(refusal)) : next();
  };
}

/** Why a state-changing request is refused as cross-site, or null if it comes from our own origin. */
export function crossSiteRefusal(appOrigin: string, header: (name: string) => string | undefined, protocol: string): string | null {
  const site = header('sec-fetch-site');
  if (site && site !== 'same-origin' && site !== 'none') return 'This request came from another site and was refused.';
  const ours = (o: string) => o === appOrigin || o === `${protocol}://${header('host') ?? ''}`;
  const origin = header('origin');
  if (origin && origin !== 'null') return ours(origin) ? null : 'This request came from another origin and was refused.';
  const referer = header('referer');
  if (referer) {
    let refOrigin = '';
    try {
      refOrigin = new URL(referer).origin;
    } catch {
      /* unparsable: refused below */
    }
    return ours(refOrigin) ? null : 'This request came from another origin and was refused.';
  }
  if (site === 'same-origin') return null;
  return 'This request has no Origin or Referer header and was refused (cross-site request protection).';
}

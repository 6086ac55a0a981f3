import type { RequestHandler } from 'express';
import { isIP } from 'node:net';
import { sendProblem } from './error-handler';

/** The host name of a Host header value (`[::1]:3000` → `::1`, `Hall.Example.:80` → `hall.example`). */
export function hostNameOf(hostHeader: string): string {
  const h = hostHeader.trim().toLowerCase();
  if (h.startsWith('[')) {
    const end = h.indexOf(']');
    return end > 0 ? h.slice(1, end) : h;
  }
  // One colon: a port. More than one: a bare IPv6 address (not valid in Host, but harmless to read).
  const colons = h.split(':').length - 1;
  const name = colons === 1 ? h.slice(0, h.indexOf(':')) : h;
  return name.replace(/\.$/, '');
}

/**
 * DNS rebinding defence: a request is served only if it names a host we know — an IP literal,
 * localhost, APP_ORIGIN's host, or one listed in ALLOWED_HOSTS. A rebinding page's requests carry
 * its own domain in Host (and its own origin in Origin, which the CSRF check would otherwise take
 * as "the address the request was sent to"). 421 Misdirected Request (RFC 9110 §15.5.20).
 */
export function hostCheck(appOrigin: string, allowedHosts: readonly string[]): RequestHandler {
  const ok = knownHost(appOrigin, allowedHosts);
  return (req, res, next) => {
    // req.hostname honours X-Forwarded-Host from a proxy on loopback ('trust proxy'); both must pass.
    const raw = req.get('host');
    const forwarded = req.get('x-forwarded-host') ? req.hostname : undefined;
    if (ok(raw) && (forwarded === undefined || ok(forwarded))) return next();
    sendProblem(
      res,
      421,
      'unknown-host',
      `This server does not answer for the host "${(forwarded ?? raw ?? '').slice(0, 100)}". Use its address or a name listed in ALLOWED_HOSTS.`,
    );
  };
}

/** Whether a Host header value names a host we answer for (hostCheck; the direct reading write). */
export function knownHost(appOrigin: string, allowedHosts: readonly string[]): (value: string | undefined) => boolean {
  const known = new Set(['localhost', hostNameOf(new URL(appOrigin).host), ...allowedHosts.map(hostNameOf)]);
  return (value) => {
    if (!value) return false;
    const name = hostNameOf(value);
    return isIP(name) !== 0 || known.has(name);
  };
}

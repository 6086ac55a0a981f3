import type { Request, Response } from 'express';
import { AppError, preconditionFailed } from '../lib/app-error';

// Optimistic concurrency (RFC 9110 §13.1.1, RFC 6585 §3): the ETag is the row's version number; a
// write sends it back in If-Match, so two people cannot overwrite each other's changes unknowingly.
// Services check it after the object-level access check, so a stranger still gets 404/403 first.

export function setVersionTag(res: Response, version: number) {
  res.set('ETag', `"${version}"`);
}

export const ifMatchOf = (req: Request): string | undefined => req.get('If-Match');

/** Throws 428 when If-Match is missing and 412 when it is not the current version. */
export function requireVersion(
  header: string | undefined,
  current: number,
  stale: (yours: number | null, current: number) => string,
): number {
  if (!header || header.trim() === '' || header.trim() === '*') {
    throw new AppError(
      428,
      'if-match-required',
      'Send the version you are changing in an If-Match header (the ETag you got when you loaded it).',
    );
  }
  const m = /^\s*(?:W\/)?"?(\d{1,9})"?\s*$/.exec(header);
  const yours = m ? Number(m[1]) : null;
  if (yours !== current) throw preconditionFailed(stale(yours, current), { currentVersion: current, yourVersion: yours });
  return current;
}

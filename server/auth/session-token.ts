import { jwtVerify, SignJWT } from 'jose';

// The cookie holds a short JWT naming a session row; the row is what sign-out, disabling a user
// and "end all sessions" revoke, so they take effect at once (OWASP ASVS 7.4.1).
const AUDIENCE = 'stripwarden';
const ISSUER = 'stripwarden';

export async function signSessionToken(secret: Uint8Array, sessionId: string, userId: string, expiresAt: Date) {
  return new SignJWT({ sid: sessionId })
    .setProtectedHeader({ alg: 'HS256', typ: 'JWT' })
    .setSubject(userId)
    .setIssuedAt()
    .setIssuer(ISSUER)
    .setAudience(AUDIENCE)
    .setExpirationTime(Math.floor(expiresAt.getTime() / 1000))
    .sign(secret);
}

// The secret imported once as a key: jose otherwise imports the raw bytes again on every request.
const keys = new WeakMap<Uint8Array, Promise<CryptoKey>>();
function verifyKey(secret: Uint8Array): Promise<CryptoKey> {
  let key = keys.get(secret);
  if (!key) {
    key = crypto.subtle.importKey('raw', secret as BufferSource, { name: 'HMAC', hash: 'SHA-256' }, false, ['verify']);
    keys.set(secret, key);
  }
  return key;
}

// Tokens already verified, until their own expiry: checking the signature again gives the same
// answer, and it was the largest cost of every signed-in request (profiled under `npm run bench
// writes`). Only the signature and claims are remembered; the session row is still read on every
// request, so revocation stays immediate. Failures are not remembered, so garbage cannot fill it.
const MAX_VERIFIED = 10_000;
const verified = new WeakMap<Uint8Array, Map<string, { sessionId: string; userId: string; exp: number }>>();

/** Null for anything not a valid, unexpired token of ours: no exceptions leak out. */
export async function verifySessionToken(secret: Uint8Array, token: string) {
  let known = verified.get(secret);
  if (!known) verified.set(secret, (known = new Map()));
  const hit = known.get(token);
  if (hit) {
    // The same test as jose's: expired once the current second reaches exp.
    if (Math.floor(Date.now() / 1000) < hit.exp) return { sessionId: hit.sessionId, userId: hit.userId };
    known.delete(token);
    return null;
  }
  try {
    const { payload } = await jwtVerify(token, await verifyKey(secret), {
      algorithms: ['HS256'],
      audience: AUDIENCE,
      issuer: ISSUER,
      typ: 'JWT',
    });
    if (typeof payload.sid !== 'string' || typeof payload.sub !== 'string') return null;
    if (typeof payload.exp === 'number') {
      if (known.size >= MAX_VERIFIED) known.clear();
      known.set(token, { sessionId: payload.sid, userId: payload.sub, exp: payload.exp });
    }
    return { sessionId: payload.sid, userId: payload.sub };
  } catch {
    return null;
  }
}

import { randomBytes, scrypt as scryptCb, timingSafeEqual, type ScryptOptions } from 'node:crypto';

// OWASP ASVS 5.0 Appendix C: scrypt with N ≥ 2^17, r = 8, p = 1.
export const DEFAULT_SCRYPT = { N: 2 ** 17, r: 8, p: 1 } as const;
// Only for the test suite (PASSWORD_HASH_COST=test), so thousands of sign-ins stay fast.
export const TEST_SCRYPT = { N: 2 ** 10, r: 8, p: 1 } as const;
const KEY_LEN = 32;

export type ScryptParams = { N: number; r: number; p: number };

function scrypt(password: string, salt: Buffer, params: ScryptParams): Promise<Buffer> {
  const options: ScryptOptions = { ...params, maxmem: 256 * params.N * params.r + 1024 * 1024 };
  return new Promise((resolve, reject) =>
    scryptCb(password.normalize('NFKC'), salt, KEY_LEN, options, (err, key) => (err ? reject(err) : resolve(key))),
  );
}

export async function hashPassword(password: string, params: ScryptParams = DEFAULT_SCRYPT): Promise<string> {
  const salt = randomBytes(16);
  const key = await scrypt(password, salt, params);
  return `scrypt$${params.N}$${params.r}$${params.p}$${salt.toString('base64')}$${key.toString('base64')}`;
}

export function parseHashParams(stored: string): ScryptParams | null {
  const [alg, n, r, p] = stored.split('$');
  if (alg !== 'scrypt') return null;
  return { N: Number(n), r: Number(r), p: Number(p) };
}

export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parts = stored.split('$');
  const params = parseHashParams(stored);
  if (!params || parts.length !== 6) return false;
  const salt = Buffer.from(parts[4], 'base64');
  const expected = Buffer.from(parts[5], 'base64');
  const key = await scrypt(password, salt, params);
  return key.length === expected.length && timingSafeEqual(key, expected);
}

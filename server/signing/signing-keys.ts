// The Ed25519 key that signs certificates (RFC 8037: EdDSA in JOSE). The private key comes from
// SIGNING_KEY_PATH (PKCS8 PEM or a private JWK) or, without it, from a JWK made on first use in
// the data folder with owner-only permissions. Its key id is the RFC 7638 JWK thumbprint. Every
// public key ever used stays in signing_keys, so old certificates keep verifying after rotation.
import { createPrivateKey, createPublicKey, generateKeyPairSync, sign as edSign, type KeyObject } from 'node:crypto';
import { chmodSync, existsSync, readFileSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { CompactSign, calculateJwkThumbprint, type JWK } from 'jose';
import canonicalize from 'canonicalize';
import type { Db } from '../db/client';
import type { Env } from '../config/env';
import { signingKeysRepository } from '../db/signing-keys.repository';
import { PRIVATE_FILE_MODE, privateDir, tighten } from '../storage/private-files';

export const CERTIFICATE_JWS_TYP = 'stripwarden-cert+jws';
export const GENERATED_KEY_FILE = 'signing-key.jwk';

export interface SigningKey {
  kid: string;
  privateKey: KeyObject;
  publicJwk: JWK;
}

/**
 * Reads a private Ed25519 key from PEM (PKCS8) or JWK text. A refusal says what is wrong with the
 * text in our own words and never carries the parser's message: JSON.parse quotes the text it
 * choked on, which here is the private key (OWASP ASVS 5.0 16.2.5, no secrets in logs).
 */
export function privateKeyFromText(text: string, what = 'The signing key'): KeyObject {
  const trimmed = text.trim();
  let key: KeyObject;
  if (trimmed.startsWith('-----BEGIN')) {
    try {
      key = createPrivateKey({ key: trimmed, format: 'pem' });
    } catch {
      throw new Error(`${what} is PEM text that does not read as a private key (expected PKCS8, "BEGIN PRIVATE KEY").`);
    }
  } else {
    let jwk: unknown;
    try {
      jwk = JSON.parse(trimmed);
    } catch {
      throw new Error(
        `${what} is neither PEM nor JSON text (expected a PKCS8 PEM or a private JWK); the file may be cut short or damaged.`,
      );
    }
    if (typeof jwk !== 'object' || jwk === null || Array.isArray(jwk)) throw new Error(`${what} is JSON but not a JWK object.`);
    if (!('d' in jwk)) throw new Error(`${what} is a JWK without its private part ("d"): a public key cannot sign.`);
    try {
      key = createPrivateKey({ key: jwk as import('node:crypto').JsonWebKey, format: 'jwk' });
    } catch {
      throw new Error(`${what} is a JWK that does not read as a private key (expected kty "OKP", crv "Ed25519" and valid "x" and "d").`);
    }
    // Node derives the public key from "d" alone: a "x" that does not match means the file is damaged.
    const x = (jwk as { x?: unknown }).x;
    if (key.asymmetricKeyType === 'ed25519' && x !== undefined && publicJwkOf(key).x !== x) {
      throw new Error(`${what} is damaged: its public part ("x") does not belong to its private part ("d").`);
    }
  }
  if (key.asymmetricKeyType !== 'ed25519') {
    throw new Error(`${what} must be an Ed25519 private key, not ${key.asymmetricKeyType ?? 'unknown'}.`);
  }
  return key;
}

/** RFC 8032 §5.1.5: the 32-byte secret (seed) as given in the RFC's test vectors. */
export function privateKeyFromSeed(seed: Uint8Array): KeyObject {
  // PKCS8 wrapping of an Ed25519 seed (RFC 8410 §7): a fixed 16-byte prefix, then the seed.
  const prefix = Buffer.from('302e020100300506032b657004220420', 'hex');
  return createPrivateKey({ key: Buffer.concat([prefix, Buffer.from(seed)]), format: 'der', type: 'pkcs8' });
}

export function publicJwkOf(privateKey: KeyObject): JWK {
  const jwk = createPublicKey(privateKey).export({ format: 'jwk' }) as JWK;
  return { kty: jwk.kty, crv: jwk.crv, x: jwk.x };
}

/** RFC 7638 thumbprint (SHA-256), the key id. */
export const keyIdOf = (publicJwk: JWK) => calculateJwkThumbprint({ kty: publicJwk.kty, crv: publicJwk.crv, x: publicJwk.x }, 'sha256');

/** Plain Ed25519 over bytes (RFC 8032). */
export const ed25519Sign = (privateKey: KeyObject, message: Uint8Array) => new Uint8Array(edSign(null, message, privateKey));

/** A compact JWS (RFC 7515) over exactly these bytes. */
export function signCompact(privateKey: KeyObject, payload: Uint8Array, header: { alg: 'EdDSA'; kid?: string; typ?: string }) {
  return new CompactSign(payload).setProtectedHeader(header).sign(privateKey);
}

/** RFC 8785 canonical JSON of a record: the bytes that are signed and hashed. */
export function canonicalJson(value: unknown): string {
  const text = canonicalize(value);
  if (text === undefined) throw new Error('This value has no canonical JSON form.');
  return text;
}

export async function signCertificatePayload(key: SigningKey, payload: unknown) {
  const canonical = canonicalJson(payload);
  const jws = await signCompact(key.privateKey, new TextEncoder().encode(canonical), {
    alg: 'EdDSA',
    kid: key.kid,
    typ: CERTIFICATE_JWS_TYP,
  });
  return { canonical, jws };
}

export function newPrivateJwk(): string {
  const { privateKey } = generateKeyPairSync('ed25519');
  return JSON.stringify(privateKey.export({ format: 'jwk' }));
}

/** Writes a private key file with owner-only permissions; replaces an old one atomically. */
export function writeKeyFile(path: string, text: string, opts: { replace: boolean }) {
  privateDir(dirname(path), { tightenExisting: false });
  if (!opts.replace) {
    // 'wx': two processes starting at once must not both make a key.
    writeFileSync(path, text, { mode: 0o600, flag: 'wx' });
  } else {
    const tmp = `${path}.${process.pid}.tmp`;
    writeFileSync(tmp, text, { mode: 0o600, flag: 'wx' });
    renameSync(tmp, path);
  }
  chmodSync(path, 0o600);
}

export function keyFilePath(env: Pick<Env, 'SIGNING_KEY_PATH' | 'DATA_DIR'>) {
  return env.SIGNING_KEY_PATH ?? join(env.DATA_DIR, GENERATED_KEY_FILE);
}

function ensureKeyFile(env: Pick<Env, 'SIGNING_KEY_PATH' | 'DATA_DIR'>): string {
  const path = keyFilePath(env);
  if (env.SIGNING_KEY_PATH) {
    if (!existsSync(path)) throw new Error(`SIGNING_KEY_PATH points at ${path}, but there is no file there.`);
    return path;
  }
  if (!existsSync(path)) {
    try {
      writeKeyFile(path, newPrivateJwk(), { replace: false });
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
    }
  }
  // Our own generated key: kept owner-only even if someone loosened it.
  tighten(path, PRIVATE_FILE_MODE);
  return path;
}

async function loadKey(db: Db, path: string): Promise<SigningKey> {
  const privateKey = privateKeyFromText(readFileSync(path, 'utf8'), `The signing key file ${path}`);
  const publicJwk = publicJwkOf(privateKey);
  const kid = await keyIdOf(publicJwk);
  signingKeysRepository(db).makeCurrent(kid, JSON.stringify(publicJwk), new Date().toISOString());
  return { kid, privateKey, publicJwk };
}

const cache = new WeakMap<Db, { path: string; stamp: string; key: Promise<SigningKey> }>();

/**
 * The current signing key. The file is checked on every call, so a rotated key (npm run
 * keys:rotate) is picked up without a restart.
 */
export function currentSigningKey(db: Db, env: Pick<Env, 'SIGNING_KEY_PATH' | 'DATA_DIR'>): Promise<SigningKey> {
  const path = ensureKeyFile(env);
  const { mtimeMs, ino, size } = statSync(path);
  const stamp = `${ino}:${mtimeMs}:${size}`;
  const hit = cache.get(db);
  if (hit && hit.path === path && hit.stamp === stamp) return hit.key;
  const key = loadKey(db, path);
  cache.set(db, { path, stamp, key });
  key.catch(() => cache.delete(db));
  return key;
}

/** The published JWK Set: every key that ever signed, with what it is for. */
/** An Ed25519 public key as stored (RFC 8037: kty OKP, crv Ed25519, x). */
type StoredPublicJwk = JWK & { kty: string; crv: string; x: string };

export function publicJwks(db: Db) {
  return {
    keys: signingKeysRepository(db)
      .all()
      .map((k) => ({ ...(JSON.parse(k.publicJwkJson) as StoredPublicJwk), kid: k.kid, alg: 'EdDSA' as const, use: 'sig' as const })),
  };
}

// The certificate signing code against the published Ed25519 / JOSE test vectors.
import { describe, expect, test } from 'vitest';
import { createHash } from 'node:crypto';
import { compactVerify, importJWK } from 'jose';
import {
  canonicalJson,
  ed25519Sign,
  keyIdOf,
  privateKeyFromSeed,
  privateKeyFromText,
  publicJwkOf,
  signCompact,
} from '../../server/signing/signing-keys';
import { readingsDigest, type CertifiedReading } from '../../server/signing/certificate-record';
import { turns } from '../../server/lib/turns';
import { setImmediate } from 'node:timers/promises';

const hex = (b: Uint8Array) => Buffer.from(b).toString('hex');

describe('Ed25519 (RFC 8032 §7.1, TEST 1)', () => {
  const secret = '9d61b19deffd5a60ba844af492ec2cc44449c5697b326919703bac031cae7f60';
  const publicKey = 'd75a980182b10ab7d54bfed3c964073a0ee172f3daa62325af021a68f707511a';
  const signature =
    'e5564300c360ac729086e2cc806e828a84877f1eb8e5d974d873e065224901555fb8821590a33bacc61e39701cf9b46bd25bf5f0595bbe24655141438e7a100b';

  test('the public key derived from the secret key is the RFC 8032 TEST 1 public key', () => {
    const key = privateKeyFromSeed(Buffer.from(secret, 'hex'));
    expect(hex(Buffer.from(publicJwkOf(key).x!, 'base64url'))).toBe(publicKey);
  });

  test('the signature of the empty message is the RFC 8032 TEST 1 signature', () => {
    const key = privateKeyFromSeed(Buffer.from(secret, 'hex'));
    expect(hex(ed25519Sign(key, new Uint8Array(0)))).toBe(signature);
  });
});

describe('Ed25519 in JOSE (RFC 8037 Appendix A)', () => {
  const jwk = {
    kty: 'OKP',
    crv: 'Ed25519',
    d: 'nWGxne_9WmC6hEr0kuwsxERJxWl7MmkZcDusAxyuf2A',
    x: '11qYAYKxCrfVS_7TyWQHOg7hcvPapiMlrwIaaPcHURo',
  };
  const signingInput = 'eyJhbGciOiJFZERTQSJ9.RXhhbXBsZSBvZiBFZDI1NTE5IHNpZ25pbmc';
  const sig = 'hgyY0il_MGCjP0JzlnLWG1PPOt7-09PGcvMg3AIbQR6dWbhijcNR4ki4iylGjg5BhVsPt9g7sVvpAr_MuM0KAg';

  test('A.2: the public key of the A.1 private key is the given x', () => {
    expect(publicJwkOf(privateKeyFromText(JSON.stringify(jwk)))).toEqual({ kty: 'OKP', crv: 'Ed25519', x: jwk.x });
  });

  test('A.3: the JWK thumbprint (our key id) is kPrK_qmxVWaYVA9wwBF6Iuo3vVzz7TxHCTwXBygrS4k', async () => {
    expect(await keyIdOf({ kty: 'OKP', crv: 'Ed25519', x: jwk.x })).toBe('kPrK_qmxVWaYVA9wwBF6Iuo3vVzz7TxHCTwXBygrS4k');
  });

  test('A.4: signing "Example of Ed25519 signing" with {"alg":"EdDSA"} gives the RFC 8037 compact JWS', async () => {
    const jws = await signCompact(privateKeyFromText(JSON.stringify(jwk)), new TextEncoder().encode('Example of Ed25519 signing'), {
      alg: 'EdDSA',
    });
    expect(jws).toBe(`${signingInput}.${sig}`);
  });

  test('A.5: the RFC 8037 JWS verifies with the public key, and not once its payload is changed', async () => {
    const pub = await importJWK({ kty: 'OKP', crv: 'Ed25519', x: jwk.x }, 'EdDSA');
    const { payload } = await compactVerify(`${signingInput}.${sig}`, pub);
    expect(new TextDecoder().decode(payload)).toBe('Example of Ed25519 signing');
    const [h] = signingInput.split('.');
    const other = Buffer.from('Example of Ed25519 signinG').toString('base64url');
    await expect(compactVerify(`${h}.${other}.${sig}`, pub)).rejects.toThrow();
  });
});

describe('canonical JSON (RFC 8785)', () => {
  test('keys are sorted and whitespace dropped, so the same record always gives the same bytes', () => {
    expect(canonicalJson({ b: 1, a: [true, null, 'x'], c: { z: 1.5, y: 'é' } })).toBe('{"a":[true,null,"x"],"b":1,"c":{"y":"é","z":1.5}}');
  });

  test('numbers are written the ECMAScript way (RFC 8785 §3.2.2.3)', () => {
    expect(canonicalJson([1e21, 0.000001, 1e-7, -0])).toBe('[1e+21,0.000001,1e-7,0]');
  });
});

describe('the readings digest hashed in slices', () => {
  const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');
  const reading = (i: number) =>
    ({
      readingId: `r-${i}`,
      valueOhm: i / 10,
      valueText: `${i / 10}`,
      overRange: i % 7 === 0,
      position: i % 2 ? 'Piste é' : 'Reel',
    }) as unknown as CertifiedReading;

  test('gives the SHA-256 of the RFC 8785 array written out by hand', async () => {
    const list = [reading(1), reading(2)];
    const text =
      '[{"overRange":false,"position":"Piste é","readingId":"r-1","valueOhm":0.1,"valueText":"0.1"},' +
      '{"overRange":false,"position":"Reel","readingId":"r-2","valueOhm":0.2,"valueText":"0.2"}]';
    expect(await readingsDigest(list, turns(0))).toBe(sha256(text));
  });

  test('gives the SHA-256 of the canonical JSON of the whole list at once, whatever the turns, twice over, and of an empty list', async () => {
    const list = Array.from({ length: 1000 }, (_, i) => reading(i));
    // The whole array through the RFC 8785 package in one piece (canonicalJson), hashed by node:crypto.
    // A turn after every reading, after every third, after a few milliseconds, never; the second
    // round reads the texts kept from the first.
    let n = 0;
    const everyThird = async () => {
      if (++n % 3 === 0) await setImmediate();
    };
    for (const round of [1, 2])
      for (const turn of [turns(0), everyThird, turns(), turns(Infinity)])
        expect(await readingsDigest(list, turn), `round ${round}`).toBe(sha256(canonicalJson(list)));
    expect(await readingsDigest([])).toBe(sha256('[]'));
  });
});

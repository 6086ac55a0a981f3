// npm run keys:rotate — makes a new Ed25519 signing key current. The old public keys stay in
// signing_keys (and in /.well-known/jwks.json), so certificates signed before keep verifying.
// A running server picks the new key up at its next signature (the key file is re-read when it changes).
import { loadEnv } from '../server/config/env';
import { openDatabase } from '../server/db/client';
import { signingKeysRepository } from '../server/db/signing-keys.repository';
import { keyFilePath, keyIdOf, newPrivateJwk, privateKeyFromText, publicJwkOf, writeKeyFile } from '../server/signing/signing-keys';

const env = loadEnv();
if (env.SIGNING_KEY_PATH) {
  console.log(
    `The signing key comes from SIGNING_KEY_PATH (${env.SIGNING_KEY_PATH}). Put the new Ed25519 private key (PKCS8 PEM or JWK) there and restart;\n` +
      'the server records it as current and keeps the old public key for verification.',
  );
  process.exit(1);
}
const { sqlite, db } = openDatabase(env.DATABASE_PATH);
const repo = signingKeysRepository(db);
const before = repo
  .all()
  .filter((k) => !k.retiredAt)
  .map((k) => k.kid);
const text = newPrivateJwk();
const publicJwk = publicJwkOf(privateKeyFromText(text));
const kid = await keyIdOf(publicJwk);
writeKeyFile(keyFilePath(env), text, { replace: true });
repo.makeCurrent(kid, JSON.stringify(publicJwk), new Date().toISOString());
sqlite.close();
console.log(`New signing key ${kid} is current${before.length ? `; retired ${before.join(', ')} (kept for verification)` : ''}.`);

import { createHash, createPrivateKey, createPublicKey, generateKeyPairSync, sign, verify, type KeyObject } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

export type SigningKey = { privateKey: KeyObject; publicKey: KeyObject; publicKeyPem: string; keyId: string };

const cache = new Map<string, SigningKey>();

/** Where the key lives: var/keys/certificate-signing.key.pem (private) and .pub.pem. */
export function signingKeyPaths(varDir: string): { dir: string; privatePath: string; publicPath: string } {
  const dir = join(varDir, 'keys');
  return { dir, privatePath: join(dir, 'certificate-signing.key.pem'), publicPath: join(dir, 'certificate-signing.pub.pem') };
}

/** Where the key comes from: the shared file a cluster names (KC_SIGNING_KEY_FILE), or var/keys. */
export type SigningKeyPlace = { varDir: string; signingKeyFile: string | null };

/** The private key's path for this configuration. */
export function signingKeyPath(place: SigningKeyPlace): string {
  return place.signingKeyFile ?? signingKeyPaths(place.varDir).privatePath;
}

/**
 * The server's Ed25519 key for certificates. With KC_SIGNING_KEY_FILE (every node of a cluster reads the
 * same file) it is read from there and never made. Otherwise it is kept as PEM files under var/keys (never
 * in git), created on first use. keyId: the first 16 hex digits of the SHA-256 of the public key (DER),
 * stored with each signature so a later key change does not break the verification of older certificates.
 */
export function loadSigningKey(place: SigningKeyPlace): SigningKey {
  const cacheKey = signingKeyPath(place);
  const cached = cache.get(cacheKey);
  if (cached) return cached;
  const key = place.signingKeyFile ? keyFromPem(readFileSync(place.signingKeyFile)) : keyUnderVar(place.varDir);
  cache.set(cacheKey, key);
  return key;
}

function keyUnderVar(varDir: string): SigningKey {
  const { dir, privatePath, publicPath } = signingKeyPaths(varDir);
  if (!existsSync(privatePath)) {
    mkdirSync(dir, { recursive: true, mode: 0o700 });
    const pair = generateKeyPairSync('ed25519');
    // 'wx': if another process created the key meanwhile, keep theirs.
    try {
      writeFileSync(privatePath, pair.privateKey.export({ type: 'pkcs8', format: 'pem' }), { mode: 0o600, flag: 'wx' });
      writeFileSync(publicPath, pair.publicKey.export({ type: 'spki', format: 'pem' }), { mode: 0o644 });
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
    }
  }
  const key = keyFromPem(readFileSync(privatePath));
  if (!existsSync(publicPath)) writeFileSync(publicPath, key.publicKeyPem, { mode: 0o644 });
  return key;
}

function keyFromPem(pem: Buffer): SigningKey {
  const privateKey = createPrivateKey(pem);
  if (privateKey.asymmetricKeyType !== 'ed25519') {
    throw new Error(`the certificate signing key must be an Ed25519 private key (this one is ${privateKey.asymmetricKeyType ?? 'of no known type'})`);
  }
  const publicKey = createPublicKey(privateKey);
  const publicKeyPem = publicKey.export({ type: 'spki', format: 'pem' }).toString();
  const keyId = createHash('sha256')
    .update(publicKey.export({ type: 'spki', format: 'der' }))
    .digest('hex')
    .slice(0, 16);
  return { privateKey, publicKey, publicKeyPem, keyId };
}

/** What the server signs: binds the file's hash to the certificate number and revision. */
export function signedPayload(number: string, revision: number, sha256: string): Buffer {
  return Buffer.from(`kilocycle-certificate:v1:${number}:${revision}:${sha256}`, 'utf8');
}

export function sha256Hex(data: Buffer): string {
  return createHash('sha256').update(data).digest('hex');
}

export function signCertificate(key: SigningKey, number: string, revision: number, sha256: string): string {
  return sign(null, signedPayload(number, revision, sha256), key.privateKey).toString('base64');
}

export function verifyCertificateSignature(key: SigningKey, number: string, revision: number, sha256: string, signature: string): boolean {
  try {
    return verify(null, signedPayload(number, revision, sha256), key.publicKey, Buffer.from(signature, 'base64'));
  } catch {
    return false;
  }
}

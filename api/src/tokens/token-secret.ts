import { createHash, randomBytes } from 'node:crypto';
import { API_TOKEN_PREFIX } from '../auth/token-authenticator.js';

/** SHA-256 hex of a secret: only this is stored (a fast hash is fine for 256-bit random secrets). */
export function sha256Hex(secret: string): string {
  return createHash('sha256').update(secret, 'utf8').digest('hex');
}

/** A personal API token: `dgt_` + 32 random bytes in base64url (43 characters). */
export function newApiTokenSecret(): { secret: string; prefix: string; hash: string } {
  const secret = API_TOKEN_PREFIX + randomBytes(32).toString('base64url');
  return { secret, prefix: secret.slice(0, API_TOKEN_PREFIX.length + 8), hash: sha256Hex(secret) };
}

import { randomBytes } from 'node:crypto';
import { sha256Hex } from '../tokens/token-secret.js';

/** A single-use link secret: 32 random bytes base64url; only its SHA-256 is stored. */
export function newOneTimeToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: sha256Hex(token) };
}

export { sha256Hex };

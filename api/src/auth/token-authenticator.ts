import type { AuthUser } from './current-user.js';

/** Personal API tokens start with this prefix, which routes them away from JWT verification. */
export const API_TOKEN_PREFIX = 'dgt_';

/** Resolves a personal API token to its user (implemented by the tokens module). */
export abstract class TokenAuthenticator {
  abstract authenticate(secret: string): AuthUser | null;
}

/** Until personal tokens are enabled every such token is rejected. */
export class NoTokenAuthenticator extends TokenAuthenticator {
  authenticate(): AuthUser | null {
    return null;
  }
}

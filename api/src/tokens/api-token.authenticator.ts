import { Injectable } from '@nestjs/common';
import { Clock } from '../common/clock.js';
import type { AuthUser } from '../auth/current-user.js';
import { TokenAuthenticator } from '../auth/token-authenticator.js';
import { sha256Hex } from './token-secret.js';
import { TokensRepository } from './tokens.repository.js';

/** last_used_at is written at most this often per token, so scripted bursts do not write per request. */
const TOUCH_EVERY_MS = 60_000;

/** Resolves `dgt_…` bearers for the global AccessGuard: unknown, revoked, expired or inactive → null (401). */
@Injectable()
export class ApiTokenAuthenticator extends TokenAuthenticator {
  constructor(
    private readonly repo: TokensRepository,
    private readonly clock: Clock,
  ) {
    super();
  }

  authenticate(secret: string): AuthUser | null {
    const found = this.repo.findByHash(sha256Hex(secret));
    if (!found) return null;
    const { token, user } = found;
    const now = this.clock.now();
    if (token.revokedAt !== null) return null;
    if (token.expiresAt !== null && token.expiresAt <= now) return null;
    if (!user.active) return null;
    if (token.lastUsedAt === null || now - token.lastUsedAt >= TOUCH_EVERY_MS) this.repo.touch(token.id, now);
    return { id: user.id, email: user.email, name: user.name, role: user.role, via: 'token', scope: token.scope };
  }
}

import { Injectable } from '@nestjs/common';
import {
  ConflictError,
  ForbiddenError,
  NotFoundError,
  TOKEN_MAX_DAYS,
  ValidationError,
  type ActiveTokenCount,
  type ApiTokenSummary,
  type CreateTokenParsed,
  type CreatedApiToken,
  type PageOf,
  type PageQuery,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { Clock } from '../common/clock.js';
import { newApiTokenSecret } from './token-secret.js';
import { TokensRepository, type TokenRow } from './tokens.repository.js';

/** Unrevoked tokens one user may hold. */
export const MAX_TOKENS_PER_USER = 50;

function summary(t: TokenRow): ApiTokenSummary {
  return {
    id: t.id,
    name: t.name,
    scope: t.scope,
    prefix: t.prefix,
    createdAt: t.createdAt,
    expiresAt: t.expiresAt,
    lastUsedAt: t.lastUsedAt,
    revokedAt: t.revokedAt,
  };
}

@Injectable()
export class TokensService {
  constructor(
    private readonly repo: TokensRepository,
    private readonly clock: Clock,
  ) {}

  create(user: AuthUser, req: CreateTokenParsed): CreatedApiToken {
    // A token cannot mint tokens: a leaked secret must not be able to outlive its own revocation.
    if (user.via !== 'session')
      throw new ForbiddenError('API tokens can only be created when signed in with a password, not with another token');
    const now = this.clock.now();
    if (req.expiresAt !== null) {
      if (req.expiresAt <= now)
        throw new ValidationError('Invalid body: expiresAt: must be in the future', [
          { path: 'expiresAt', message: 'must be in the future' },
        ]);
      if (req.expiresAt > now + TOKEN_MAX_DAYS * 86_400_000) {
        throw new ValidationError(`Invalid body: expiresAt: at most ${TOKEN_MAX_DAYS} days ahead`, [
          { path: 'expiresAt', message: `at most ${TOKEN_MAX_DAYS} days ahead` },
        ]);
      }
    }
    if (this.repo.countUnrevoked(user.id) >= MAX_TOKENS_PER_USER) {
      throw new ConflictError(`You already hold ${MAX_TOKENS_PER_USER} tokens; revoke one before creating another`);
    }
    const { secret, prefix, hash } = newApiTokenSecret();
    const row = this.repo.insert({
      userId: user.id,
      name: req.name,
      scope: req.scope,
      tokenHash: hash,
      prefix,
      createdAt: now,
      expiresAt: req.expiresAt,
    });
    return {
      id: row.id,
      token: secret,
      name: row.name,
      scope: row.scope,
      prefix: row.prefix,
      createdAt: row.createdAt,
      expiresAt: row.expiresAt,
    };
  }

  list(user: AuthUser, q: PageQuery): PageOf<ApiTokenSummary> {
    const { items, total } = this.repo.listForUser(user.id, (q.page - 1) * q.pageSize, q.pageSize);
    return { items: items.map(summary), total, page: q.page, pageSize: q.pageSize };
  }

  /** Tokens that still open the api, shown where a password change offers to revoke them. */
  activeCount(user: AuthUser): ActiveTokenCount {
    return { count: this.repo.countActive(user.id, this.clock.now()) };
  }

  /** Revoking is idempotent; another user's token is a 404. */
  revoke(user: AuthUser, id: number): ApiTokenSummary {
    const t = this.repo.findForUser(id, user.id);
    if (!t) throw new NotFoundError(`No token with id ${id}`);
    if (t.revokedAt === null) this.repo.revoke(id, this.clock.now());
    return summary(this.repo.findForUser(id, user.id)!);
  }
}

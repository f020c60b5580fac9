import { Inject, Injectable } from '@nestjs/common';
import {
  ForbiddenError,
  PASSWORD_RESET_ACCEPTED,
  ValidationError,
  type ChangePasswordRequest,
  type PasswordResetConfirm,
  type PasswordResetRequest,
  type PasswordChangedView,
  type TokensRevoked,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { PasswordHasher } from '../auth/password-hasher.js';
import { AuthService } from '../auth/auth.service.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { Transactions } from '../db/transactions.js';
import { MailService } from '../mail/mail.service.js';
import { TokensRepository } from '../tokens/tokens.repository.js';
import { passwordResetMail } from '../mail/templates.js';
import { UsersRepository } from '../users/users.repository.js';
import { AccountsRepository } from './accounts.repository.js';
import { newOneTimeToken, sha256Hex } from './one-time-token.js';

export const RESET_MINUTES = 60;

/** Password reset by e-mail link, and change of password when signed in. */
@Injectable()
export class PasswordChangeService {
  /** Mails still being sent (the reset answer does not wait for them); tests and shutdown may await. */
  readonly pending = new Set<Promise<boolean>>();

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly repo: AccountsRepository,
    private readonly users: UsersRepository,
    private readonly hasher: PasswordHasher,
    private readonly mail: MailService,
    private readonly clock: Clock,
    private readonly tx: Transactions,
    private readonly auth: AuthService,
    private readonly tokens: TokensRepository,
  ) {}

  /**
   * Always the same answer. The mail is sent in the background, so the response time does not
   * reveal whether the address has an account either.
   */
  requestReset(req: PasswordResetRequest): { message: string } {
    const user = this.users.findByEmail(req.email);
    if (user && user.active) {
      const now = this.clock.now();
      const { token, hash } = newOneTimeToken();
      this.repo.insertReset({
        userId: user.id,
        tokenHash: hash,
        createdAt: now,
        expiresAt: now + RESET_MINUTES * 60_000,
      });
      const url = `${this.config.publicUrl.replace(/\/+$/, '')}/reset-password?token=${encodeURIComponent(token)}`;
      const m = passwordResetMail({ name: user.name, url, expiresInMinutes: RESET_MINUTES });
      const p = this.mail.sendInBackground({ to: user.email, subject: m.subject, text: m.text, html: m.html });
      this.pending.add(p);
      void p.finally(() => this.pending.delete(p));
    }
    return { message: PASSWORD_RESET_ACCEPTED };
  }

  /** A reset is the "I lost control" path: it also revokes every personal API token. */
  async confirmReset(req: PasswordResetConfirm): Promise<{ message: string } & TokensRevoked> {
    const check = () => {
      const reset = this.repo.resetByHash(sha256Hex(req.token));
      const field = (message: string) => new ValidationError(message, [{ path: 'token', message }]);
      if (!reset) throw field('This reset link is not valid; check that you copied the whole link');
      if (reset.usedAt !== null)
        throw field('This reset link has already been used; ask for a new one if you still need it');
      if (reset.expiresAt <= this.clock.now())
        throw field(`This reset link has expired (links last ${RESET_MINUTES} minutes); ask for a new one`);
      const user = this.users.findById(reset.userId);
      if (!user || !user.active) throw field('This reset link is not valid; check that you copied the whole link');
      return user;
    };
    check();
    const passwordHash = await this.hasher.hash(req.password);
    const tokensRevoked = this.tx.run(() => {
      const user = check();
      const now = this.clock.now();
      this.users.update(user.id, {
        passwordHash,
        failedLogins: 0,
        lockedUntil: null,
        updatedAt: now,
        sessionsValidAfter: now,
        sessionVersion: user.sessionVersion + 1,
      });
      this.repo.useResets(user.id, now);
      return this.tokens.revokeAllForUser(user.id, now);
    });
    return {
      message: `Your password has been changed${revokedWords(tokensRevoked)}; sign in with the new one`,
      tokensRevoked,
    };
  }

  /** Ends the user's other sessions and returns a fresh one for the caller. */
  async change(user: AuthUser, req: ChangePasswordRequest): Promise<PasswordChangedView> {
    if (user.via !== 'session')
      throw new ForbiddenError('Change your password when signed in with it, not with an API token');
    const row = this.users.findById(user.id);
    if (!row || !(await this.hasher.verify(req.current, row.passwordHash))) {
      throw new ValidationError('Invalid body: current: is not your current password', [
        { path: 'current', message: 'is not your current password' },
      ]);
    }
    const passwordHash = await this.hasher.hash(req.next);
    const now = this.clock.now();
    // Read and raise the session version in one synchronous transaction (no lost increment).
    const { updated, tokensRevoked } = this.tx.run(() => {
      const fresh = this.users.findById(user.id)!;
      const row = this.users.update(user.id, {
        passwordHash,
        updatedAt: now,
        sessionsValidAfter: now,
        sessionVersion: fresh.sessionVersion + 1,
      })!;
      return { updated: row, tokensRevoked: req.revokeTokens ? this.tokens.revokeAllForUser(user.id, now) : 0 };
    });
    return {
      message: `Your password has been changed; your other sessions have been signed out${revokedWords(tokensRevoked)}`,
      tokensRevoked,
      ...this.auth.issue(updated),
    };
  }
}

function revokedWords(n: number): string {
  if (n === 0) return '';
  return n === 1 ? ' and your 1 personal API token was revoked' : ` and your ${n} personal API tokens were revoked`;
}

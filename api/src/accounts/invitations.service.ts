import { Inject, Injectable, Logger } from '@nestjs/common';
import {
  ConflictError,
  NotFoundError,
  ValidationError,
  type AcceptInviteRequest,
  type Invitation,
  type InvitationRequest,
  type InvitationStatus,
  type LoginResponse,
  type PageOf,
  type PageQuery,
} from '@driftgrid/domain';
import { AuditService } from '../admin/audit.service.js';
import { AuthService } from '../auth/auth.service.js';
import type { AuthUser } from '../auth/current-user.js';
import { PasswordHasher } from '../auth/password-hasher.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { Transactions } from '../db/transactions.js';
import { MailService } from '../mail/mail.service.js';
import { invitationMail } from '../mail/templates.js';
import { UsersRepository } from '../users/users.repository.js';
import { AccountsRepository, type InvitationRow } from './accounts.repository.js';
import { newOneTimeToken, sha256Hex } from './one-time-token.js';

export const INVITATION_DAYS = 7;

export function invitationStatus(i: InvitationRow, now: number): InvitationStatus {
  if (i.acceptedAt !== null) return 'accepted';
  if (i.revokedAt !== null) return 'revoked';
  return i.expiresAt <= now ? 'expired' : 'pending';
}

@Injectable()
export class InvitationsService {
  private readonly logger = new Logger('Invitations');

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly repo: AccountsRepository,
    private readonly users: UsersRepository,
    private readonly hasher: PasswordHasher,
    private readonly auth: AuthService,
    private readonly mail: MailService,
    private readonly audit: AuditService,
    private readonly clock: Clock,
    private readonly tx: Transactions,
  ) {}

  private view(i: InvitationRow, by: Invitation['invitedBy'], now: number): Invitation {
    return {
      id: i.id,
      email: i.email,
      role: i.role,
      status: invitationStatus(i, now),
      invitedBy: by,
      createdAt: i.createdAt,
      expiresAt: i.expiresAt,
      acceptedAt: i.acceptedAt,
    };
  }

  /** A new invitation replaces the address's open ones; the mail carries the only copy of the token. */
  async invite(actor: AuthUser, req: InvitationRequest): Promise<Invitation> {
    if (this.users.findByEmail(req.email)) {
      throw new ConflictError(`${req.email} already has an account`, [
        { path: 'email', message: 'already has an account' },
      ]);
    }
    const now = this.clock.now();
    const { token, hash } = newOneTimeToken();
    const row = this.tx.run(() => {
      this.repo.revokeOpenInvitations(req.email, now);
      const r = this.repo.insertInvitation({
        email: req.email,
        role: req.role,
        tokenHash: hash,
        invitedBy: actor.id,
        createdAt: now,
        expiresAt: now + INVITATION_DAYS * 86_400_000,
      });
      this.audit.record(actor.id, 'invitation.create', `invitation:${r.id}`, { email: req.email, role: req.role });
      return r;
    });
    const url = `${this.config.publicUrl.replace(/\/+$/, '')}/accept-invite?token=${encodeURIComponent(token)}`;
    const m = invitationMail({ inviter: actor.name, role: req.role, url, expiresInDays: INVITATION_DAYS });
    let mailed = true;
    try {
      await this.mail.send({ to: req.email, subject: m.subject, text: m.text, html: m.html });
    } catch (err) {
      mailed = false;
      this.logger.error(`Invitation ${row.id} could not be mailed: ${(err as Error).message}`);
    }
    return { ...this.view(row, { id: actor.id, email: actor.email, name: actor.name }, now), mailed };
  }

  list(q: PageQuery): PageOf<Invitation> {
    const now = this.clock.now();
    const { items, total } = this.repo.listInvitations((q.page - 1) * q.pageSize, q.pageSize);
    return {
      items: items.map(({ inv, by }) => this.view(inv, by && by.id !== null ? by : null, now)),
      total,
      page: q.page,
      pageSize: q.pageSize,
    };
  }

  revoke(actor: AuthUser, id: number): Invitation {
    const now = this.clock.now();
    const inv = this.repo.invitationById(id);
    if (!inv) throw new NotFoundError(`No invitation with id ${id}`);
    const status = invitationStatus(inv, now);
    if (status === 'accepted')
      throw new ConflictError('This invitation has already been accepted; deactivate the user instead');
    if (status === 'pending') {
      this.repo.markInvitation(id, { revokedAt: now });
      this.audit.record(actor.id, 'invitation.revoke', `invitation:${id}`, { email: inv.email });
    }
    return this.view(this.repo.invitationById(id)!, null, now);
  }

  /** Checks a link's token; every failure is a 400 that says what to do next. */
  private usable(token: string): InvitationRow {
    const inv = this.repo.invitationByHash(sha256Hex(token));
    const field = (message: string) => new ValidationError(message, [{ path: 'token', message }]);
    if (!inv) throw field('This invitation link is not valid; check that you copied the whole link');
    const status = invitationStatus(inv, this.clock.now());
    if (status === 'accepted') throw field('This invitation link has already been used; sign in instead');
    if (status === 'revoked')
      throw field('This invitation was withdrawn or replaced by a newer one; use the latest e-mail or ask an admin');
    if (status === 'expired')
      throw field(`This invitation link has expired (links last ${INVITATION_DAYS} days); ask an admin for a new one`);
    return inv;
  }

  /** Creates the account, marks the invitation used and signs the new user in. */
  async accept(req: AcceptInviteRequest): Promise<LoginResponse> {
    this.usable(req.token);
    const passwordHash = await this.hasher.hash(req.password);
    // Re-check after the (asynchronous) hashing, inside one transaction: a token is used once.
    const user = this.tx.run(() => {
      const inv = this.usable(req.token);
      if (this.users.findByEmail(inv.email))
        throw new ConflictError(`${inv.email} already has an account; sign in instead`);
      const now = this.clock.now();
      const u = this.users.insert({
        email: inv.email,
        name: req.name,
        role: inv.role,
        passwordHash,
        active: true,
        createdAt: now,
        updatedAt: now,
      });
      this.repo.markInvitation(inv.id, { acceptedAt: now });
      this.audit.record(u.id, 'invitation.accept', `user:${u.id}`, {
        email: inv.email,
        role: inv.role,
        invitation: inv.id,
      });
      return u;
    });
    return this.auth.issue(user);
  }
}

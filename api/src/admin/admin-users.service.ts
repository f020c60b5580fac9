import { Injectable } from '@nestjs/common';
import {
  ConflictError,
  NotFoundError,
  type AdminUser,
  type AdminUserPatch,
  type AdminUsersQuery,
  type PageOf,
} from '@driftgrid/domain';
import { Clock } from '../common/clock.js';
import { Transactions } from '../db/transactions.js';
import { UsersRepository, type UserRow } from '../users/users.repository.js';
import { AuditService } from './audit.service.js';

export function toAdminUser(u: UserRow, now: number): AdminUser {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    active: u.active,
    locked: !!u.lockedUntil && u.lockedUntil > now,
    createdAt: u.createdAt,
    updatedAt: u.updatedAt,
  };
}

@Injectable()
export class AdminUsersService {
  constructor(
    private readonly users: UsersRepository,
    private readonly audit: AuditService,
    private readonly clock: Clock,
    private readonly tx: Transactions,
  ) {}

  list(q: AdminUsersQuery): PageOf<AdminUser> {
    const now = this.clock.now();
    const { items, total } = this.users.list({
      q: q.q || undefined,
      role: q.role,
      offset: (q.page - 1) * q.pageSize,
      limit: q.pageSize,
    });
    return { items: items.map((u) => toAdminUser(u, now)), total, page: q.page, pageSize: q.pageSize };
  }

  /**
   * Role, active flag and name. The last active admin can be neither demoted nor deactivated (409);
   * the check and the write share one synchronous transaction, so two admins demoting each other at
   * once cannot leave the server without one.
   */
  update(actorId: number, id: number, patch: AdminUserPatch): AdminUser {
    const updated = this.tx.run(() => {
      const user = this.users.findById(id);
      if (!user) throw new NotFoundError(`No user with id ${id}`);
      const losesAdmin =
        user.role === 'admin' &&
        user.active &&
        ((patch.role !== undefined && patch.role !== 'admin') || patch.active === false);
      if (losesAdmin && this.users.countActiveAdmins() <= 1) {
        const what = patch.active === false ? 'deactivated' : 'demoted';
        throw new ConflictError(
          `${user.email} is the last active admin and cannot be ${what}; make another user an admin first`,
          [
            {
              path: patch.active === false ? 'active' : 'role',
              message: 'the last active admin must stay an active admin',
            },
          ],
        );
      }
      const changes: Partial<UserRow> = {};
      if (patch.role !== undefined && patch.role !== user.role) changes.role = patch.role;
      if (patch.active !== undefined && patch.active !== user.active) changes.active = patch.active;
      if (patch.name !== undefined && patch.name !== user.name) changes.name = patch.name;
      if (Object.keys(changes).length === 0) return user;
      const now = this.clock.now();
      const changed = this.users.update(id, { ...changes, updatedAt: now })!;
      const before = Object.fromEntries(Object.keys(changes).map((k) => [k, user[k as keyof UserRow]]));
      this.audit.record(actorId, 'user.update', `user:${id}`, { email: user.email, before, after: changes });
      return changed;
    });
    return toAdminUser(updated, this.clock.now());
  }
}

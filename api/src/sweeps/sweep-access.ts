import { Injectable } from '@nestjs/common';
import { NotFoundError, ForbiddenError } from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { SweepsRepository, type SweepRow } from './sweeps.repository.js';

/**
 * Who may see a sweep: its owner, admins, everyone when it is archived or shared with the group,
 * and the users it is shared with. Anything else is a 404, so private work is not even confirmed.
 */
@Injectable()
export class SweepAccess {
  constructor(private readonly sweeps: SweepsRepository) {}

  canRead(user: AuthUser, s: SweepRow): boolean {
    if (user.role === 'admin' || s.ownerId === user.id) return true;
    if (s.status === 'archived' || s.visibility === 'group') return true;
    return this.sweeps.isSharedWith(s.id, user.id);
  }

  readable(user: AuthUser, id: number): SweepRow {
    const s = this.sweeps.findById(id);
    if (!s || !this.canRead(user, s)) throw new NotFoundError(`Sweep ${id} not found`);
    return s;
  }

  /** Owner or admin; readers who are neither get 403, others 404. */
  manageable(user: AuthUser, id: number): SweepRow {
    const s = this.readable(user, id);
    if (user.role !== 'admin' && s.ownerId !== user.id)
      throw new ForbiddenError('Only the owner or an admin may change this sweep');
    return s;
  }
}

import { Injectable, UnauthorizedException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import type { LoginRequest, LoginResponse, PublicUser } from '@driftgrid/domain';
import { Clock } from '../common/clock.js';
import { UsersRepository, type UserRow } from '../users/users.repository.js';
import { PasswordHasher } from './password-hasher.js';

export function toPublicUser(u: UserRow): PublicUser {
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}

/** After this many consecutive failures an account waits LOCK_MS before it may sign in again. */
const MAX_FAILURES = 8;
const LOCK_MS = 5 * 60_000;
const BAD_CREDENTIALS = 'Wrong e-mail or password, or the account is locked for a few minutes after repeated failures';

@Injectable()
export class AuthService {
  constructor(
    private readonly users: UsersRepository,
    private readonly hasher: PasswordHasher,
    private readonly jwt: JwtService,
    private readonly clock: Clock,
  ) {}

  async login(req: LoginRequest): Promise<LoginResponse> {
    const user = this.users.findByEmail(req.email);
    const ok = await this.hasher.verify(req.password, user?.passwordHash);
    const now = this.clock.now();
    // One message for unknown address, wrong password, inactive and locked: nothing reveals which.
    if (!user || !user.active || (user.lockedUntil && user.lockedUntil > now))
      throw new UnauthorizedException(BAD_CREDENTIALS);
    if (!ok) {
      const failed = user.failedLogins + 1;
      this.users.update(
        user.id,
        failed >= MAX_FAILURES ? { failedLogins: 0, lockedUntil: now + LOCK_MS } : { failedLogins: failed },
      );
      throw new UnauthorizedException(BAD_CREDENTIALS);
    }
    if (user.failedLogins || user.lockedUntil) this.users.update(user.id, { failedLogins: 0, lockedUntil: null });
    return this.issue(user);
  }

  issue(user: UserRow): LoginResponse {
    // `sv`: the session version; a password change or reset raises the user's, ending this session.
    const accessToken = this.jwt.sign({ sub: user.id, role: user.role, sv: user.sessionVersion });
    const decoded = this.jwt.decode(accessToken) as { exp: number };
    return { accessToken, expiresAt: decoded.exp * 1000, user: toPublicUser(user) };
  }
}

import { Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { UsersRepository } from '../users/users.repository.js';
import type { AuthUser } from './current-user.js';

interface JwtPayload {
  sub: number;
  role: string;
  iat?: number;
}

/** Sign-in sessions: a short-lived JWT; the user is re-read so deactivation and role changes apply at once. */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    @Inject(APP_CONFIG) config: AppConfig,
    private readonly users: UsersRepository,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      secretOrKey: config.jwtSecret,
      ignoreExpiration: false,
    });
  }

  validate(payload: JwtPayload): AuthUser {
    const user = this.users.findById(Number(payload.sub));
    if (!user || !user.active) throw new UnauthorizedException('Your session is no longer valid; sign in again');
    // A password change or reset ends every session issued before it.
    if (user.sessionsValidAfter && (payload.iat ?? 0) * 1000 < user.sessionsValidAfter) {
      throw new UnauthorizedException('Your password was changed; sign in again');
    }
    return { id: user.id, email: user.email, name: user.name, role: user.role, via: 'session', scope: 'read-write' };
  }
}

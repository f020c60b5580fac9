import { createSecretKey } from 'node:crypto';
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
  /** Session version at sign-in (absent in sessions issued before versions existed). */
  sv?: number;
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
      // A key object, not the string: given a string, jsonwebtoken first tries it as a PEM public key
      // and builds the secret key from it only after that throws, on every request (≈1 ms each).
      // passport-jwt hands it to jsonwebtoken.verify unchanged, which accepts a KeyObject; only
      // passport-jwt's own typings are narrower.
      secretOrKey: createSecretKey(Buffer.from(config.jwtSecret, 'utf8')) as unknown as Buffer,
      ignoreExpiration: false,
    });
  }

  validate(payload: JwtPayload): AuthUser {
    const user = this.users.findById(Number(payload.sub));
    if (!user || !user.active) throw new UnauthorizedException('Your session is no longer valid; sign in again');
    // A password change or reset ends every session issued before it. The version, not a time:
    // `iat` has whole seconds, so a time cut-off cannot separate sessions within one second.
    const stale =
      typeof payload.sv === 'number'
        ? payload.sv !== user.sessionVersion
        : user.sessionVersion > 0 ||
          (user.sessionsValidAfter !== null && (payload.iat ?? 0) * 1000 < user.sessionsValidAfter);
    if (stale) throw new UnauthorizedException('Your password was changed; sign in again');
    return { id: user.id, email: user.email, name: user.name, role: user.role, via: 'session', scope: 'read-write' };
  }
}

import { ExecutionContext, ForbiddenException, Injectable, UnauthorizedException } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import type { Request } from 'express';
import { ACCESS_KEY, WRITE_KEY, type Access } from './access.decorators.js';
import type { AuthUser } from './current-user.js';
import { API_TOKEN_PREFIX, TokenAuthenticator } from './token-authenticator.js';

/**
 * Global guard: a route is closed unless it declares who may call it (@Public, @Roles, @SignedIn).
 * Unauthenticated → 401; authenticated with the wrong role → 403.
 */
@Injectable()
export class AccessGuard extends AuthGuard('jwt') {
  constructor(
    private readonly reflector: Reflector,
    private readonly tokens: TokenAuthenticator,
  ) {
    super();
  }

  override async canActivate(context: ExecutionContext): Promise<boolean> {
    const access = this.reflector.getAllAndOverride<Access | undefined>(ACCESS_KEY, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (access?.kind === 'public') return true;
    const req = context.switchToHttp().getRequest<Request & { user?: AuthUser }>();
    const header = req.header('authorization') ?? '';
    const bearer = /^Bearer\s+(.+)$/i.exec(header)?.[1]?.trim();
    if (!bearer) throw new UnauthorizedException('Sign in first: this route needs a Bearer token');
    if (bearer.startsWith(API_TOKEN_PREFIX)) {
      const user = this.tokens.authenticate(bearer);
      if (!user) throw new UnauthorizedException('The API token is unknown, revoked or expired');
      req.user = user;
    } else {
      await (super.canActivate(context) as Promise<boolean>);
    }
    const user = req.user as AuthUser;
    if (!access) throw new ForbiddenException('This route is not open to any role');
    if (!access.roles.includes(user.role)) {
      throw new ForbiddenException(`This action needs the role ${access.roles.join(' or ')}; you are ${user.role}`);
    }
    const writes = this.reflector.getAllAndOverride<boolean | undefined>(WRITE_KEY, [
      context.getHandler(),
      context.getClass(),
    ]);
    const mutating = writes ?? !['GET', 'HEAD', 'OPTIONS'].includes(req.method);
    if (mutating && user.scope === 'read')
      throw new ForbiddenException('This API token has read scope; the action needs read-write');
    return true;
  }

  override handleRequest<TUser = AuthUser>(err: unknown, user: TUser | false): TUser {
    if (err || !user)
      throw err instanceof UnauthorizedException
        ? err
        : new UnauthorizedException('Your session has expired or is invalid; sign in again');
    return user;
  }
}

import { createParamDecorator, type ExecutionContext } from '@nestjs/common';
import type { RoleName } from '@driftgrid/domain';

/** The authenticated principal attached to the request by the access guard. */
export interface AuthUser {
  id: number;
  email: string;
  name: string;
  role: RoleName;
  /** 'session' for a sign-in JWT; 'token' for a personal API token. */
  via: 'session' | 'token';
  scope: 'read' | 'read-write';
}

export const CurrentUser = createParamDecorator((_: unknown, ctx: ExecutionContext): AuthUser => {
  return ctx.switchToHttp().getRequest<{ user: AuthUser }>().user;
});

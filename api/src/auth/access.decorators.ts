import { SetMetadata } from '@nestjs/common';
import { ROLE_NAMES, type RoleName } from '@driftgrid/domain';

export const ACCESS_KEY = 'driftgrid:access';

export type Access = { kind: 'public' } | { kind: 'roles'; roles: readonly RoleName[] };

/** Open to everyone, signed in or not. */
export const Public = () => SetMetadata(ACCESS_KEY, { kind: 'public' } satisfies Access);

/** Only these roles. A route without an access decorator is closed (403) for everyone. */
export const Roles = (...roles: RoleName[]) => SetMetadata(ACCESS_KEY, { kind: 'roles', roles } satisfies Access);

/** Any signed-in user: every role (the domain's list, so a new role is not shut out by a stale copy). */
export const SignedIn = () => Roles(...ROLE_NAMES);

/** Marks a route that changes state; read-scope API tokens may not call it. */
export const WRITE_KEY = 'driftgrid:writes';
export const Writes = () => SetMetadata(WRITE_KEY, true);

import { ROLE_NAMES } from '@driftgrid/domain';
import type { Role } from '../../auth/session.js';

/** The admin's labels of the quota limits, shared with the builder and the api's refusals. */
export { QUOTA_LABELS } from '@driftgrid/domain';

export const ROLES: readonly Role[] = ROLE_NAMES;

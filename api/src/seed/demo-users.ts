import type { Role } from '../db/schema.js';

/** Demo accounts (demo only; production refuses to seed them unless told to). */
export const DEMO_PASSWORD = 'driftgrid-demo';

export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'admin@example.com', name: 'Ada Admin', role: 'admin' },
  { email: 'researcher@example.com', name: 'Rosa Researcher', role: 'researcher' },
  { email: 'reviewer@example.com', name: 'Remy Reviewer', role: 'reviewer' },
];

import { z } from 'zod';

export const ROLE_NAMES = ['admin', 'researcher', 'reviewer'] as const;
export type RoleName = (typeof ROLE_NAMES)[number];

/**
 * Roles that create work: submit sweeps, run fits, upload datasets, export, and pick readers to share with.
 * Reviewers read and download only. The api's route guards and the ui's menus and buttons take this list.
 */
export const CREATOR_ROLES = ['admin', 'researcher'] as const satisfies readonly RoleName[];

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'at most 254 characters')
  .email('must be an e-mail address');

/** Passwords: 10–200 characters (length beats composition rules). */
export const passwordSchema = z.string().min(10, 'at least 10 characters').max(200, 'at most 200 characters');

export const loginRequestSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'required').max(200, 'at most 200 characters'),
});
export type LoginRequest = z.infer<typeof loginRequestSchema>;

export interface PublicUser {
  id: number;
  email: string;
  name: string;
  role: RoleName;
}

export interface LoginResponse {
  accessToken: string;
  expiresAt: number;
  user: PublicUser;
}

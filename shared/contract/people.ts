// Users, sign-in, invitations and API tokens.
import { z } from 'zod';
import { isoDate } from './common';

/** Roles in rising order: each includes everything the ones before it may do. */
export const ROLES = ['reviewer', 'engineer', 'admin'] as const;
export const role = z.enum(ROLES);
export type Role = z.infer<typeof role>;

/** POST /api/auth/login */
export const loginBody = z.strictObject({ email: z.email().max(254), password: z.string().min(1).max(200) });
/** PATCH /api/users/:id: at least one of the three. */
export const userPatchBody = z
  .strictObject({ name: z.string().trim().min(1).max(120), role, disabled: z.boolean() })
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'give at least one of name, role, disabled' });
/** POST /api/invitations */
export const invitationCreateBody = z.strictObject({ email: z.email().max(254), name: z.string().trim().max(120).optional(), role });
/** POST /api/invitations/accept: the mailed token, the new account's name and password. */
export const invitationAcceptBody = z.strictObject({
  token: z.string().min(10).max(200),
  name: z.string().trim().min(1).max(120),
  password: z.string().min(8, 'must be at least 8 characters').max(200),
});
/** POST /api/tokens */
export const tokenCreateBody = z.strictObject({ name: z.string().trim().min(1).max(80) });

/** A user as the API shows one (never the password hash). */
export const publicUser = z.object({ id: z.number().int(), email: z.string(), name: z.string(), role, disabled: z.boolean(), createdAt: isoDate });
export type PublicUser = z.infer<typeof publicUser>;

/** GET /api/users */
export const userListReply = z.object({ users: z.array(publicUser) });
/** PATCH /api/users/:id, POST /api/invitations/accept … */
export const userReply = z.object({ user: publicUser });

/** GET /api/auth/csrf */
export const csrfReply = z.object({ token: z.string() });
/** POST /api/auth/login: the session was regenerated, so the reply carries its new CSRF token. */
export const loginReply = z.object({ user: publicUser, csrfToken: z.string() });
/** GET /api/auth/me: who is signed in, and whether by the sign-in cookie or an API token. */
export const meReply = z.object({ user: publicUser, via: z.enum(['session', 'token']) });
export type MeReply = z.infer<typeof meReply>;
/** GET /api/auth/current: who is signed in, or null when nobody is (200 either way). */
export const currentReply = z.object({ user: publicUser.nullable() });
export type CurrentReply = z.infer<typeof currentReply>;

export const invitation = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string().nullable(),
  role,
  expiresAt: isoDate,
  usedAt: isoDate.nullable(),
  invitedById: z.number().int().nullable(),
  createdAt: isoDate,
});
export type Invitation = z.infer<typeof invitation>;
/** GET /api/invitations */
export const invitationListReply = z.object({ invitations: z.array(invitation) });
/** POST /api/invitations */
export const invitationReply = z.object({ invitation, mailed: z.boolean() });

export const apiToken = z.object({ id: z.number().int(), name: z.string(), prefix: z.string(), lastUsedAt: isoDate.nullable(), createdAt: isoDate });
export type ApiToken = z.infer<typeof apiToken>;
/** GET /api/tokens */
export const tokenListReply = z.object({ tokens: z.array(apiToken) });
/** POST /api/tokens: the secret is shown this once. */
export const tokenCreatedReply = apiToken.extend({ token: z.string() });

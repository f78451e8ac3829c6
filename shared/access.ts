/**
 * The contract of users and access: invitations, password reset and the people of an
 * organisation (server/routes/access.ts, hooks/use-access.ts).
 */
import { z } from 'zod';
import { ROLES, type Role } from './domain';
import { text, textProblem } from './text';

export const PASSWORD_MIN = 10;
export const INVITATION_DAYS = 7;
export const RESET_MINUTES = 60;

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  electrician: 'Electrician',
  inspector: 'Inspector',
  owner: 'Building owner',
};

const password = z
  .string()
  .min(PASSWORD_MIN, `use at least ${PASSWORD_MIN} characters`)
  .max(200, 'use at most 200 characters')
  .refine((p) => textProblem(p, false) === null, 'use letters, digits, spaces and symbols only');

export const inviteBody = z
  .object({
    email: z.email('enter an e-mail address').max(200),
    role: z.enum(ROLES, { error: 'choose a role' }),
    buildingIds: z.array(z.uuid()).max(500).default([]),
  })
  .refine((b) => b.role !== 'owner' || b.buildingIds.length > 0, {
    path: ['buildingIds'],
    message: 'grant at least one building to an owner',
  });
export type InviteBody = z.input<typeof inviteBody>;

export const acceptInvitationBody = z.object({
  name: text(120).min(1, 'enter your name'),
  password,
});
export type AcceptInvitationBody = z.infer<typeof acceptInvitationBody>;
/** An existing account confirms with its own password (not needed when signed in as it). */
export const existingAccountAcceptBody = z.object({ password: z.string().min(1, 'enter your password').max(200) });
/**
 * What `POST /api/invitations/:token/accept` takes: `{ name, password }` for a new account
 * (acceptInvitationBody), `{ password }` for an existing one, `{}` when signed in as it.
 */
export const acceptInvitationRequest = z.object({
  name: z.string().max(200).optional(),
  password: z.string().max(200).optional(),
});
export type AcceptInvitationRequest = z.infer<typeof acceptInvitationRequest>;

export const forgotPasswordBody = z.object({ email: z.email('enter an e-mail address').max(200) });
export type ForgotPasswordBody = z.infer<typeof forgotPasswordBody>;

export const resetPasswordBody = z.object({ password });
export type ResetPasswordBody = z.infer<typeof resetPasswordBody>;

export const roleChangeBody = z.object({ role: z.enum(ROLES, { error: 'choose a role' }) });

export const sendReportBody = z.object({
  /** one address of the organisation's owners; without it, every owner granted the building */
  to: z.email('enter an e-mail address').max(200).optional(),
});

/** What the one-time link's page shows before the form. */
export interface InvitationView {
  email: string;
  organisationName: string;
  role: Role;
  expiresAt: string;
  /** `existing`: the address has an account, which accepts with its own password */
  account: 'new' | 'existing';
}

export interface Person {
  userId: string;
  name: string;
  email: string;
  role: Role;
  /** the buildings granted (owners only) */
  buildingIds: string[];
}

export interface PendingInvitation {
  id: string;
  email: string;
  role: Role;
  buildingIds: string[];
  expiresAt: string;
  invitedBy: string;
}

export interface PeopleResponse {
  organisationId: string;
  people: Person[];
  invitations: PendingInvitation[];
  buildings: { id: string; name: string }[];
}

export interface InviteResponse {
  /** an invitation was e-mailed (the same answer whether or not the address has an account) */
  outcome: 'invited';
  message: string;
}

/** The same answer whether or not an account has that address. */
export const FORGOT_PASSWORD_ANSWER =
  'If an account uses that address, an e-mail with a link to choose a new password is on its way. The link works once, for one hour.';

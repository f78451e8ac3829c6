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

// ---------- answers (the client reads them through these schemas) ----------

const role = z.enum(ROLES);

/** What the one-time link's page shows before the form. */
export const invitationView = z.object({
  email: z.string(),
  organisationName: z.string(),
  role,
  expiresAt: z.string(),
  /** `existing`: the address has an account, which accepts with its own password */
  account: z.enum(['new', 'existing']),
});
export type InvitationView = z.infer<typeof invitationView>;

export const personSchema = z.object({
  userId: z.string(),
  name: z.string(),
  email: z.string(),
  role,
  /** the buildings granted (owners only) */
  buildingIds: z.array(z.string()),
});
export type Person = z.infer<typeof personSchema>;

export const pendingInvitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role,
  buildingIds: z.array(z.string()),
  expiresAt: z.string(),
  invitedBy: z.string(),
});
export type PendingInvitation = z.infer<typeof pendingInvitationSchema>;

export const peopleResponse = z.object({
  organisationId: z.string(),
  people: z.array(personSchema),
  invitations: z.array(pendingInvitationSchema),
  buildings: z.array(z.object({ id: z.string(), name: z.string() })),
});
export type PeopleResponse = z.infer<typeof peopleResponse>;

export const inviteResponse = z.object({
  /** an invitation was e-mailed (the same answer whether or not the address has an account) */
  outcome: z.literal('invited'),
  message: z.string(),
});
export type InviteResponse = z.infer<typeof inviteResponse>;

/** The answer to "forgot password" (the same whether or not an account has that address). */
export const forgotPasswordAnswer = z.object({ message: z.string() });

/** What a password-reset link's page shows before the form. */
export const passwordResetView = z.object({ email: z.string(), expiresAt: z.string() });

/** Who an inspection's report was sent to. */
export const sendReportAnswer = z.object({ sentTo: z.array(z.string()) });

/** The same answer whether or not an account has that address. */
export const FORGOT_PASSWORD_ANSWER =
  'If an account uses that address, an e-mail with a link to choose a new password is on its way. The link works once, for one hour.';

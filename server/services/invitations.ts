/**
 * Invitations to an organisation. Every invitation is an e-mailed one-time link (only its SHA-256
 * is stored), whether or not the address already has an account: the admin's answer, its status
 * and its work (one row written, one e-mail sent) are the same either way, so inviting does not
 * tell anyone whether an address is registered. Nothing changes for an existing account until it
 * accepts — signed in as itself, or on the link's page with its own password (never a new one).
 */
import bcrypt from 'bcryptjs';
import { In, IsNull, type DataSource, type EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import type { z } from 'zod';
import {
  acceptInvitationBody,
  INVITATION_DAYS,
  ROLE_LABELS,
  type AcceptInvitationRequest,
  type InvitationView,
  type InviteResponse,
  type inviteBody,
} from '../../shared/access';
import { fieldErrors } from '../../shared/schemas';
import type { Actor } from '../auth/access';
import { Building, Invitation, Membership, Organisation, User } from '../entities';
import { AppError, NotFoundError, ValidationError } from '../http/errors';
import { checkBuildings, grant, newToken, hashToken, requireOrgAdmin } from './access';
import { linkMessage, type Mailer } from './mail';

const BCRYPT_ROUNDS = 10;

/** Invite by e-mail: the same invitation, answer and e-mail whether or not the address has an account. */
export async function invite(
  ds: DataSource,
  mailer: Mailer,
  actor: Actor,
  organisationId: string,
  body: z.output<typeof inviteBody>,
): Promise<InviteResponse> {
  requireOrgAdmin(actor, organisationId, 'invite people');
  const email = body.email.toLowerCase();
  const buildingIds = body.role === 'owner' ? body.buildingIds : [];
  const organisation = await ds.manager.findOneByOrFail(Organisation, { id: organisationId });
  const inviter = await ds.manager.findOneByOrFail(User, { id: actor.userId });
  await checkBuildings(ds.manager, organisationId, buildingIds);

  // the organisation's own members are on the admin's people list already: saying so tells nothing new
  const member: { role: keyof typeof ROLE_LABELS }[] = await ds.query(
    `SELECT m.role FROM membership m JOIN app_user u ON u.id = m.user_id WHERE m.organisation_id = $1 AND u.email = $2`,
    [organisationId, email],
  );
  if (member.length) {
    const role = ROLE_LABELS[member[0].role].toLowerCase();
    throw new AppError(409, 'already_member', `${email} is already in ${organisation.name} as ${role}.`, {
      email: `already in this organisation as ${role}`,
    });
  }

  const { token, hash } = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);
  await ds.transaction(async (em) => {
    // a new invitation replaces any earlier one to the same address
    await em.query(
      `UPDATE invitation SET expires_at = least(expires_at, now()) WHERE organisation_id = $1 AND email = $2 AND used_at IS NULL`,
      [organisationId, email],
    );
    await em.insert(Invitation, {
      id: uuidv7(),
      organisationId,
      email,
      role: body.role,
      buildingIds,
      invitedBy: actor.userId,
      tokenHash: hash,
      expiresAt,
    });
  });
  // one wording for everyone: the link's page says what to do for a new or an existing account
  const { text, html } = linkMessage(
    [
      `${inviter.name} invited you to ${organisation.name} on Ampwright as ${ROLE_LABELS[body.role].toLowerCase()}.`,
      'Open the link to accept. If you already use Ampwright with this address, you confirm with your password; otherwise you choose your name and a password.',
    ],
    { label: 'Accept the invitation', url: mailer.link(`/invitation/${token}`) },
    `The link works once and expires in ${INVITATION_DAYS} days. If you did not expect it, ignore this e-mail: nothing changes unless you accept.`,
  );
  await mailer.send({ to: email, subject: `Invitation to ${organisation.name} on Ampwright`, text, html });
  return { outcome: 'invited', message: `Invitation sent to ${email}. The link works for ${INVITATION_DAYS} days.` };
}

export async function cancelInvitation(em: EntityManager, actor: Actor, organisationId: string, id: string) {
  requireOrgAdmin(actor, organisationId, 'cancel invitations');
  const [, count] = await em.query(
    `UPDATE invitation SET expires_at = least(expires_at, now()) WHERE id = $1 AND organisation_id = $2 AND used_at IS NULL`,
    [id, organisationId],
  );
  if (!count) throw new NotFoundError('Invitation');
}

/** The invitation behind a link: 404 unknown, 410 `used` / `expired` with a plain message. */
async function liveInvitation(em: EntityManager, token: string, lock = false): Promise<Invitation> {
  const invitation = await em.findOne(Invitation, {
    where: { tokenHash: hashToken(token) },
    lock: lock ? { mode: 'pessimistic_write' } : undefined,
  });
  if (!invitation) throw new AppError(404, 'not_found', 'This invitation link is not valid. Check that the whole link was copied.');
  if (invitation.usedAt) throw new AppError(410, 'used', 'This invitation has already been used. Sign in to see the organisation.');
  if (invitation.expiresAt.getTime() <= Date.now()) {
    throw new AppError(410, 'expired', 'This invitation has expired. Ask your admin to send a new one.');
  }
  return invitation;
}

/** What the link's page shows; only the holder of the e-mailed link learns whether the account exists. */
export async function viewInvitation(em: EntityManager, token: string): Promise<InvitationView> {
  const invitation = await liveInvitation(em, token);
  const organisation = await em.findOneByOrFail(Organisation, { id: invitation.organisationId });
  const existing = await em.exists(User, { where: { email: invitation.email } });
  return {
    email: invitation.email,
    organisationName: organisation.name,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString(),
    account: existing ? 'existing' : 'new',
  };
}

async function join(em: EntityManager, invitation: Invitation, userId: string): Promise<void> {
  const member = await em.exists(Membership, { where: { userId, organisationId: invitation.organisationId } });
  if (!member) {
    await em.insert(Membership, { id: uuidv7(), userId, organisationId: invitation.organisationId, role: invitation.role });
  }
  if (invitation.role === 'owner' && invitation.buildingIds.length) {
    const live = await em.find(Building, {
      where: { id: In(invitation.buildingIds), organisationId: invitation.organisationId, deletedAt: IsNull() },
    });
    await grant(em, userId, live.map((b) => b.id));
  }
  await em.update(Invitation, { id: invitation.id }, { usedAt: new Date() });
}

/**
 * Accepts an invitation; answers the id of the account to sign in as. An existing account
 * accepts when the request is signed in as it, or with its own password (400 naming `password`
 * otherwise); a new address gets an account with the name and password given.
 */
export async function acceptInvitation(
  ds: DataSource,
  token: string,
  body: AcceptInvitationRequest,
  signedInAs: string | undefined,
): Promise<string> {
  const peek = await liveInvitation(ds.manager, token);
  // the hash is not selected by default (server/entities/user.ts)
  const existing = await ds.manager
    .createQueryBuilder(User, 'u')
    .addSelect('u.passwordHash')
    .where('u.email = :email', { email: peek.email })
    .getOne();
  if (existing) {
    if (existing.id !== signedInAs) {
      if (!body.password) throw new ValidationError({ password: `enter the password of ${peek.email}` });
      if (!(await bcrypt.compare(body.password, existing.passwordHash))) {
        throw new ValidationError({ password: `this is not the password of ${peek.email}` });
      }
    }
    return ds.transaction(async (em) => {
      await join(em, await liveInvitation(em, token, true), existing.id);
      return existing.id;
    });
  }
  const parsed = acceptInvitationBody.safeParse(body);
  if (!parsed.success) throw new ValidationError(fieldErrors(parsed.error));
  const passwordHash = await bcrypt.hash(parsed.data.password, BCRYPT_ROUNDS);
  return ds.transaction(async (em) => {
    const invitation = await liveInvitation(em, token, true);
    if (await em.findOneBy(User, { email: invitation.email })) {
      // the address got an account since the page was opened: accept as that account instead
      throw new AppError(409, 'account_exists', 'An account with this e-mail now exists. Open the link again to accept with its password.');
    }
    const userId = uuidv7();
    await em.insert(User, { id: userId, email: invitation.email, name: parsed.data.name, passwordHash });
    await join(em, invitation, userId);
    return userId;
  });
}

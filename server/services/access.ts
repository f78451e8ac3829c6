/**
 * Users and access: the people of an organisation, invitations, password reset and sending an
 * inspection report to the building's owners. Only admins manage people. One-time tokens are
 * 32 random bytes (base64url) e-mailed once; only their SHA-256 is stored.
 */
import crypto from 'node:crypto';
import bcrypt from 'bcryptjs';
import { In, IsNull, type DataSource, type EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import {
  INVITATION_DAYS,
  RESET_MINUTES,
  ROLE_LABELS,
  type AcceptInvitationBody,
  type InvitationView,
  type InviteResponse,
  type PeopleResponse,
} from '../../shared/access';
import type { Role } from '../../shared/domain';
import type { z } from 'zod';
import type { inviteBody } from '../../shared/access';
import { roleForBuilding, type Actor } from '../auth/access';
import { Building, Inspection, Invitation, Membership, OneTimeToken, Organisation, OwnerGrant, User } from '../entities';
import { AppError, ForbiddenError, NotFoundError } from '../http/errors';
import { logger } from '../logger';
import { linkMessage, type Mailer } from './mail';

const BCRYPT_ROUNDS = 10;

export function newToken(): { token: string; hash: string } {
  const token = crypto.randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return crypto.createHash('sha256').update(token).digest('hex');
}

/** 404 for an organisation the actor is not in, 403 for a member who is not an admin. */
function requireOrgAdmin(actor: Actor, organisationId: string, what: string): void {
  const role = actor.roles.get(organisationId);
  if (!role) throw new NotFoundError('Organisation');
  if (role !== 'admin') throw new ForbiddenError(`Only an admin can ${what}`);
}

export async function listPeople(em: EntityManager, actor: Actor, organisationId: string): Promise<PeopleResponse> {
  requireOrgAdmin(actor, organisationId, 'see who has access');
  const people: { userId: string; name: string; email: string; role: Role; buildingIds: string[] | null }[] = await em.query(
    `SELECT u.id AS "userId", u.name, u.email, m.role,
            (SELECT array_agg(g.building_id::text ORDER BY b.name) FROM owner_grant g JOIN building b ON b.id = g.building_id
              WHERE g.user_id = u.id AND b.organisation_id = m.organisation_id AND b.deleted_at IS NULL) AS "buildingIds"
       FROM membership m JOIN app_user u ON u.id = m.user_id
      WHERE m.organisation_id = $1
      ORDER BY u.name, u.email`,
    [organisationId],
  );
  const invitations = await em.find(Invitation, {
    where: { organisationId, usedAt: IsNull() },
    order: { createdAt: 'DESC' },
  });
  const buildings = await em.find(Building, {
    where: { organisationId, deletedAt: IsNull() },
    order: { name: 'ASC' },
  });
  const now = Date.now();
  return {
    organisationId,
    people: people.map((p) => ({ ...p, buildingIds: p.role === 'owner' ? (p.buildingIds ?? []) : [] })),
    invitations: invitations
      .filter((i) => i.expiresAt.getTime() > now)
      .map((i) => ({
        id: i.id,
        email: i.email,
        role: i.role,
        buildingIds: i.buildingIds,
        expiresAt: i.expiresAt.toISOString(),
        invitedBy: i.invitedBy,
      })),
    buildings: buildings.map((b) => ({ id: b.id, name: b.name })),
  };
}

async function checkBuildings(em: EntityManager, organisationId: string, ids: readonly string[]): Promise<void> {
  if (!ids.length) return;
  const found = await em.count(Building, { where: { id: In([...new Set(ids)]), organisationId, deletedAt: IsNull() } });
  if (found !== new Set(ids).size) {
    throw new AppError(400, 'invalid', 'Some fields need attention', { buildingIds: 'a building is not in this organisation' });
  }
}

async function grant(em: EntityManager, userId: string, buildingIds: readonly string[]): Promise<void> {
  for (const buildingId of new Set(buildingIds)) {
    await em.query(
      `INSERT INTO owner_grant (id, user_id, building_id) VALUES ($1, $2, $3)
       ON CONFLICT (user_id, building_id) DO NOTHING`,
      [uuidv7(), userId, buildingId],
    );
  }
}

/** Invite by e-mail; an address that already has an account gets the membership at once. */
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

  const existing = await ds.manager.findOneBy(User, { email });
  if (existing) {
    const membership = await ds.manager.findOneBy(Membership, { userId: existing.id, organisationId });
    if (membership) {
      throw new AppError(409, 'already_member', `${email} is already in ${organisation.name} as ${ROLE_LABELS[membership.role].toLowerCase()}.`, {
        email: `already in this organisation as ${ROLE_LABELS[membership.role].toLowerCase()}`,
      });
    }
    await ds.transaction(async (em) => {
      await em.insert(Membership, { id: uuidv7(), userId: existing.id, organisationId, role: body.role });
      await grant(em, existing.id, buildingIds);
    });
    const { text, html } = linkMessage(
      [
        `${inviter.name} added you to ${organisation.name} on Ampwright as ${ROLE_LABELS[body.role].toLowerCase()}.`,
        'Sign in with your usual password to see it.',
      ],
      { label: 'Open Ampwright', url: mailer.link('/') },
      'You already had an account, so no new password is needed.',
    );
    await mailer.send({ to: email, subject: `You now have access to ${organisation.name}`, text, html }).catch((e) => {
      logger.warn({ err: e }, 'membership notice not sent');
    });
    return {
      outcome: 'membership_added',
      message: `${email} already had an account: they are now in ${organisation.name} as ${ROLE_LABELS[body.role].toLowerCase()}. We told them by e-mail.`,
    };
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
  const { text, html } = linkMessage(
    [
      `${inviter.name} invited you to ${organisation.name} on Ampwright as ${ROLE_LABELS[body.role].toLowerCase()}.`,
      'Open the link to choose your name and password.',
    ],
    { label: 'Accept the invitation', url: mailer.link(`/invitation/${token}`) },
    `The link works once and expires in ${INVITATION_DAYS} days. If you did not expect it, ignore this e-mail.`,
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
  if (invitation.usedAt) throw new AppError(410, 'used', 'This invitation has already been used. Sign in with the password you chose.');
  if (invitation.expiresAt.getTime() <= Date.now()) {
    throw new AppError(410, 'expired', 'This invitation has expired. Ask your admin to send a new one.');
  }
  return invitation;
}

export async function viewInvitation(em: EntityManager, token: string): Promise<InvitationView> {
  const invitation = await liveInvitation(em, token);
  const organisation = await em.findOneByOrFail(Organisation, { id: invitation.organisationId });
  return {
    email: invitation.email,
    organisationName: organisation.name,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString(),
  };
}

/** Creates the account, its membership and grants; answers the new user's id. */
export async function acceptInvitation(ds: DataSource, token: string, body: AcceptInvitationBody): Promise<string> {
  const passwordHash = await bcrypt.hash(body.password, BCRYPT_ROUNDS);
  return ds.transaction(async (em) => {
    const invitation = await liveInvitation(em, token, true);
    if (await em.findOneBy(User, { email: invitation.email })) {
      throw new AppError(409, 'account_exists', 'An account with this e-mail already exists. Sign in, and ask your admin to add you.');
    }
    const userId = uuidv7();
    await em.insert(User, { id: userId, email: invitation.email, name: body.name, passwordHash });
    await em.insert(Membership, { id: uuidv7(), userId, organisationId: invitation.organisationId, role: invitation.role });
    if (invitation.role === 'owner' && invitation.buildingIds.length) {
      const live = await em.find(Building, {
        where: { id: In(invitation.buildingIds), organisationId: invitation.organisationId, deletedAt: IsNull() },
      });
      await grant(em, userId, live.map((b) => b.id));
    }
    await em.update(Invitation, { id: invitation.id }, { usedAt: new Date() });
    return userId;
  });
}

/** Lock the organisation's memberships so "not the last admin" holds under concurrent changes. */
async function lockedMemberships(em: EntityManager, organisationId: string): Promise<Membership[]> {
  return em.find(Membership, { where: { organisationId }, lock: { mode: 'pessimistic_write' } });
}

function refuseLastAdmin(memberships: Membership[], target: Membership): void {
  const admins = memberships.filter((m) => m.role === 'admin');
  if (target.role === 'admin' && admins.length === 1) {
    throw new AppError(409, 'last_admin', 'This is the only admin. Make someone else an admin first.');
  }
}

async function dropGrants(em: EntityManager, userId: string, organisationId: string): Promise<void> {
  await em.query(
    `DELETE FROM owner_grant g USING building b WHERE g.building_id = b.id AND g.user_id = $1 AND b.organisation_id = $2`,
    [userId, organisationId],
  );
}

export async function changeRole(ds: DataSource, actor: Actor, organisationId: string, userId: string, role: Role) {
  requireOrgAdmin(actor, organisationId, 'change roles');
  await ds.transaction(async (em) => {
    const memberships = await lockedMemberships(em, organisationId);
    const target = memberships.find((m) => m.userId === userId);
    if (!target) throw new NotFoundError('Person');
    if (target.role === role) return;
    if (role !== 'admin') refuseLastAdmin(memberships, target);
    // an owner's grants mean nothing in another role; a new owner starts with none
    if (target.role === 'owner' || role === 'owner') await dropGrants(em, userId, organisationId);
    await em.update(Membership, { id: target.id }, { role });
  });
}

export async function removePerson(ds: DataSource, actor: Actor, organisationId: string, userId: string) {
  requireOrgAdmin(actor, organisationId, 'remove people');
  if (userId === actor.userId) {
    throw new AppError(409, 'self', 'You cannot remove yourself. Another admin can.');
  }
  await ds.transaction(async (em) => {
    const memberships = await lockedMemberships(em, organisationId);
    const target = memberships.find((m) => m.userId === userId);
    if (!target) throw new NotFoundError('Person');
    refuseLastAdmin(memberships, target);
    await dropGrants(em, userId, organisationId);
    await em.delete(Membership, { id: target.id });
  });
}

async function ownerAndBuilding(em: EntityManager, actor: Actor, organisationId: string, userId: string, buildingId: string) {
  requireOrgAdmin(actor, organisationId, 'grant buildings');
  const membership = await em.findOneBy(Membership, { userId, organisationId });
  if (!membership) throw new NotFoundError('Person');
  if (membership.role !== 'owner') {
    throw new AppError(409, 'not_owner', 'Only building owners are granted single buildings; other roles see them all.');
  }
  const building = await em.findOneBy(Building, { id: buildingId, organisationId, deletedAt: IsNull() });
  if (!building) throw new NotFoundError('Building');
}

export async function grantBuilding(em: EntityManager, actor: Actor, organisationId: string, userId: string, buildingId: string) {
  await ownerAndBuilding(em, actor, organisationId, userId, buildingId);
  await grant(em, userId, [buildingId]);
}

/** The owner's next pull answers the building in `revoked` and their device drops its copy. */
export async function revokeBuilding(em: EntityManager, actor: Actor, organisationId: string, userId: string, buildingId: string) {
  await ownerAndBuilding(em, actor, organisationId, userId, buildingId);
  await em.delete(OwnerGrant, { userId, buildingId });
}

// ---------- password reset ----------

/**
 * Runs after the answer is sent, so the caller learns nothing from the timing either: an unknown
 * address simply ends here without an e-mail.
 */
export async function requestPasswordReset(ds: DataSource, mailer: Mailer, email: string): Promise<void> {
  const user = await ds.manager.findOneBy(User, { email: email.toLowerCase() });
  if (!user) return;
  const { token, hash } = newToken();
  await ds.transaction(async (em) => {
    // only the newest link works
    await em.query(`UPDATE one_time_token SET used_at = now() WHERE user_id = $1 AND used_at IS NULL`, [user.id]);
    await em.insert(OneTimeToken, {
      id: uuidv7(),
      userId: user.id,
      purpose: 'password_reset',
      tokenHash: hash,
      expiresAt: new Date(Date.now() + RESET_MINUTES * 60 * 1000),
    });
  });
  const { text, html } = linkMessage(
    [`Someone asked to choose a new password for ${user.email} on Ampwright.`, 'Open the link to choose it.'],
    { label: 'Choose a new password', url: mailer.link(`/reset-password/${token}`) },
    `The link works once and expires in ${RESET_MINUTES} minutes. If it was not you, ignore this e-mail: your password stays as it is.`,
  );
  await mailer.send({ to: user.email, subject: 'Choose a new Ampwright password', text, html });
}

async function liveResetToken(em: EntityManager, token: string, lock = false): Promise<OneTimeToken> {
  const row = await em.findOne(OneTimeToken, {
    where: { tokenHash: hashToken(token), purpose: 'password_reset' },
    lock: lock ? { mode: 'pessimistic_write' } : undefined,
  });
  if (!row) throw new AppError(404, 'not_found', 'This link is not valid. Check that the whole link was copied, or ask for a new one.');
  if (row.usedAt) throw new AppError(410, 'used', 'This link has already been used. Ask for a new one if you still need it.');
  if (row.expiresAt.getTime() <= Date.now()) throw new AppError(410, 'expired', 'This link has expired. Ask for a new one.');
  return row;
}

export async function viewPasswordReset(em: EntityManager, token: string): Promise<{ email: string; expiresAt: string }> {
  const row = await liveResetToken(em, token);
  const user = await em.findOneByOrFail(User, { id: row.userId });
  return { email: user.email, expiresAt: row.expiresAt.toISOString() };
}

/** Sets the new password, uses the link and signs the account out everywhere; answers the user id. */
export async function resetPassword(ds: DataSource, token: string, password: string): Promise<string> {
  const passwordHash = await bcrypt.hash(password, BCRYPT_ROUNDS);
  return ds.transaction(async (em) => {
    const row = await liveResetToken(em, token, true);
    await em.update(User, { id: row.userId }, { passwordHash });
    await em.query(`UPDATE one_time_token SET used_at = now() WHERE user_id = $1 AND used_at IS NULL`, [row.userId]);
    await em.query(`DELETE FROM session WHERE sess->>'userId' = $1`, [row.userId]);
    return row.userId;
  });
}

// ---------- send a report ----------

export type ReportPdf = (
  ds: DataSource,
  store: unknown,
  actor: Actor,
  inspectionId: string,
) => Promise<{ filename: string; pdf: Buffer }>;

/** E-mails the inspection report to the owners granted its building (or one named owner). */
export async function sendReport(
  ds: DataSource,
  mailer: Mailer,
  makePdf: ReportPdf,
  store: unknown,
  actor: Actor,
  inspectionId: string,
  to: string | undefined,
): Promise<{ sentTo: string[] }> {
  const inspection = await ds.manager.findOneBy(Inspection, { id: inspectionId, deletedAt: IsNull() });
  if (!inspection) throw new NotFoundError('Inspection');
  const building = await ds.manager.findOneBy(Building, { id: inspection.buildingId, deletedAt: IsNull() });
  const role = building ? roleForBuilding(actor, building) : null;
  if (!building || !role) throw new NotFoundError('Inspection');
  if (role !== 'admin' && role !== 'inspector') throw new ForbiddenError('Only an admin or an inspector can send a report');

  let recipients: string[];
  if (to) {
    const [row] = await ds.query(
      `SELECT u.email FROM app_user u JOIN membership m ON m.user_id = u.id
        WHERE m.organisation_id = $1 AND m.role = 'owner' AND u.email = $2`,
      [building.organisationId, to.toLowerCase()],
    );
    if (!row) {
      throw new AppError(400, 'invalid', 'Some fields need attention', { to: 'not a building owner of this organisation' });
    }
    recipients = [row.email];
  } else {
    const rows: { email: string }[] = await ds.query(
      `SELECT u.email FROM owner_grant g JOIN app_user u ON u.id = g.user_id
         JOIN membership m ON m.user_id = u.id AND m.organisation_id = $1 AND m.role = 'owner'
        WHERE g.building_id = $2 ORDER BY u.email`,
      [building.organisationId, building.id],
    );
    recipients = rows.map((r) => r.email);
    if (!recipients.length) {
      throw new AppError(409, 'no_owner', 'No owner has access to this building yet. Grant one under Users and access, or name an address.');
    }
  }
  const { filename, pdf } = await makePdf(ds, store, actor, inspectionId);
  const sender = await ds.manager.findOneByOrFail(User, { id: actor.userId });
  const when = inspection.performedOn;
  const { text, html } = linkMessage(
    [
      `${sender.name} sent you the inspection report for ${building.name} (${when}).`,
      'The report is attached as a PDF. Open deficiencies and their priorities are also in the app.',
    ],
    { label: 'Open the building', url: mailer.link(`/buildings/${building.id}`) },
    'Sent from Ampwright.',
  );
  await mailer.send({
    to: recipients,
    subject: `Inspection report: ${building.name}, ${when}`,
    text,
    html,
    attachments: [{ filename, content: pdf, contentType: 'application/pdf' }],
  });
  return { sentTo: recipients };
}

/**
 * Users and access: the people of an organisation, password reset and sending an inspection
 * report to the building's owners (invitations: ./invitations.ts). Only admins manage people. One-time tokens are
 * 32 random bytes (base64url) e-mailed once; only their SHA-256 is stored.
 */
import crypto from 'node:crypto';
import bcrypt from 'bcryptjs';
import { In, IsNull, type DataSource, type EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { RESET_MINUTES, type PeopleResponse } from '../../shared/access';
import type { Role } from '../../shared/domain';
import { can } from '../../shared/permissions';
import { roleForBuilding, type Actor } from '../auth/access';
import { Building, Inspection, Invitation, Membership, OneTimeToken, OwnerGrant, User } from '../entities';
import { AppError, ForbiddenError, NotFoundError } from '../http/errors';
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
export function requireOrgAdmin(actor: Actor, organisationId: string, what: string): void {
  const role = actor.roles.get(organisationId);
  if (!role) throw new NotFoundError('Organisation');
  if (!can(role, 'people.manage')) throw new ForbiddenError(`Only an admin can ${what}`);
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

export async function checkBuildings(em: EntityManager, organisationId: string, ids: readonly string[]): Promise<void> {
  if (!ids.length) return;
  const found = await em.count(Building, { where: { id: In([...new Set(ids)]), organisationId, deletedAt: IsNull() } });
  if (found !== new Set(ids).size) {
    throw new AppError(400, 'invalid', 'Some fields need attention', { buildingIds: 'a building is not in this organisation' });
  }
}

export async function grant(em: EntityManager, userId: string, buildingIds: readonly string[]): Promise<void> {
  for (const buildingId of new Set(buildingIds)) {
    await em.query(
      `INSERT INTO owner_grant (id, user_id, building_id) VALUES ($1, $2, $3)
       ON CONFLICT (user_id, building_id) DO NOTHING`,
      [uuidv7(), userId, buildingId],
    );
  }
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
  if (!can(role, 'report.send')) throw new ForbiddenError('Only an admin or an inspector can send a report');

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

import bcrypt from 'bcryptjs';
import { Router, type Request } from 'express';
import type { DataSource } from 'typeorm';
import { signInBody, type MeResponse, type SessionResponse } from '../../shared/schemas';
import { Membership, Organisation, User } from '../entities';
import type { Role } from '../../shared/domain';
import { DEFAULT_SETTINGS, type OrganisationSettings } from '../../shared/records';
import { AppError, UnauthorisedError } from '../http/errors';
import { handle } from '../http/handle';
import { signInLimiters, type LimitConfig } from '../http/rate-limits';
import { logger } from '../logger';

// compared against when the e-mail is unknown, so both failures take the same time
const NO_SUCH_USER_HASH = bcrypt.hashSync('no such user', 10);

async function describeUser(ds: DataSource, userId: string): Promise<MeResponse> {
  const user = await ds.manager.findOne(User, { where: { id: userId } });
  if (!user) throw new UnauthorisedError();
  const memberships = await ds.manager
    .createQueryBuilder(Membership, 'm')
    .innerJoin(Organisation, 'o', 'o.id = m.organisation_id')
    .select([
      'm.organisation_id AS "organisationId"',
      'o.name AS "organisationName"',
      'm.role AS role',
      'o.settings AS settings',
    ])
    .where('m.user_id = :userId', { userId })
    .orderBy('o.name')
    .getRawMany<Omit<MeResponse['memberships'][number], 'people'> & { settings: Partial<OrganisationSettings> }>();
  const orgIds = memberships.map((m) => m.organisationId);
  // the people of each organisation, so a deficiency can be assigned on a device with no signal
  const people: { organisationId: string; id: string; name: string; role: Role }[] = orgIds.length
    ? await ds.query(
        `SELECT m.organisation_id AS "organisationId", u.id, u.name, m.role
           FROM membership m JOIN app_user u ON u.id = m.user_id
          WHERE m.organisation_id = ANY($1::uuid[]) ORDER BY u.name`,
        [orgIds],
      )
    : [];
  return {
    user: { id: user.id, email: user.email, name: user.name },
    memberships: memberships.map((m) => ({
      ...m,
      settings: { ...DEFAULT_SETTINGS, ...m.settings, dueDays: { ...DEFAULT_SETTINGS.dueDays, ...m.settings?.dueDays } },
      people: people.filter((p) => p.organisationId === m.organisationId).map(({ id, name, role }) => ({ id, name, role })),
    })),
  };
}

function regenerate(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.regenerate((e) => (e ? reject(e) : resolve())));
}

export function authRouter(ds: DataSource, limits: LimitConfig): Router {
  const router = Router();

  router.post(
    '/sign-in',
    ...signInLimiters(limits),
    handle({ body: signInBody }, async ({ body }, req) => {
      const user = await ds.manager
        .createQueryBuilder(User, 'u')
        .addSelect('u.passwordHash')
        .where('u.email = :email', { email: body.email.toLowerCase() })
        .getOne();
      const ok = await bcrypt.compare(body.password, user?.passwordHash ?? NO_SUCH_USER_HASH);
      if (!user || !ok) throw new AppError(401, 'bad_credentials', 'That e-mail and password do not match');
      await regenerate(req);
      req.session.userId = user.id;
      if (req.session.cookie.secure === true && !req.secure) {
        // express-session then sends no cookie at all: the user would seem signed in, then not
        logger.warn(
          { reqId: req.id },
          'a Secure session cookie cannot be set over plain http: behind a TLS proxy set TRUST_PROXY=1; on plain http set COOKIE_SECURE=0',
        );
      }
      return describeUser(ds, user.id);
    }),
  );

  router.post(
    '/sign-out',
    handle({}, async (_input, req, res) => {
      await new Promise<void>((resolve, reject) => req.session.destroy((e) => (e ? reject(e) : resolve())));
      res.clearCookie('ampwright.sid');
      return { ok: true };
    }),
  );

  return router;
}

export function meRouter(ds: DataSource): Router {
  const router = Router();
  // who is signed in: "nobody" is an answer, not an error — the app asks on every cold load, and a
  // 401 there would be a failed request in the browser's console before anyone signed in
  router.get(
    '/me',
    handle({}, async (_input, req): Promise<SessionResponse> => {
      const userId = req.session?.userId;
      if (!userId) return { user: null };
      try {
        return await describeUser(ds, userId);
      } catch (error) {
        if (error instanceof UnauthorisedError) return { user: null };
        throw error;
      }
    }),
  );
  return router;
}

import type { EntityManager } from 'typeorm';
import { can } from '../../shared/permissions';
import type { OrganisationSettings } from '../../shared/records';
import type { Actor } from '../auth/access';
import { Organisation } from '../entities';
import { ForbiddenError, NotFoundError } from '../http/errors';

/** The organisation's settings (due days, photo location): changed by its admin only. */
export async function patchSettings(
  em: EntityManager,
  actor: Actor,
  organisationId: string,
  body: Partial<OrganisationSettings>,
): Promise<{ settings: Partial<OrganisationSettings> }> {
  const role = actor.roles.get(organisationId);
  if (!role) throw new NotFoundError('Organisation');
  if (!can(role, 'settings.edit')) throw new ForbiddenError('Only an admin changes the organisation\u2019s settings');
  const org = await em.findOneByOrFail(Organisation, { id: organisationId });
  org.settings = { ...org.settings, ...body };
  await em.save(Organisation, org);
  return { settings: org.settings };
}

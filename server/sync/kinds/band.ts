import { In, type EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { can } from '../../../shared/permissions';
import type { Band, BandCreateBody, BandPatchBody } from '../../../shared/records';
import type { Actor } from '../../auth/access';
import { CurveBand } from '../../entities';
import { ForbiddenError, NotFoundError } from '../../http/errors';
import { live } from '../access';

/**
 * Kind `band`: a time-current band of the organisation's library (trip tests are judged against
 * it). Not a synced row of a building: written through REST by the organisation's field workers
 * (shared/permissions.ts `band.edit`), read by every member; another organisation's band is not
 * found.
 */
export const bandSpec = { entity: CurveBand, noun: 'Band', write: 'band.edit' } as const;

function bandDto(b: CurveBand): Band {
  return {
    id: b.id,
    organisationId: b.organisationId,
    label: b.label,
    ratingA: b.ratingA,
    source: b.source,
    points: b.points,
    instantaneousMultiple: b.instantaneousMultiple,
    instantaneousTolerancePct: b.instantaneousTolerancePct,
    updatedAt: b.updatedAt.toISOString(),
  };
}

/** The organisation a band is written to: the one named, or the actor's only one that may. */
function bandOrganisation(actor: Actor, requested?: string): string {
  const editable = [...actor.roles].filter(([, role]) => can(role, bandSpec.write)).map(([id]) => id);
  const id = requested ?? (editable.length === 1 ? editable[0] : undefined);
  if (!id || !editable.includes(id)) throw new ForbiddenError('Only admins, electricians and inspectors keep the band library');
  return id;
}

async function ownBand(em: EntityManager, actor: Actor, id: string): Promise<CurveBand> {
  const band = await em.findOne(CurveBand, { where: { id, ...live } });
  if (!band || !actor.roles.has(band.organisationId)) throw new NotFoundError(bandSpec.noun);
  bandOrganisation(actor, band.organisationId);
  return band;
}

export async function listBands(em: EntityManager, actor: Actor): Promise<{ bands: Band[] }> {
  const orgs = [...actor.roles.keys()];
  const bands = orgs.length
    ? await em.find(CurveBand, { where: { organisationId: In(orgs), ...live }, order: { label: 'ASC' } })
    : [];
  return { bands: bands.map(bandDto) };
}

export async function createBand(
  em: EntityManager,
  actor: Actor,
  body: BandCreateBody & { organisationId?: string },
): Promise<{ band: Band }> {
  const { id, organisationId, ...fields } = body;
  const band = em.create(CurveBand, {
    ...fields,
    id: id ?? uuidv7(),
    organisationId: bandOrganisation(actor, organisationId),
    updatedAt: new Date(),
    deletedAt: null,
  });
  await em.insert(CurveBand, band);
  return { band: bandDto(band) };
}

export async function patchBand(em: EntityManager, actor: Actor, id: string, body: BandPatchBody): Promise<{ band: Band }> {
  const band = await ownBand(em, actor, id);
  Object.assign(band, body, { updatedAt: new Date() });
  await em.save(CurveBand, band);
  return { band: bandDto(band) };
}

export async function deleteBand(em: EntityManager, actor: Actor, id: string): Promise<{ ok: true }> {
  const band = await ownBand(em, actor, id);
  await em.update(CurveBand, { id: band.id }, { deletedAt: new Date(), updatedAt: new Date() });
  return { ok: true };
}

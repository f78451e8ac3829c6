/**
 * What a condition-record row may link to (record.ts and its kinds): rows of the same building,
 * bands and people of the building's own organisation, never another organisation's; and the
 * sign-off freeze, which covers an inspection, its readings and the readings' photos.
 */
import type { Role } from '../../../shared/domain';
import { Circuit, CurveBand, Deficiency, Inspection, Membership, Panel, Reading, User } from '../../entities';
import { AppError, ValidationError } from '../../http/errors';
import { live } from '../access';
import type { WriteContext } from '../context';

/** What a kind's rules see of one write. */
export interface Ctx {
  w: WriteContext;
  building: { id: string; organisationId: string };
  role: Role;
  version: number;
  /** lookups already made in this run of writes (a run of 500 patches asks once) */
  memo: Map<string, Promise<unknown>>;
}

/** Ask once per run: the answer of an earlier write of the run, or a new lookup. */
export function remember<T>(c: Ctx, key: string, lookup: () => Promise<T>): Promise<T> {
  const known = c.memo.get(key);
  if (known) return known as Promise<T>;
  const asked = lookup();
  c.memo.set(key, asked);
  return asked;
}

export function userName(c: Ctx, id: string): Promise<string> {
  return remember(c, `user:${id}`, async () => (await c.w.em.findOne(User, { where: { id } }))?.name ?? '');
}

export async function panelOf(c: Ctx, id: string, field = 'panelId'): Promise<Panel> {
  const panel = await c.w.em.findOne(Panel, { where: { id, buildingId: c.building.id, ...live } });
  if (!panel) throw new ValidationError({ [field]: 'no such panel in this building' });
  return panel;
}

export async function circuitOf(c: Ctx, id: string, panelId: string | null, field = 'circuitId'): Promise<Circuit> {
  const circuit = await c.w.em.findOne(Circuit, { where: { id, buildingId: c.building.id, ...live } });
  if (!circuit || (panelId && circuit.panelId !== panelId)) {
    throw new ValidationError({ [field]: panelId ? 'no such circuit in this panel' : 'no such circuit in this building' });
  }
  return circuit;
}

export async function bandOf(c: Ctx, id: string): Promise<void> {
  const band = await c.w.em.findOne(CurveBand, {
    where: { id, organisationId: c.building.organisationId, ...live },
  });
  if (!band) throw new ValidationError({ bandId: 'no such band in your library' });
}

/** A deficiency is assigned to someone of the building's organisation only. */
export async function assigneeOf(c: Ctx, userId: string): Promise<void> {
  const member = await c.w.em.exists(Membership, { where: { userId, organisationId: c.building.organisationId } });
  if (!member) throw new ValidationError({ assigneeId: 'not a person of this organisation' });
}

export function frozen(): AppError {
  return new AppError(409, 'signed', 'This inspection is signed and frozen: record a new inspection for later changes');
}

export async function openInspection(c: Ctx, id: string): Promise<Inspection> {
  // a run of writes holds the building's lock, and a signature is its own mutation name, so an
  // inspection looked up once stays as it was for the rest of the run
  const inspection = await remember(c, `inspection:${id}`, () =>
    c.w.em.findOne(Inspection, { where: { id, buildingId: c.building.id, ...live } }),
  );
  if (!inspection) throw new ValidationError({ inspectionId: 'no such inspection in this building' });
  if (inspection.signedAt) throw frozen();
  return inspection;
}

/**
 * A photo's parent: a live reading, deficiency, circuit or panel of this building. A reading's photos are part of
 * its inspection's record, so a signed inspection freezes them (409 `signed`) like the reading;
 * a deficiency's photos are evidence of its repair and stay open after the sign-off.
 */
export async function photoParent(c: Ctx, parentKind: string, parentId: string): Promise<void> {
  if (parentKind === 'reading') {
    const reading = await c.w.em.findOne(Reading, { where: { id: parentId, buildingId: c.building.id, ...live } });
    if (!reading) throw new ValidationError({ parentId: 'no such reading in this building' });
    await openInspection(c, reading.inspectionId);
    return;
  }
  const table = parentKind === 'circuit' ? Circuit : parentKind === 'panel' ? Panel : Deficiency;
  const found = await c.w.em.exists(table, { where: { id: parentId, buildingId: c.building.id, ...live } });
  if (!found) throw new ValidationError({ parentId: `no such ${parentKind} in this building` });
}

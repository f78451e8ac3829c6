import { IsNull, type EntityManager, type EntityTarget } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { checkDeficiencyChange, checkDeficiencyRaise, dueOnFor, todayISO } from '../../shared/deficiency';
import type { Role } from '../../shared/domain';
import {
  DEFAULT_SETTINGS,
  readingRuleErrors,
  type CommentCreateBody,
  type DeficiencyFields,
  type OrganisationSettings,
  type ReadingFields,
} from '../../shared/records';
import type { ConflictEntity } from '../../shared/sync';
import { Deficiency, DeficiencyEntry, Inspection, Organisation, Photo, Reading, TripEvent, User } from '../entities';
import type { SyncColumns } from '../entities/sync-columns';
import { AppError, ForbiddenError, NotFoundError, ValidationError } from '../http/errors';
import { updateRows } from './bulk';
import { assigneeOf, bandOf, circuitOf, type Ctx, frozen, openInspection, panelOf, photoParent } from './record-links';
import {
  commitMerge,
  editedAfterDelete,
  insertConflicts,
  lockAndReload,
  planMerge,
  refuseDuplicateId,
  tombstone,
  writableBuilding,
  type ConflictDraft,
  type Target,
  type WriteContext,
} from './register';

/**
 * The condition record's service: inspections, readings, deficiencies (with their history and
 * comments), recorded trips and photo rows. They arrive through the sync push, in the same
 * transaction, savepoints and building locks as the register, and merge per field under the same
 * last-writer-wins rule (register.planMerge / commitMerge). Each kind states who may write it and
 * what it must link to; the generic create / patch / delete below do the rest.
 */

type RecordRow = SyncColumns & { buildingId: string };
type Fields = Record<string, unknown>;

interface Spec<E extends RecordRow> {
  kind: ConflictEntity;
  entity: EntityTarget<E>;
  noun: string;
  /** roles that may create, patch and delete rows of this kind */
  writers: readonly Role[];
  /** check a new row's links; returns the columns the server sets (who, derived values) */
  create(c: Ctx, fields: Fields): Promise<Partial<E>>;
  /** the patch to merge (a kind may add derived fields); refuse it by throwing */
  preparePatch?(c: Ctx, row: E, patch: Fields): Promise<Fields>;
  /** check the row as it would be stored after the patch; `applied` are the fields that win */
  checkPatch?(c: Ctx, row: E, candidate: E, applied: string[]): Promise<void>;
  /** may this row be changed or deleted at all (a signed inspection is frozen) */
  checkChangeable?(c: Ctx, row: E): Promise<void>;
  /** after a create (`before` null) or a patch that changed something */
  after?(c: Ctx, row: E, before: E | null, applied: string[]): Promise<void>;
}

const live = { deletedAt: IsNull() };
const FIELD_WORKERS: readonly Role[] = ['admin', 'electrician', 'inspector'];

function requireRole(role: Role, allowed: readonly Role[], what: string): void {
  if (!allowed.includes(role)) throw new ForbiddenError(`${role[0].toUpperCase()}${role.slice(1)}s cannot ${what}`);
}

async function userName(em: EntityManager, id: string): Promise<string> {
  const user = await em.findOne(User, { where: { id } });
  return user?.name ?? '';
}

export async function organisationSettings(em: EntityManager, organisationId: string): Promise<OrganisationSettings> {
  const org = await em.findOne(Organisation, { where: { id: organisationId } });
  const stored = org?.settings ?? {};
  return { ...DEFAULT_SETTINGS, ...stored, dueDays: { ...DEFAULT_SETTINGS.dueDays, ...stored.dueDays } };
}

// ---------- the kinds ----------

const inspections: Spec<Inspection> = {
  kind: 'inspection',
  entity: Inspection,
  noun: 'Inspection',
  writers: FIELD_WORKERS,
  async create(c, fields) {
    for (const id of fields.panelIds as string[]) await panelOf(c, id, 'panelIds');
    return { inspectorId: c.w.actor.userId, inspectorName: await userName(c.w.em, c.w.actor.userId) };
  },
  async checkChangeable(_c, row) {
    if (row.signedAt) throw frozen();
  },
  async checkPatch(c, _row, candidate, applied) {
    if (applied.includes('panelIds')) for (const id of candidate.panelIds) await panelOf(c, id, 'panelIds');
  },
};

const readings: Spec<Reading> = {
  kind: 'reading',
  entity: Reading,
  noun: 'Reading',
  writers: FIELD_WORKERS,
  async create(c, fields) {
    const f = fields as unknown as ReadingFields;
    const inspection = await openInspection(c, f.inspectionId);
    if (!inspection.panelIds.includes(f.panelId)) {
      throw new ValidationError({ panelId: 'this panel is not in the inspection' });
    }
    if (f.circuitId) await circuitOf(c, f.circuitId, f.panelId);
    if (f.bandId) await bandOf(c, f.bandId);
    return {};
  },
  async checkChangeable(c, row) {
    await openInspection(c, row.inspectionId);
  },
  async checkPatch(c, _row, candidate, applied) {
    const problems = readingRuleErrors(candidate as unknown as ReadingFields);
    if (Object.keys(problems).length > 0) throw new ValidationError(problems);
    if (applied.includes('circuitId') && candidate.circuitId) await circuitOf(c, candidate.circuitId, candidate.panelId);
    if (applied.includes('bandId') && candidate.bandId) await bandOf(c, candidate.bandId);
  },
};

async function repairPhotos(em: EntityManager, deficiencyId: string): Promise<number> {
  return em.count(Photo, { where: { parentId: deficiencyId, purpose: 'repair', ...live } });
}

/** One history line per write: which fields went from what to what. */
async function recordChange(c: Ctx, row: Deficiency, before: Deficiency | null, applied: string[]) {
  const changes: Record<string, [unknown, unknown]> = {};
  const was = (before ?? {}) as unknown as Fields;
  const now = row as unknown as Fields;
  for (const f of applied) {
    if (f === 'deletedAt') continue;
    if (before && was[f] === now[f]) continue;
    changes[f] = [before ? (was[f] ?? null) : null, now[f] ?? null];
  }
  if (Object.keys(changes).length === 0) return;
  await insertEntry(c, row.id, {
    kind: 'change',
    text: before ? '' : 'raised',
    changes,
  });
}

async function insertEntry(
  c: Ctx,
  deficiencyId: string,
  entry: { id?: string; kind: DeficiencyEntry['kind']; text: string; changes: DeficiencyEntry['changes'] },
) {
  const { w } = c;
  const row = w.em.create(DeficiencyEntry, {
    id: entry.id ?? uuidv7(),
    buildingId: c.building.id,
    deficiencyId,
    kind: entry.kind,
    text: entry.text,
    changes: entry.changes,
    userId: w.actor.userId,
    userName: await userName(w.em, w.actor.userId),
    at: new Date(),
    updatedAt: w.hlc,
    updatedBy: w.actor.userId,
    deletedAt: null,
    version: String(c.version),
    fieldMeta: {},
  });
  await w.em.insert(DeficiencyEntry, row as never);
}

const deficiencies: Spec<Deficiency> = {
  kind: 'deficiency',
  entity: Deficiency,
  noun: 'Deficiency',
  writers: ['admin', 'electrician', 'inspector', 'owner'],
  async create(c, fields) {
    const refused = checkDeficiencyRaise(c.role);
    if (refused) throw new ForbiddenError(refused);
    const f = fields as unknown as DeficiencyFields & { dueOn?: string };
    if (f.panelId) await panelOf(c, f.panelId);
    if (f.circuitId) await circuitOf(c, f.circuitId, f.panelId);
    if (f.inspectionId) {
      const found = await c.w.em.exists(Inspection, { where: { id: f.inspectionId, buildingId: c.building.id } });
      if (!found) throw new ValidationError({ inspectionId: 'no such inspection in this building' });
    }
    if (f.readingId) {
      const found = await c.w.em.exists(Reading, { where: { id: f.readingId, buildingId: c.building.id } });
      if (!found) throw new ValidationError({ readingId: 'no such reading in this building' });
    }
    if (f.assigneeId) await assigneeOf(c, f.assigneeId);
    const extra: Partial<Deficiency> = {
      raisedBy: c.w.actor.userId,
      raisedByName: await userName(c.w.em, c.w.actor.userId),
    };
    if (!f.dueOn) {
      const settings = await organisationSettings(c.w.em, c.building.organisationId);
      extra.dueOn = dueOnFor(f.priority, todayISO(), settings.dueDays);
    }
    return extra;
  },
  async preparePatch(c, _row, patch) {
    // a new priority without a new due date moves the due date with it
    if (patch.priority !== undefined && patch.dueOn === undefined) {
      const settings = await organisationSettings(c.w.em, c.building.organisationId);
      return { ...patch, dueOn: dueOnFor(patch.priority as DeficiencyFields['priority'], todayISO(), settings.dueDays) };
    }
    return patch;
  },
  async checkPatch(c, row, candidate, applied) {
    const check = checkDeficiencyChange({
      role: c.role,
      before: row as unknown as DeficiencyFields,
      after: candidate as unknown as DeficiencyFields,
      changed: applied,
      repairPhotos: await repairPhotos(c.w.em, row.id),
    });
    if (check.forbidden) throw new ForbiddenError(check.forbidden);
    if (Object.keys(check.fields).length > 0) throw new ValidationError(check.fields);
    if (applied.includes('circuitId') && candidate.circuitId) await circuitOf(c, candidate.circuitId, candidate.panelId);
    if (applied.includes('assigneeId') && candidate.assigneeId) await assigneeOf(c, candidate.assigneeId);
  },
  after: recordChange,
};

const trips: Spec<TripEvent> = {
  kind: 'trip',
  entity: TripEvent,
  noun: 'Trip',
  writers: FIELD_WORKERS,
  async create(c, fields) {
    await circuitOf(c, fields.circuitId as string, fields.panelId as string);
    return {};
  },
};

const photos: Spec<Photo> = {
  kind: 'photo',
  entity: Photo,
  noun: 'Photo',
  writers: FIELD_WORKERS,
  async create(c, fields) {
    const { parentKind, parentId, purpose } = fields as { parentKind: string; parentId: string; purpose: string };
    await photoParent(c, parentKind, parentId);
    const fits = parentKind === 'reading' ? ['thermal', 'visible'] : ['finding', 'repair'];
    if (!fits.includes(purpose)) {
      throw new ValidationError({ purpose: `a ${parentKind} photo is ${fits.join(' or ')}` });
    }
    return { uploaded: false };
  },
  async checkChangeable(c, row) {
    // the caption and the row itself freeze with a signed inspection's reading
    if (row.parentKind === 'reading') {
      const reading = await c.w.em.findOne(Reading, { where: { id: row.parentId } });
      const inspection = reading && (await c.w.em.findOne(Inspection, { where: { id: reading.inspectionId } }));
      if (inspection?.signedAt) throw frozen();
    }
  },
};

// ---------- generic writes ----------

async function createRecord<E extends RecordRow>(spec: Spec<E>, w: WriteContext, id: string, body: Fields) {
  if (!w.sync) throw new Error('condition records are written through the sync push');
  const { building, role } = await writableBuilding(w, w.sync.buildingId, 'Building');
  if (building.deletedAt) throw new AppError(409, 'parent_deleted', 'The building was deleted; restore it first');
  requireRole(role, spec.writers, `record a ${spec.noun.toLowerCase()}`);
  const version = await w.versions.of(building.id);
  const c: Ctx = { w, building, role, version };
  await refuseDuplicateId(w.em, spec.entity as EntityTarget<SyncColumns>, id);
  const { id: _id, ...fields } = body;
  const extra = await spec.create(c, fields);
  const row = w.em.create(spec.entity, { id, buildingId: building.id, fieldMeta: {}, ...extra } as never) as E;
  commitMerge(row, planMerge(row, fields, w, version), w, version, null);
  await w.em.insert(spec.entity, row as never);
  await spec.after?.(c, row, null, Object.keys(fields));
}

async function loadForWrite<E extends RecordRow>(spec: Spec<E>, w: WriteContext, id: string) {
  const found = await w.em.findOne(spec.entity, { where: { id } as never });
  if (!found) throw new NotFoundError(spec.noun);
  const { building, role } = await writableBuilding(w, found.buildingId, spec.noun);
  const { version, row } = await lockAndReload(w, building.id, found, async () =>
    (await w.em.findOne(spec.entity, { where: { id } as never }))!,
  );
  return { row, c: { w, building, role, version } satisfies Ctx };
}

async function patchRecord<E extends RecordRow>(spec: Spec<E>, w: WriteContext, id: string, body: Fields) {
  const { row, c } = await loadForWrite(spec, w, id);
  requireRole(c.role, spec.writers, `change a ${spec.noun.toLowerCase()}`);
  const target: Target = { entity: spec.kind, buildingId: row.buildingId };
  const drafts: ConflictDraft[] = [];
  if (row.deletedAt) {
    drafts.push(editedAfterDelete(row, body, w, target));
  } else {
    await spec.checkChangeable?.(c, row);
    const patch = spec.preparePatch ? await spec.preparePatch(c, row, body) : body;
    const plan = planMerge(row, patch, w, c.version);
    if (plan.applied.length > 0) await spec.checkPatch?.(c, row, plan.candidate, plan.applied);
    const before = { ...row };
    drafts.push(...commitMerge(row, plan, w, c.version, target));
    await updateRows(w.em, spec.entity, [row]);
    if (plan.applied.length > 0) await spec.after?.(c, row, before, plan.applied);
  }
  await insertConflicts(w.em, drafts);
}

async function deleteRecord<E extends RecordRow>(spec: Spec<E>, w: WriteContext, id: string) {
  const { row, c } = await loadForWrite(spec, w, id);
  // a deficiency is deleted only when raised by mistake: the raisers' call
  const deleters = spec.kind === 'deficiency' ? (['admin', 'inspector'] as const) : spec.writers;
  requireRole(c.role, deleters, `delete a ${spec.noun.toLowerCase()}`);
  if (row.deletedAt) return;
  await spec.checkChangeable?.(c, row);
  const drafts: ConflictDraft[] = [];
  const deleted = tombstone(row, w, c.version, { entity: spec.kind, buildingId: row.buildingId }, drafts);
  await updateRows(w.em, spec.entity, [row]);
  if (deleted && spec.kind === 'inspection') {
    // an inspection's readings go with it
    const children = await w.em.find(Reading, { where: { inspectionId: id, ...live } });
    for (const child of children) tombstone(child, w, c.version, { entity: 'reading', buildingId: row.buildingId }, drafts);
    await updateRows(w.em, Reading, children);
  }
  await insertConflicts(w.em, drafts);
}

/** The inspector's sign-off: the inspection and its readings are frozen from now on. */
async function signInspection(w: WriteContext, id: string) {
  const { row, c } = await loadForWrite(inspections, w, id);
  requireRole(c.role, ['admin', 'inspector'], 'sign an inspection');
  if (row.deletedAt) throw new NotFoundError('Inspection');
  if (row.signedAt) return;
  const sign = { signedAt: new Date(), signedBy: w.actor.userId, signedByName: await userName(w.em, w.actor.userId) };
  commitMerge(row, planMerge(row, sign, w, c.version), w, c.version, null);
  await updateRows(w.em, Inspection, [row]);
}

async function addComment(w: WriteContext, id: string, body: CommentCreateBody) {
  if (!w.sync) throw new Error('comments are written through the sync push');
  const { building, role } = await writableBuilding(w, w.sync.buildingId, 'Building');
  const deficiency = await w.em.findOne(Deficiency, { where: { id: body.deficiencyId, buildingId: building.id } });
  if (!deficiency) throw new ValidationError({ deficiencyId: 'no such deficiency in this building' });
  const version = await w.versions.of(building.id);
  await refuseDuplicateId(w.em, DeficiencyEntry, id);
  await insertEntry({ w, building, role, version }, deficiency.id, { id, kind: 'comment', text: body.text, changes: {} });
}

const SPECS = { inspection: inspections, reading: readings, deficiency: deficiencies, trip: trips, photo: photos };
export type RecordKind = keyof typeof SPECS;
export const RECORD_KINDS = Object.keys(SPECS) as RecordKind[];

/** Apply one condition-record mutation (`kind.verb`); false when the name is not one of ours. */
export async function applyRecordMutation(
  w: WriteContext,
  name: string,
  entityId: string,
  fields: Fields,
): Promise<boolean> {
  if (name === 'comment.create') {
    await addComment(w, entityId, fields as CommentCreateBody);
    return true;
  }
  if (name === 'inspection.sign') {
    await signInspection(w, entityId);
    return true;
  }
  const [kind, verb] = name.split('.') as [RecordKind, string];
  const spec = SPECS[kind] as Spec<RecordRow> | undefined;
  if (!spec) return false;
  if (verb === 'create') await createRecord(spec, w, entityId, { ...fields, id: entityId });
  else if (verb === 'patch') await patchRecord(spec, w, entityId, fields);
  else if (verb === 'delete') await deleteRecord(spec, w, entityId);
  else return false;
  return true;
}

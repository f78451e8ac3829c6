import { uuidv7 } from 'uuidv7';
import { checkDeficiencyChange, checkDeficiencyRaise, dueOnFor, todayISO } from '../../../shared/deficiency';
import { DEFAULT_SETTINGS, type DeficiencyFields, type OrganisationSettings } from '../../../shared/records';
import type { MutationFields } from '../../../shared/sync';
import { Deficiency, DeficiencyEntry, Inspection, Organisation, Photo, Reading } from '../../entities';
import { ForbiddenError, ValidationError } from '../../http/errors';
import { live } from '../access';
import { assigneeOf, circuitOf, panelOf, remember, userName, type Ctx } from './links';
import { createRecord, deleteRecord, patchRecord, planRecordPatches, type RecordCtx, type RecordSpec } from './record';
import type { MutationHandlers, PatchPlanners } from './types';

/**
 * Kind `deficiency`: a problem found, through its workflow (shared/deficiency.ts: open →
 * scheduled → repaired → verified, or deferred by the owner). Every role that sees the building
 * may change one, but each changed field needs its own action (shared/permissions.ts). Every
 * write adds one history line (deficiency_entry) saying which fields went from what to what.
 */

export function organisationSettings(c: Ctx): Promise<OrganisationSettings> {
  return remember(c, `settings:${c.building.organisationId}`, async () => {
    const org = await c.w.em.findOne(Organisation, { where: { id: c.building.organisationId } });
    const stored = org?.settings ?? {};
    return { ...DEFAULT_SETTINGS, ...stored, dueDays: { ...DEFAULT_SETTINGS.dueDays, ...stored.dueDays } };
  });
}

/** A history line of a deficiency, added with the write's other rows. */
export async function addEntry(
  c: RecordCtx,
  deficiencyId: string,
  entry: { id?: string; kind: DeficiencyEntry['kind']; text: string; changes: DeficiencyEntry['changes'] },
): Promise<void> {
  const { w } = c;
  c.pending.add(
    DeficiencyEntry,
    Object.assign(new DeficiencyEntry(), {
      id: entry.id ?? uuidv7(),
      buildingId: c.building.id,
      deficiencyId,
      kind: entry.kind,
      text: entry.text,
      changes: entry.changes,
      userId: w.actor.userId,
      userName: await userName(c, w.actor.userId),
      at: new Date(),
      updatedAt: w.hlc,
      updatedBy: w.actor.userId,
      deletedAt: null,
      version: String(c.version),
      fieldMeta: {},
    }),
  );
}

/** One history line per write: which fields went from what to what. */
async function recordChange(c: RecordCtx, row: Deficiency, before: Deficiency | null, applied: string[]) {
  const changes: Record<string, [unknown, unknown]> = {};
  for (const f of applied) {
    if (f === 'deletedAt') continue;
    const was: unknown = before ? Reflect.get(before, f) : undefined;
    const now: unknown = Reflect.get(row, f);
    if (before && was === now) continue;
    changes[f] = [before ? (was ?? null) : null, now ?? null];
  }
  if (Object.keys(changes).length === 0) return;
  await addEntry(c, row.id, { kind: 'change', text: before ? '' : 'raised', changes });
}

/** The deficiency's fields as the workflow judges them. */
function fieldsOf(d: Deficiency): DeficiencyFields {
  const { panelId, circuitId, inspectionId, readingId, source, check, title, description, priority } = d;
  const { priorityReason, dueOn, status, assigneeId, repairNote, deferReason, reviewOn, acceptedAt } = d;
  return {
    panelId, circuitId, inspectionId, readingId, source, check, title, description, priority,
    priorityReason, dueOn, status, assigneeId, repairNote, deferReason, reviewOn, acceptedAt,
  };
}

export const deficiencySpec: RecordSpec<Deficiency, MutationFields<'deficiency.create'>, MutationFields<'deficiency.patch'>> = {
  kind: 'deficiency',
  entity: Deficiency,
  noun: 'Deficiency',
  write: 'deficiency.write',
  remove: 'deficiency.delete',
  async create(c, f) {
    const refused = checkDeficiencyRaise(c.role);
    if (refused) throw new ForbiddenError(refused);
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
    const extra: Partial<Deficiency> = { raisedBy: c.w.actor.userId, raisedByName: await userName(c, c.w.actor.userId) };
    if (!f.dueOn) extra.dueOn = dueOnFor(f.priority, todayISO(), (await organisationSettings(c)).dueDays);
    return extra;
  },
  async preparePatch(c, _row, patch) {
    // a new priority without a new due date moves the due date with it
    if (patch.priority !== undefined && patch.dueOn === undefined) {
      return { ...patch, dueOn: dueOnFor(patch.priority, todayISO(), (await organisationSettings(c)).dueDays) };
    }
    return patch;
  },
  async checkPatch(c, row, candidate, applied) {
    // the repair photos count only where a repair is marked without a note (checkDeficiencyChange)
    const repairing = applied.includes('status') && candidate.status === 'repaired' && row.status !== 'repaired';
    const check = checkDeficiencyChange({
      role: c.role,
      before: fieldsOf(row),
      after: fieldsOf(candidate),
      changed: applied,
      repairPhotos: repairing
        ? await c.w.em.count(Photo, { where: { parentId: row.id, purpose: 'repair', ...live } })
        : 0,
    });
    if (check.forbidden) throw new ForbiddenError(check.forbidden);
    if (Object.keys(check.fields).length > 0) throw new ValidationError(check.fields);
    if (applied.includes('circuitId') && candidate.circuitId) await circuitOf(c, candidate.circuitId, candidate.panelId);
    if (applied.includes('assigneeId') && candidate.assigneeId) await assigneeOf(c, candidate.assigneeId);
  },
  after: recordChange,
};

export const deficiencyMutations = {
  'deficiency.create': (w, m, fields) => createRecord(deficiencySpec, w, m.entityId, fields),
  'deficiency.patch': (w, m, fields) => patchRecord(deficiencySpec, w, m.entityId, fields),
  'deficiency.delete': (w, m) => deleteRecord(deficiencySpec, w, m.entityId),
} satisfies Partial<MutationHandlers>;

export const deficiencyPlanners = {
  'deficiency.patch': (items) => planRecordPatches(deficiencySpec, items),
} satisfies PatchPlanners;

import type { EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { panelLayout } from '../../../shared/calc';
import { completeGroups } from '../../../shared/merge';
import { PANEL_RULE_FIELDS, panelRuleErrors, type PanelCreateBody, type PanelPatchBody } from '../../../shared/schemas';
import { requireScheduleEditor } from '../../auth/access';
import { Circuit, Panel } from '../../entities';
import { AppError, NotFoundError, ValidationError } from '../../http/errors';
import { updateRows } from '../../services/bulk';
import { panelDto } from '../../services/serialise';
import { live, lockAndReload, parentDeleted, visibleBuilding, writableBuilding } from '../access';
import { editedAfterDelete, insertConflicts, type ConflictDraft, type Target } from '../conflicts';
import type { WriteContext } from '../context';
import { cascadeRestore, cascadeTombstone, commitMerge, planMerge, refuseDuplicateId, stampNew, tombstone, untombstone } from '../merge';
import type { MutationHandlers } from './types';

/**
 * Kind `panel`: a child of its building; feeds may only name a live panel of the same building,
 * and a change of spaces or system must still fit the circuits. A delete tombstones its circuits.
 */

export async function writablePanel(w: WriteContext, id: string) {
  const panel = await w.em.findOne(Panel, { where: { id } });
  if (!panel) throw new NotFoundError('Panel');
  const { building, role } = await writableBuilding(w, panel.buildingId, 'Panel');
  if (!w.sync && (panel.deletedAt || building.deletedAt)) throw new NotFoundError('Panel');
  return { panel, building, role };
}

async function checkPanelLinks(
  em: EntityManager,
  buildingId: string,
  panelId: string,
  fedFromPanelId: string | null | undefined,
) {
  if (!fedFromPanelId) return;
  if (fedFromPanelId === panelId) throw new ValidationError({ fedFromPanelId: 'a panel cannot feed itself' });
  const parent = await em.findOne(Panel, { where: { id: fedFromPanelId, buildingId, ...live } });
  if (!parent) throw new ValidationError({ fedFromPanelId: 'no such panel in this building' });
}

export async function createPanel(w: WriteContext, buildingId: string, body: PanelCreateBody) {
  const { building, role } = w.sync
    ? await writableBuilding(w, buildingId, 'Building')
    : await visibleBuilding(w.em, w.actor, buildingId);
  requireScheduleEditor(role);
  if (building.deletedAt) throw parentDeleted('building');
  const version = await w.versions.of(buildingId);
  const id = body.id ?? uuidv7();
  await refuseDuplicateId(w.em, Panel, id);
  await checkPanelLinks(w.em, buildingId, id, body.fedFromPanelId);
  const { id: _id, ...fields } = body;
  const panel = w.em.create(Panel, { id, buildingId, fieldMeta: {} });
  stampNew(panel, fields, w, version);
  await w.em.insert(Panel, panel);
  return { panel: panelDto(panel) };
}

export async function patchPanel(w: WriteContext, id: string, patch: PanelPatchBody) {
  const found = await writablePanel(w, id);
  requireScheduleEditor(found.role);
  const { version, row: panel } = await lockAndReload(w, found.building.id, found.panel, () =>
    w.em.findOneByOrFail(Panel, { id }),
  );
  const target: Target = { entity: 'panel', buildingId: panel.buildingId };
  const drafts: ConflictDraft[] = [];
  if (panel.deletedAt) {
    drafts.push(editedAfterDelete(panel, patch, w, target));
  } else {
    const plan = planMerge(panel, completeGroups(patch, panel), w, version);
    const changed = new Set(plan.applied);
    const next = plan.candidate;
    if (PANEL_RULE_FIELDS.some((f) => changed.has(f))) {
      const problems = panelRuleErrors(next);
      if (Object.keys(problems).length > 0) throw new ValidationError(problems);
    }
    if (changed.has('fedFromPanelId')) await checkPanelLinks(w.em, panel.buildingId, id, next.fedFromPanelId);
    if (changed.has('spaces') || changed.has('system')) {
      const circuits = await w.em.find(Circuit, { where: { panelId: id, ...live } });
      const { problems } = panelLayout({ system: next.system, spaces: next.spaces }, circuits);
      if (problems.length > 0) {
        const field = changed.has('spaces') ? 'spaces' : 'system';
        throw new ValidationError({ [field]: `existing circuits would not fit: ${problems[0].message}` });
      }
    }
    drafts.push(...commitMerge(panel, plan, w, version, target));
    await updateRows(w.em, Panel, [panel]);
  }
  await insertConflicts(w.em, drafts);
  return { panel: panelDto(panel) };
}

/** Tombstones the panel and its circuits. */
export async function deletePanel(w: WriteContext, id: string) {
  const found = await writablePanel(w, id);
  requireScheduleEditor(found.role);
  const { version, row: panel } = await lockAndReload(w, found.building.id, found.panel, () =>
    w.em.findOneByOrFail(Panel, { id }),
  );
  if (panel.deletedAt) return { ok: true, version };
  const buildingId = panel.buildingId;
  const drafts: ConflictDraft[] = [];
  if (tombstone(panel, w, version, { entity: 'panel', buildingId }, drafts)) {
    await cascadeTombstone(w, Circuit, { panelId: id }, version, { entity: 'circuit', buildingId }, drafts);
  }
  await updateRows(w.em, Panel, [panel]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

/** Brings a tombstoned panel back with the circuits its delete took with it. */
export async function restorePanel(w: WriteContext, id: string) {
  const found = await writablePanel(w, id);
  requireScheduleEditor(found.role);
  if (found.building.deletedAt) throw parentDeleted('building');
  const { version, row: panel } = await lockAndReload(w, found.building.id, found.panel, () =>
    w.em.findOneByOrFail(Panel, { id }),
  );
  const drafts: ConflictDraft[] = [];
  const { restored, undone } = untombstone(panel, w, version, { entity: 'panel', buildingId: panel.buildingId }, drafts);
  if (restored) {
    await updateRows(w.em, Panel, [panel]);
    await cascadeRestore(w, 'circuit', 'panel_id', id, undone, version);
  }
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}


export const panelMutations = {
  'panel.create': (w, m, fields) => {
    if (m.parentId && m.parentId !== m.buildingId) {
      throw new AppError(400, 'invalid', 'parentId must be the building id', { parentId: 'must be the building id' });
    }
    return createPanel(w, m.buildingId, fields);
  },
  'panel.patch': (w, m, fields) => patchPanel(w, m.entityId, fields),
  'panel.delete': (w, m) => deletePanel(w, m.entityId),
  'panel.restore': (w, m) => restorePanel(w, m.entityId),
} satisfies Partial<MutationHandlers>;

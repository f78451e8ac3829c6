import { uuidv7 } from 'uuidv7';
import type { CircuitCreateBody, CircuitPatchBody } from '../../../shared/schemas';
import { requireScheduleEditor } from '../../auth/access';
import { Circuit, Panel } from '../../entities';
import { AppError, ValidationError } from '../../http/errors';
import { updateRows } from '../../services/bulk';
import { circuitDto } from '../../services/serialise';
import { live, lockAndReload, parentDeleted, visiblePanel } from '../access';
import { insertConflicts, type ConflictDraft } from '../conflicts';
import type { WriteContext } from '../context';
import { refuseDuplicateId, stampNew, tombstone, untombstone } from '../merge';
import { planCircuitPatches, type CircuitPatchItem } from './circuit-batch';
import {
  ALL_CIRCUIT_FIELDS,
  bandProblem,
  bandsById,
  circuitProblems,
  feedTarget,
  membershipsOf,
  verifierProblem,
  writableCircuit,
} from './circuit-rules';
import { writablePanel } from './panel';
import type { ItemOutcome, MutationHandlers, PatchPlanners } from './types';
import { canMergeSetwise, mergeCircuitPatchesSetwise } from '../setwise-circuit';

/**
 * Kind `circuit`: a breaker position of a panel. Runs of patches are planned as one batch
 * (circuit-batch.ts), and patches of free fields only merge inside one statement (../setwise-circuit.ts).
 */

export async function createCircuit(w: WriteContext, panelId: string, body: CircuitCreateBody) {
  const { panel: found, building, role } = w.sync
    ? await writablePanel(w, panelId)
    : await visiblePanel(w.em, w.actor, panelId);
  requireScheduleEditor(role);
  if (found.deletedAt) throw parentDeleted('panel');
  const { version, row: panel } = await lockAndReload(w, building.id, found, () =>
    w.em.findOneByOrFail(Panel, { id: panelId }),
  );
  const id = body.id ?? uuidv7();
  await refuseDuplicateId(w.em, Circuit, id);
  const { id: _id, ...fields } = body;
  const siblings = await w.em.find(Circuit, { where: { panelId, ...live } });
  const fed = await feedTarget(w.em, fields.feedsPanelId);
  const bands = await bandsById(w.em, [fields.bandId]);
  const problems = {
    ...circuitProblems(panel, { id, ...fields }, ALL_CIRCUIT_FIELDS, siblings, fed),
    ...bandProblem(fields.bandId, bands.get(fields.bandId ?? ''), building.organisationId),
    ...verifierProblem(fields, await membershipsOf(w.em, [fields.verifiedBy]), building.organisationId),
  };
  if (Object.keys(problems).length > 0) throw new ValidationError(problems);
  const circuit = w.em.create(Circuit, { id, panelId, buildingId: panel.buildingId, fieldMeta: {} });
  stampNew(circuit, fields, w, version);
  await w.em.insert(Circuit, circuit);
  return { circuit: circuitDto(circuit) };
}


/** Plan and persist a batch of circuit patches (see planCircuitPatches). */
export async function patchCircuits(items: readonly CircuitPatchItem[]): Promise<ItemOutcome<Circuit>[]> {
  const plan = await planCircuitPatches(items);
  await plan.persist();
  return plan.outcomes;
}

export async function patchCircuit(w: WriteContext, id: string, patch: CircuitPatchBody) {
  const [outcome] = await patchCircuits([{ w, id, patch }]);
  if (!outcome.ok) throw outcome.error;
  return { circuit: circuitDto(outcome.row) };
}

export async function deleteCircuit(w: WriteContext, id: string) {
  const found = await writableCircuit(w, id);
  requireScheduleEditor(found.role);
  const { version, row: circuit } = await lockAndReload(w, found.building.id, found.circuit, () =>
    w.em.findOneByOrFail(Circuit, { id }),
  );
  if (circuit.deletedAt) return { ok: true, version };
  const drafts: ConflictDraft[] = [];
  tombstone(circuit, w, version, { entity: 'circuit', buildingId: circuit.buildingId }, drafts);
  await updateRows(w.em, Circuit, [circuit]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

/** Brings a tombstoned circuit back, if its panel is live and its positions are still free. */
export async function restoreCircuit(w: WriteContext, id: string) {
  const found = await writableCircuit(w, id);
  requireScheduleEditor(found.role);
  const { version, row: circuit } = await lockAndReload(w, found.building.id, found.circuit, () =>
    w.em.findOneByOrFail(Circuit, { id }),
  );
  if (!circuit.deletedAt) return { ok: true, version };
  const panel = await w.em.findOneByOrFail(Panel, { id: circuit.panelId });
  if (panel.deletedAt) throw parentDeleted('panel');
  const siblings = await w.em.find(Circuit, { where: { panelId: panel.id, ...live } });
  const problems = circuitProblems(panel, circuit, new Set(['position']), siblings, null);
  if (Object.keys(problems).length > 0) throw new ValidationError(problems);
  const drafts: ConflictDraft[] = [];
  const { restored } = untombstone(circuit, w, version, { entity: 'circuit', buildingId: circuit.buildingId }, drafts);
  if (restored) await updateRows(w.em, Circuit, [circuit]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}


export const circuitMutations = {
  'circuit.create': (w, m, fields) => {
    if (!m.parentId) {
      throw new AppError(400, 'invalid', 'parentId: the panel id is required', { parentId: 'the panel id is required' });
    }
    return createCircuit(w, m.parentId, fields);
  },
  'circuit.patch': (w, m, fields) => patchCircuit(w, m.entityId, fields),
  'circuit.delete': (w, m) => deleteCircuit(w, m.entityId),
  'circuit.restore': (w, m) => restoreCircuit(w, m.entityId),
} satisfies Partial<MutationHandlers>;

export const circuitPlanners = {
  // patches of free fields only merge inside one statement; anything else is planned in memory
  'circuit.patch': (items) => (canMergeSetwise(items) ? mergeCircuitPatchesSetwise(items) : planCircuitPatches(items)),
} satisfies PatchPlanners;

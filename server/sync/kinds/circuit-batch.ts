import { In } from 'typeorm';
import { completeGroups } from '../../../shared/merge';
import type { CircuitPatchBody } from '../../../shared/schemas';
import { can } from '../../../shared/permissions';
import { roleForBuilding, requireScheduleEditor } from '../../auth/access';
import { Building, Circuit, Panel } from '../../entities';
import { AppError, NotFoundError, ValidationError } from '../../http/errors';
import { selectRows, updateChanged } from '../../services/bulk';
import { live } from '../access';
import { editedAfterDelete, insertConflicts, reportConflicts, type ConflictDraft, type Target } from '../conflicts';
import { commitMerge, planMerge } from '../merge';
import { bandProblem, bandsById, circuitProblems, membershipsOf, verifierProblem } from './circuit-rules';
import type { ItemOutcome, PatchItem, PatchPlan } from './types';

/** One circuit patch of a run. */
export type CircuitPatchItem = PatchItem<CircuitPatchBody>;

/**
 * Plan many circuit patches: the same rules as one patch, in order (a later item sees the earlier
 * ones), with a constant number of statements for the whole batch. Rows are read with a few
 * `ANY($1)` queries under the buildings' locks, merged and validated in memory; `persist` writes
 * them back with one UPDATE … FROM jsonb_to_recordset of the changed columns and one conflict
 * insert. A rejected item changes nothing.
 */
export async function planCircuitPatches(items: readonly CircuitPatchItem[]): Promise<PatchPlan<Circuit>> {
  if (items.length === 0) return { outcomes: [], persist: async () => {} };
  const { em, actor, versions } = items[0].w;
  const ids = [...new Set(items.map((i) => i.id))];

  const read = () => selectRows(em, Circuit, 'id = ANY($1::uuid[])', [ids]);
  let circuits = await read();
  const buildingIds = [...new Set(circuits.map((c) => c.buildingId))];
  const known = buildingIds.map((id) => versions.home(id));
  const buildings = known.every((b) => b)
    ? (known as { id: string; organisationId: string }[])
    : await em.find(Building, { where: { id: In(buildingIds) } });
  const roleOf = new Map(buildings.map((b) => [b.id, roleForBuilding(actor, b)]));
  const editable = buildings
    .filter((b) => can(roleOf.get(b.id), 'schedule.edit'))
    .map((b) => b.id)
    .sort();
  // a push locked its buildings before reading; a REST call locks now and reads again, since a
  // row read before the lock may have changed before it was taken (building ids never change)
  const unlocked = editable.filter((b) => !versions.holds(b));
  for (const b of editable) await versions.of(b);
  if (unlocked.length > 0) circuits = await read();
  const rows = new Map(circuits.map((c) => [c.id, c]));

  // panels, siblings and fed panels only when a patch can break a rule that needs them
  const needs = (i: CircuitPatchItem, fields: string[]) => fields.some((f) => f in i.patch);
  const layoutItems = items.filter((i) => needs(i, ['position', 'poles', 'feedsPanelId']));
  const panelIds = [...new Set(layoutItems.map((i) => rows.get(i.id)?.panelId).filter((p): p is string => !!p))];
  const panels = new Map(
    (panelIds.length ? await em.find(Panel, { where: { id: In(panelIds) } }) : []).map((p) => [p.id, p]),
  );
  const moving = [
    ...new Set(
      items
        .filter((i) => needs(i, ['position', 'poles']))
        .map((i) => rows.get(i.id)?.panelId)
        .filter((p): p is string => !!p),
    ),
  ];
  const siblings = new Map<string, Circuit[]>();
  if (moving.length > 0) {
    for (const c of await em.find(Circuit, { where: { panelId: In(moving), ...live } })) {
      // the batch's own rows stand in for their copies, so a move earlier in the batch is seen
      const row = rows.get(c.id) ?? c;
      siblings.set(c.panelId, [...(siblings.get(c.panelId) ?? []), row]);
    }
  }
  const feedIds = [...new Set(items.map((i) => i.patch.feedsPanelId).filter((p): p is string => !!p))];
  const fedPanels = new Map(
    (feedIds.length ? await em.find(Panel, { where: { id: In(feedIds) } }) : []).map((p) => [p.id, p]),
  );

  const bands = await bandsById(em, items.map((i) => i.patch.bandId));
  const organisationOf = new Map(buildings.map((b) => [b.id, b.organisationId]));
  const members = await membershipsOf(em, items.map((i) => i.patch.verifiedBy));

  const outcomes: ItemOutcome<Circuit>[] = [];
  const dirty = new Map<Circuit, Set<string>>();
  const drafts: ConflictDraft[] = [];
  for (const { w, id, patch } of items) {
    try {
      const circuit = rows.get(id);
      const role = circuit ? roleOf.get(circuit.buildingId) : null;
      if (!circuit || !role || (w.sync && w.sync.buildingId !== circuit.buildingId)) {
        throw new NotFoundError('Circuit');
      }
      requireScheduleEditor(role);
      const version = await versions.of(circuit.buildingId);
      const target: Target = { entity: 'circuit', buildingId: circuit.buildingId };
      if (circuit.deletedAt) {
        if (!w.sync) throw new NotFoundError('Circuit');
        drafts.push(editedAfterDelete(circuit, patch, w, target));
        outcomes.push({ ok: true, row: circuit, version });
        continue;
      }
      const plan = planMerge(circuit, completeGroups(patch, circuit), w, version);
      if (plan.applied.length > 0) {
        const problems = circuitProblems(
          panels.get(circuit.panelId) ?? null,
          plan.candidate,
          new Set(plan.applied),
          siblings.get(circuit.panelId) ?? [],
          fedPanels.get(plan.candidate.feedsPanelId ?? ''),
        );
        if (plan.applied.includes('bandId')) {
          const bandId = plan.candidate.bandId;
          Object.assign(problems, bandProblem(bandId, bands.get(bandId ?? ''), organisationOf.get(circuit.buildingId)!));
        }
        if (plan.applied.includes('verifiedOn') || plan.applied.includes('verifiedBy')) {
          Object.assign(problems, verifierProblem(plan.candidate, members, organisationOf.get(circuit.buildingId)!));
        }
        if (Object.keys(problems).length > 0) throw new ValidationError(problems);
      }
      drafts.push(...commitMerge(circuit, plan, w, version, target));
      const changed = dirty.get(circuit) ?? new Set<string>();
      for (const f of plan.applied) changed.add(f);
      dirty.set(circuit, changed);
      outcomes.push({ ok: true, row: circuit, version });
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      outcomes.push({ ok: false, error });
    }
  }
  reportConflicts(drafts);
  return {
    outcomes,
    async persist() {
      await updateChanged(em, Circuit, [...dirty].map(([row, fields]) => ({ row, fields: [...fields] })));
      await insertConflicts(em, drafts);
    },
  };
}

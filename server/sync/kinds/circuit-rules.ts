import { In, type EntityManager } from 'typeorm';
import { occupiedPositions, panelLayout } from '../../../shared/calc';
import { SYSTEM_INFO } from '../../../shared/domain';
import { circuitRuleErrors, verificationErrors } from '../../../shared/schemas';
import { Circuit, CurveBand, Membership, Panel } from '../../entities';
import { NotFoundError } from '../../http/errors';
import { writableBuilding } from '../access';
import type { WriteContext } from '../context';

/** The rules of a circuit that tie it to other fields and rows: its panel's layout, its siblings, its feed and band. */

type CircuitShape = Pick<Circuit, 'id' | 'position' | 'poles' | 'status' | 'ratingA' | 'feedsPanelId'>;

/**
 * What is wrong with a circuit as it would be stored, checking only rules the changed fields can
 * break. `siblings` are the panel's live circuits (needed when position or poles change);
 * `fedPanel` the panel named by feedsPanelId (needed when it changes).
 */
export function circuitProblems(
  panel: Panel | null,
  candidate: CircuitShape,
  changed: ReadonlySet<string>,
  siblings: readonly Circuit[],
  fedPanel: Panel | null | undefined,
): Record<string, string> {
  const fields: Record<string, string> = {};
  if (changed.has('status') || changed.has('ratingA')) Object.assign(fields, circuitRuleErrors(candidate));
  const layout = changed.has('position') || changed.has('poles') || changed.has('feedsPanelId');
  if (layout && !panel) throw new Error('circuitProblems: the panel is needed to check position, poles or feed');
  if (!panel) return fields;
  if (changed.has('position') || changed.has('poles')) {
    if (candidate.poles === 3 && SYSTEM_INFO[panel.system].phases === 1) {
      fields.poles = 'a 3-pole breaker needs a three-phase panel';
    }
    const layout = panelLayout({ system: panel.system, spaces: panel.spaces }, [candidate]);
    for (const problem of layout.problems) {
      const field = problem.code === 'bad-poles' || problem.code === 'same-phase' ? 'poles' : 'position';
      fields[field] ??= problem.message;
    }
    const taken = new Map<number, Circuit>();
    for (const other of siblings) {
      if (other.id === candidate.id || other.deletedAt) continue;
      for (const position of occupiedPositions(other.position, other.poles)) taken.set(position, other);
    }
    const clash = occupiedPositions(candidate.position, candidate.poles).find((p) => taken.has(p));
    if (clash !== undefined) {
      const other = taken.get(clash)!;
      fields.position ??= `position ${clash} is taken by the breaker at ${other.position}${
        other.description ? ` (${other.description})` : ''
      }`;
    }
  }
  if (changed.has('feedsPanelId') && candidate.feedsPanelId) {
    const ok = fedPanel && !fedPanel.deletedAt && fedPanel.buildingId === panel.buildingId && fedPanel.id !== panel.id;
    if (!ok) fields.feedsPanelId = 'no such other panel in this building';
  }
  return fields;
}

export const ALL_CIRCUIT_FIELDS = new Set(['position', 'poles', 'status', 'ratingA', 'feedsPanelId']);

/**
 * A circuit's time-current band is a live band of its own building's organisation: another
 * organisation's band would judge its trip tests and print in its report.
 */
export function bandProblem(bandId: string | null, band: CurveBand | null | undefined, organisationId: string): Record<string, string> {
  if (!bandId) return {};
  const ok = band && !band.deletedAt && band.organisationId === organisationId;
  return ok ? {} : { bandId: 'no such band in your library' };
}

export async function bandsById(em: EntityManager, ids: (string | null | undefined)[]): Promise<Map<string, CurveBand>> {
  const wanted = [...new Set(ids.filter((id): id is string => !!id))];
  const bands = wanted.length ? await em.find(CurveBand, { where: { id: In(wanted) } }) : [];
  return new Map(bands.map((b) => [b.id, b]));
}

export async function writableCircuit(w: WriteContext, id: string) {
  const circuit = await w.em.findOne(Circuit, { where: { id } });
  if (!circuit) throw new NotFoundError('Circuit');
  const { building, role } = await writableBuilding(w, circuit.buildingId, 'Circuit');
  if (!w.sync && circuit.deletedAt) throw new NotFoundError('Circuit');
  return { circuit, building, role };
}

export async function feedTarget(em: EntityManager, id: string | null | undefined) {
  return id ? em.findOne(Panel, { where: { id } }) : null;
}


/**
 * "Verified at the panel" names a date and a person of the building's own organisation: another
 * organisation's user id would print a stranger's name on this owner's directory.
 */
export function verifierProblem(
  c: { verifiedOn: string | null; verifiedBy: string | null },
  members: ReadonlySet<string>,
  organisationId: string,
): Record<string, string> {
  const pair = verificationErrors(c);
  if (Object.keys(pair).length > 0) return pair;
  if (c.verifiedBy && !members.has(`${organisationId}:${c.verifiedBy}`)) return { verifiedBy: 'not a person of this organisation' };
  return {};
}

/** `organisationId:userId` of every membership of the given users (for verifierProblem). */
export async function membershipsOf(em: EntityManager, userIds: (string | null | undefined)[]): Promise<Set<string>> {
  const wanted = [...new Set(userIds.filter((id): id is string => !!id))];
  const rows = wanted.length ? await em.find(Membership, { where: { userId: In(wanted) } }) : [];
  return new Set(rows.map((m) => `${m.organisationId}:${m.userId}`));
}

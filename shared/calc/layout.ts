/**
 * Panelboard position numbering and phase assignment.
 *
 * Source: standard North American panelboard numbering — odd positions down the left, even down
 * the right, positions 1–2 forming row 1, 3–4 row 2 and so on, with each row on one bus phase
 * (split-phase 1φ 3W bus alternates A, B; three-phase bus cycles A, B, C). This is the layout
 * DESIGN.md §3 describes and that NEC 408.4(A) directories are written against [CP].
 */
import { SYSTEM_INFO } from '../domain';
import type { PanelSystem, Phase } from '../domain';
import { finite, wholeFrom } from './guard';

const PHASES_1: readonly Phase[] = ['A', 'B'];
const PHASES_3: readonly Phase[] = ['A', 'B', 'C'];

/**
 * Row of a position under standard panelboard numbering [CP]: 1 and 2 → row 1, 3 and 4 → row 2 …
 * @throws RangeError when position is not a whole number ≥ 1.
 */
export function rowOf(position: number): number {
  wholeFrom('position', position, 1);
  return Math.ceil(position / 2);
}

/**
 * The bus phase a position sits on.
 *
 * Standard panelboard numbering (DESIGN.md §3, common practice [CP]): rows share a phase;
 * 1φ 3W rows alternate A, B; 3φ rows cycle A, B, C.
 *
 * @throws RangeError when position is not a whole number ≥ 1.
 */
export function phaseOf(system: PanelSystem, position: number): Phase {
  if (!Number.isInteger(position) || position < 1) {
    throw new RangeError(`position must be a whole number from 1 up, got ${position}`);
  }
  const row = rowOf(position);
  const cycle = SYSTEM_INFO[system].phases === 1 ? PHASES_1 : PHASES_3;
  return cycle[(row - 1) % cycle.length];
}

/**
 * Positions a breaker occupies: a 1-pole at n takes n; a 2-pole n and n+2; a 3-pole n, n+2, n+4
 * (the poles stack down one side, one row each — standard numbering [CP]).
 * @throws RangeError when position is not a whole number ≥ 1 or poles is not 1, 2 or 3.
 */
export function occupiedPositions(position: number, poles: number): number[] {
  wholeFrom('position', position, 1);
  if (!Number.isInteger(poles) || poles < 1 || poles > 3) throw new RangeError(`poles must be 1, 2 or 3, got ${String(poles)}`);
  const out: number[] = [];
  for (let pole = 0; pole < poles; pole += 1) out.push(position + 2 * pole);
  return out;
}

export type LayoutProblemCode = 'overlap' | 'out-of-range' | 'bad-poles' | 'same-phase';

export interface LayoutProblem {
  circuitId: string;
  code: LayoutProblemCode;
  message: string;
}

export interface LayoutSlot {
  position: number;
  phase: Phase;
  /** the circuit occupying this position, or null when nothing is recorded there */
  circuitId: string | null;
}

export interface LayoutPanel {
  system: PanelSystem;
  /** number of positions (spaces) in the panel, e.g. 42 */
  spaces: number;
}

export interface LayoutCircuit {
  id: string;
  /** starting (lowest) position */
  position: number;
  poles: number;
}

export interface PanelLayout {
  /** one slot per position 1..spaces, in order */
  slots: LayoutSlot[];
  problems: LayoutProblem[];
}

/**
 * Places circuits on the panel's positions and reports what cannot stand.
 *
 * Standard numbering as in {@link phaseOf} [CP]. Treatment:
 * - 'bad-poles': poles not a whole number 1–3 (the circuit is not placed), or a 3-pole breaker on a
 *   single-phase panel (placed as it physically sits, so overlaps still show; no extra
 *   'same-phase' is reported for it, the bad-poles message already says why).
 * - 'out-of-range': start position not a whole number ≥ 1, or any occupied position > spaces.
 *   The positions that are in range are still placed.
 * - 'overlap': a position already taken; circuits are placed in order of start position (input
 *   order breaks ties), so the later one is reported and the earlier keeps the slot.
 * - 'same-phase': a multi-pole breaker whose poles land on the same phase twice (cannot happen
 *   with standard numbering and valid poles, kept as a guard).
 * A circuit's bad position or poles is a problem of the layout (reported, not thrown); a panel's
 * `spaces` that is not a whole number ≥ 0 is refused.
 * @throws RangeError on a panel's spaces that is not a whole number ≥ 0.
 */
export function panelLayout(panel: LayoutPanel, circuits: readonly LayoutCircuit[]): PanelLayout {
  finite('spaces', panel.spaces);
  const spaces = wholeFrom('spaces', panel.spaces, 0);
  const singlePhase = SYSTEM_INFO[panel.system].phases === 1;
  const slots: LayoutSlot[] = [];
  for (let position = 1; position <= spaces; position += 1) {
    slots.push({ position, phase: phaseOf(panel.system, position), circuitId: null });
  }
  const problems: LayoutProblem[] = [];
  const ordered = circuits
    .map((circuit, index) => ({ circuit, index }))
    .sort((a, b) => a.circuit.position - b.circuit.position || a.index - b.index)
    .map((entry) => entry.circuit);

  for (const circuit of ordered) {
    const { id, position, poles } = circuit;
    if (!Number.isInteger(poles) || poles < 1 || poles > 3) {
      problems.push({
        circuitId: id,
        code: 'bad-poles',
        message: `A breaker has 1, 2 or 3 poles; this one is recorded with ${poles}.`,
      });
      continue;
    }
    if (!Number.isInteger(position) || position < 1) {
      problems.push({
        circuitId: id,
        code: 'out-of-range',
        message: `Position ${position} does not exist: positions are numbered from 1.`,
      });
      continue;
    }
    let badPoles = false;
    if (poles === 3 && singlePhase) {
      badPoles = true;
      problems.push({
        circuitId: id,
        code: 'bad-poles',
        message: 'A 3-pole breaker needs a three-phase bus; this panel is single-phase.',
      });
    }
    const taken = occupiedPositions(position, poles);
    const beyond = taken.filter((p) => p > spaces);
    if (beyond.length > 0) {
      problems.push({
        circuitId: id,
        code: 'out-of-range',
        message:
          poles === 1
            ? `Position ${position} is past the last space (${spaces}).`
            : `A ${poles}-pole breaker at ${position} needs positions ${taken.join(', ')}; ` +
              `the panel has ${spaces} spaces.`,
      });
    }
    for (const p of taken) {
      if (p > spaces) continue;
      const slot = slots[p - 1];
      if (slot.circuitId !== null && slot.circuitId !== id) {
        problems.push({
          circuitId: id,
          code: 'overlap',
          message: `Position ${p} is already taken by another circuit.`,
        });
      } else {
        slot.circuitId = id;
      }
    }
    if (!badPoles && taken.length > 1) {
      const phases = taken.map((p) => phaseOf(panel.system, p));
      if (new Set(phases).size < phases.length) {
        problems.push({
          circuitId: id,
          code: 'same-phase',
          message: `The poles at ${taken.join(', ')} land on phases ${phases.join(', ')}: ` +
            'a multi-pole breaker must span different phases.',
        });
      }
    }
  }
  return { slots, problems };
}

/**
 * The first position a circuit would take that another circuit already occupies, and that
 * circuit; null when it fits beside them. Standard numbering (a 2-pole at n takes n and n+2) [CP].
 * @throws RangeError as {@link occupiedPositions} for the candidate or another circuit.
 */
export function positionClash<C extends LayoutCircuit>(
  candidate: LayoutCircuit,
  others: readonly C[],
): { position: number; circuit: C } | null {
  const taken = new Map<number, C>();
  for (const other of others) {
    if (other.id === candidate.id) continue;
    for (const position of occupiedPositions(other.position, other.poles)) taken.set(position, other);
  }
  for (const position of occupiedPositions(candidate.position, candidate.poles)) {
    const circuit = taken.get(position);
    if (circuit) return { position, circuit };
  }
  return null;
}

/**
 * Accepted door-card lines meet the CSV import's own checks (shared/csv.ts): standard ratings
 * (NEC 240.6(A) 2023 list), a 3-pole on a single-phase bus, positions past the panel, overlaps
 * inside the card and with circuits that stay; and a card patches only the fields it carries.
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';

import type { ExistingCircuit, ParseContext } from '../../shared/csv';
import { planDoorCard, type AcceptedLine } from '../../shared/door-card/check';
import { circuitCreateBody } from '../../shared/schemas';

const PANEL = '00000000-0000-7000-8000-000000000001';
const ctx = (system: ParseContext['panel']['system'] = '120/240V-1ph-3w', spaces = 42): ParseContext => ({
  panel: { id: PANEL, system, spaces },
  panels: [{ id: PANEL, tag: 'LA' }],
  bands: [],
});
let n = 0;
const accepted = (position: number, poles: number, ratingA: number | null, description: string, status: AcceptedLine['status'] = 'in-use'): AcceptedLine => ({
  key: `k${(n += 1)}`,
  position,
  poles,
  ratingA,
  description,
  status,
});
const existing = (position: number, fields: Partial<ExistingCircuit> = {}): ExistingCircuit => ({
  ...circuitCreateBody.parse({ position, poles: 1, ratingA: 20, description: 'Old', conductorSize: '12', conductorMaterial: 'Cu', loadVA: 900 }),
  id: `c${position}`,
  ...fields,
});

describe('door card through the CSV import checks', () => {
  it('a clean card on an empty panel: one new circuit per accepted line', () => {
    const { plan, problemsByKey } = planDoorCard([accepted(1, 1, 20, 'Lights'), accepted(2, 2, 30, 'Dryer'), accepted(3, 1, null, '', 'space')], ctx(), []);
    assert.equal(plan.blocked, false);
    assert.deepEqual(plan.creates.map((c) => [c.fields.position, c.fields.poles, c.fields.ratingA, c.fields.description, c.fields.status]), [
      [1, 1, 20, 'Lights', 'in-use'],
      [2, 2, 30, 'Dryer', 'in-use'],
      [3, 1, null, '', 'space'],
    ]);
    assert.equal(problemsByKey.size, 0);
  });

  const bad: [string, AcceptedLine[], ParseContext, string][] = [
    ['23 A is no standard rating (NEC 240.6(A) 2023)', [accepted(1, 1, 23, 'Lights')], ctx(), 'rating 23 A is not a standard rating (NEC 240.6(A)).'],
    [
      'a 3-pole on a single-phase panel',
      [accepted(1, 3, 60, 'Chiller')],
      ctx(),
      'a 3-pole breaker at 1 needs a three-phase bus; this panel is single-phase.',
    ],
    ['past the last space', [accepted(43, 1, 20, 'Lights')], ctx('120/240V-1ph-3w', 42), "position 43 is past the panel's last space (42)."],
    [
      'a 2-pole overlapping the next line of its side',
      [accepted(1, 2, 30, 'Dryer'), accepted(3, 1, 20, 'Lights')],
      ctx(),
      'position 3 overlaps the 2-pole at 1 of row 2.',
    ],
  ];
  for (const [name, lines, context, problem] of bad) {
    it(`${name}: named on its line, nothing may be applied`, () => {
      const { plan, problemsByKey } = planDoorCard(lines, context, []);
      assert.equal(plan.blocked, true);
      const last = lines[lines.length - 1];
      assert.deepEqual(problemsByKey.get(last.key), [problem]);
    });
  }

  it('a position already in the panel is patched only in the fields a card carries', () => {
    const { plan } = planDoorCard([accepted(1, 1, 20, 'Lobby lights')], ctx(), [existing(1)]);
    assert.equal(plan.blocked, false);
    assert.deepEqual(plan.patches.map((p) => [p.circuitId, p.fields, p.before]), [['c1', { description: 'Lobby lights' }, { description: 'Old' }]]);
  });

  it('a line that says what the panel says changes nothing (the conductor it does not name stays)', () => {
    const { plan } = planDoorCard([accepted(1, 1, 20, 'Old')], ctx(), [existing(1)]);
    assert.equal(plan.patches.length, 0);
    assert.equal(plan.unchanged, 1);
  });

  it('overlaps a 2-pole that stays in the panel', () => {
    const { plan, problemsByKey } = planDoorCard([accepted(3, 1, 20, 'Lights')], ctx(), [existing(1, { poles: 2, ratingA: 30 })]);
    assert.equal(plan.blocked, true);
    assert.deepEqual([...problemsByKey.values()], [['position 3 overlaps the 2-pole at 1 that stays in the panel.']]);
  });
});

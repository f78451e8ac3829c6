import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { SYSTEMS, SYSTEM_INFO } from '../../../shared/domain';
import type { PanelSystem, Phase } from '../../../shared/domain';
import { occupiedPositions, panelLayout, phaseOf, positionClash } from '../../../shared/calc';

// Source for every row: standard panelboard numbering as DESIGN.md §3 states it — odd positions left,
// even right, rows share a bus phase; 1φ 3W rows alternate A, B; 3φ rows cycle A, B, C. [CP]
const NUMBERING = 'standard panelboard numbering, DESIGN.md §3 [CP] common practice';

describe(`phaseOf — ${NUMBERING}`, () => {
  const rows: { system: PanelSystem; phases: Phase[] }[] = [
    // positions 1..12
    { system: '120/240V-1ph-3w', phases: ['A', 'A', 'B', 'B', 'A', 'A', 'B', 'B', 'A', 'A', 'B', 'B'] },
    { system: '208Y/120V-3ph-4w', phases: ['A', 'A', 'B', 'B', 'C', 'C', 'A', 'A', 'B', 'B', 'C', 'C'] },
    { system: '480Y/277V-3ph-4w', phases: ['A', 'A', 'B', 'B', 'C', 'C', 'A', 'A', 'B', 'B', 'C', 'C'] },
    { system: '240V-3ph-3w-delta', phases: ['A', 'A', 'B', 'B', 'C', 'C', 'A', 'A', 'B', 'B', 'C', 'C'] },
    { system: '480V-3ph-3w', phases: ['A', 'A', 'B', 'B', 'C', 'C', 'A', 'A', 'B', 'B', 'C', 'C'] },
    { system: '120/240V-3ph-4w-highleg', phases: ['A', 'A', 'B', 'B', 'C', 'C', 'A', 'A', 'B', 'B', 'C', 'C'] },
  ];
  for (const { system, phases } of rows) {
    it(`${system}: positions 1–12 → ${phases.join('')}`, () => {
      assert.deepEqual(
        phases.map((_, i) => phaseOf(system, i + 1)),
        phases,
      );
    });
  }

  it('far positions keep the cycle (1φ position 41 → row 21 → A; 3φ position 84 → row 42 → C)', () => {
    assert.equal(phaseOf('120/240V-1ph-3w', 41), 'A');
    assert.equal(phaseOf('120/240V-1ph-3w', 40), 'B');
    assert.equal(phaseOf('208Y/120V-3ph-4w', 84), 'C');
    assert.equal(phaseOf('208Y/120V-3ph-4w', 79), 'A');
  });

  for (const bad of [0, -1, 1.5, Number.NaN]) {
    it(`rejects position ${bad}`, () => {
      assert.throws(() => phaseOf('208Y/120V-3ph-4w', bad), RangeError);
    });
  }

  it('property: the two positions of a row share a phase; the next row differs; the cycle repeats', () => {
    fc.assert(
      fc.property(fc.constantFrom(...SYSTEMS), fc.integer({ min: 1, max: 500 }), (system, row) => {
        const odd = 2 * row - 1;
        const cycle = SYSTEM_INFO[system].phases === 1 ? 2 : 3;
        assert.equal(phaseOf(system, odd), phaseOf(system, odd + 1));
        assert.notEqual(phaseOf(system, odd), phaseOf(system, odd + 2));
        assert.equal(phaseOf(system, odd), phaseOf(system, odd + 2 * cycle));
      }),
    );
  });
});

describe(`occupiedPositions — ${NUMBERING}`, () => {
  const rows: { position: number; poles: number; expected: number[] }[] = [
    { position: 1, poles: 1, expected: [1] },
    { position: 5, poles: 2, expected: [5, 7] }, // 2-pole at n spans n and n+2
    { position: 2, poles: 3, expected: [2, 4, 6] }, // 3-pole n, n+2, n+4
    { position: 13, poles: 3, expected: [13, 15, 17] },
  ];
  for (const { position, poles, expected } of rows) {
    it(`${poles}-pole at ${position} → ${expected.join(', ')}`, () => {
      assert.deepEqual(occupiedPositions(position, poles), expected);
    });
  }
});

describe(`panelLayout — ${NUMBERING}`, () => {
  it('lists slots 1..spaces in order with their phases', () => {
    const { slots, problems } = panelLayout({ system: '120/240V-1ph-3w', spaces: 8 }, []);
    assert.deepEqual(slots.map((s) => s.position), [1, 2, 3, 4, 5, 6, 7, 8]);
    assert.deepEqual(slots.map((s) => s.phase).join(''), 'AABBAABB');
    assert.ok(slots.every((s) => s.circuitId === null));
    assert.deepEqual(problems, []);
  });

  it('places a clean 3φ schedule: 1-pole, 2-pole and 3-pole, no problems', () => {
    const { slots, problems } = panelLayout({ system: '208Y/120V-3ph-4w', spaces: 12 }, [
      { id: 'lights', position: 1, poles: 1 },
      { id: 'rtu', position: 2, poles: 3 },
      { id: 'water-heater', position: 3, poles: 2 },
      { id: 'recept', position: 7, poles: 1 },
    ]);
    assert.deepEqual(problems, []);
    const byPos = Object.fromEntries(slots.map((s) => [s.position, s.circuitId]));
    assert.deepEqual(byPos, {
      1: 'lights', 2: 'rtu', 3: 'water-heater', 4: 'rtu', 5: 'water-heater', 6: 'rtu',
      7: 'recept', 8: null, 9: null, 10: null, 11: null, 12: null,
    });
    // the 3-pole at 2 spans A, B, C; the 2-pole at 3 spans B, C
    assert.deepEqual([2, 4, 6].map((p) => slots[p - 1].phase), ['A', 'B', 'C']);
    assert.deepEqual([3, 5].map((p) => slots[p - 1].phase), ['B', 'C']);
  });

  it('1φ: a 2-pole at n spans n and n+2 on phases A and B', () => {
    const { slots, problems } = panelLayout({ system: '120/240V-1ph-3w', spaces: 6 }, [
      { id: 'range', position: 3, poles: 2 },
    ]);
    assert.deepEqual(problems, []);
    assert.equal(slots[2].circuitId, 'range');
    assert.equal(slots[4].circuitId, 'range');
    assert.deepEqual([slots[2].phase, slots[4].phase], ['B', 'A']);
  });

  const problemRows: {
    name: string;
    system: PanelSystem;
    spaces: number;
    circuits: { id: string; position: number; poles: number }[];
    expected: { circuitId: string; code: string }[];
  }[] = [
    {
      name: 'overlap: a 1-pole where a 2-pole already sits',
      system: '120/240V-1ph-3w', spaces: 12,
      circuits: [{ id: 'a', position: 1, poles: 2 }, { id: 'b', position: 3, poles: 1 }],
      expected: [{ circuitId: 'b', code: 'overlap' }],
    },
    {
      name: 'overlap: two circuits on one position (the later in input order is reported)',
      system: '208Y/120V-3ph-4w', spaces: 12,
      circuits: [{ id: 'first', position: 4, poles: 1 }, { id: 'second', position: 4, poles: 1 }],
      expected: [{ circuitId: 'second', code: 'overlap' }],
    },
    {
      name: 'out-of-range: position 0',
      system: '208Y/120V-3ph-4w', spaces: 12,
      circuits: [{ id: 'z', position: 0, poles: 1 }],
      expected: [{ circuitId: 'z', code: 'out-of-range' }],
    },
    {
      name: 'out-of-range: 2-pole at 41 of 42 needs 43',
      system: '208Y/120V-3ph-4w', spaces: 42,
      circuits: [{ id: 'x', position: 41, poles: 2 }],
      expected: [{ circuitId: 'x', code: 'out-of-range' }],
    },
    {
      name: 'out-of-range: 1-pole past the last space',
      system: '120/240V-1ph-3w', spaces: 24,
      circuits: [{ id: 'y', position: 25, poles: 1 }],
      expected: [{ circuitId: 'y', code: 'out-of-range' }],
    },
    {
      name: 'bad-poles: 3-pole on a 1φ panel',
      system: '120/240V-1ph-3w', spaces: 12,
      circuits: [{ id: 'p3', position: 1, poles: 3 }],
      expected: [{ circuitId: 'p3', code: 'bad-poles' }],
    },
    {
      name: 'bad-poles: 4 poles',
      system: '480Y/277V-3ph-4w', spaces: 12,
      circuits: [{ id: 'p4', position: 1, poles: 4 }],
      expected: [{ circuitId: 'p4', code: 'bad-poles' }],
    },
    {
      name: 'bad-poles: 0 poles',
      system: '480Y/277V-3ph-4w', spaces: 12,
      circuits: [{ id: 'p0', position: 1, poles: 0 }],
      expected: [{ circuitId: 'p0', code: 'bad-poles' }],
    },
  ];
  for (const row of problemRows) {
    it(row.name, () => {
      const { problems } = panelLayout({ system: row.system, spaces: row.spaces }, row.circuits);
      assert.deepEqual(problems.map(({ circuitId, code }) => ({ circuitId, code })), row.expected);
      assert.ok(problems.every((p) => p.message.length > 10));
    });
  }

  it('an out-of-range 2-pole keeps its in-range slot so the schedule shows it', () => {
    const { slots } = panelLayout({ system: '208Y/120V-3ph-4w', spaces: 42 }, [{ id: 'x', position: 41, poles: 2 }]);
    assert.equal(slots[40].circuitId, 'x');
    assert.equal(slots.length, 42);
  });

  it('the earlier circuit keeps an overlapped slot', () => {
    const { slots } = panelLayout({ system: '120/240V-1ph-3w', spaces: 6 }, [
      { id: 'b', position: 3, poles: 1 },
      { id: 'a', position: 1, poles: 2 },
    ]);
    // placed by start position: a (1, 3) first, so b at 3 is the overlap
    assert.equal(slots[2].circuitId, 'a');
  });

  it('property: valid multi-poles never land on one phase twice and never raise same-phase', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...SYSTEMS),
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 2, max: 3 }),
        (system, position, poles) => {
          fc.pre(poles === 2 || SYSTEM_INFO[system].phases === 3);
          const { slots, problems } = panelLayout({ system, spaces: 50 }, [{ id: 'm', position, poles }]);
          assert.deepEqual(problems, []);
          const phases = slots.filter((s) => s.circuitId === 'm').map((s) => s.phase);
          assert.equal(phases.length, poles);
          assert.equal(new Set(phases).size, poles);
        },
      ),
    );
  });
});

describe('positionClash', () => {
  // standard numbering [CP]: a 2-pole at n takes n and n+2, a 3-pole n, n+2, n+4
  const others = [
    { id: 'a', position: 3, poles: 1 },
    { id: 'b', position: 6, poles: 3 },
  ];
  const rows: [string, { id: string; position: number; poles: number }, number | null, string | null][] = [
    ['2-pole at 1 reaches 3', { id: 'x', position: 1, poles: 2 }, 3, 'a'],
    ['1-pole at 1 fits', { id: 'x', position: 1, poles: 1 }, null, null],
    ['1-pole at 10 meets the 3-pole at 6 (6, 8, 10)', { id: 'x', position: 10, poles: 1 }, 10, 'b'],
    ['2-pole at 5 (5, 7) fits between', { id: 'x', position: 5, poles: 2 }, null, null],
    ['a circuit never clashes with itself', { id: 'a', position: 3, poles: 1 }, null, null],
  ];
  for (const [name, candidate, position, circuitId] of rows) {
    it(name, () => {
      const clash = positionClash(candidate, others);
      assert.equal(clash?.position ?? null, position);
      assert.equal(clash?.circuit.id ?? null, circuitId);
    });
  }
});

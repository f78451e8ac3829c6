import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import {
  THERMOGRAPHY_LOAD_MIN_FRACTION,
  lightLoadNote,
  loadCorrectedRiseC,
  takenUnderLightLoad,
  thermalPriority,
} from '../../../shared/calc';
import type { ThermalBasis } from '../../../shared/calc';

const NETA = 'ANSI/NETA MTS Table 100.18 [V]';

describe(`thermalPriority — ${NETA}`, () => {
  // fractional rises between bands go to the more severe band (documented in thermal.ts)
  const rows: [ThermalBasis, number, 1 | 2 | 3 | 4 | null][] = [
    ['similar', -2, null],
    ['similar', 0, null],
    ['similar', 0.9, null],
    ['similar', 1, 4], // 1–3 °C
    ['similar', 3, 4],
    ['similar', 3.5, 3], // between bands → more severe
    ['similar', 4, 3], // 4–15 °C
    ['similar', 15, 3],
    ['similar', 15.1, 1], // > 15 °C; no priority-2 band on this basis
    ['similar', 30, 1],
    ['ambient', 0.5, null],
    ['ambient', 1, 4], // 1–10 °C
    ['ambient', 10, 4],
    ['ambient', 10.5, 3], // between bands → more severe
    ['ambient', 11, 3], // 11–20 °C
    ['ambient', 20, 3],
    ['ambient', 21, 2], // 21–40 °C
    ['ambient', 40, 2],
    ['ambient', 40.5, 1], // > 40 °C
    ['ambient', 80, 1],
  ];
  for (const [basis, riseC, priority] of rows) {
    it(`${basis} ΔT ${riseC} °C → ${priority === null ? 'below the table' : `priority ${priority}`}`, () => {
      const result = thermalPriority({ riseC, basis });
      assert.equal(result.priority, priority);
      assert.ok(result.action.length > 0);
    });
  }
  it('actions follow the table wording', () => {
    assert.match(thermalPriority({ riseC: 50, basis: 'ambient' }).action, /repair immediately/i);
    assert.match(thermalPriority({ riseC: 30, basis: 'ambient' }).action, /monitor/i);
    assert.match(thermalPriority({ riseC: 12, basis: 'ambient' }).action, /as time permits/i);
    assert.match(thermalPriority({ riseC: 2, basis: 'ambient' }).action, /investigation/i);
  });
  it('rejects a non-finite rise', () => {
    assert.throws(() => thermalPriority({ riseC: Number.NaN, basis: 'similar' }), RangeError);
  });
  it('property: a larger rise is never less severe; "similar" never gives priority 2', () => {
    const rank = (p: number | null): number => (p === null ? 5 : p);
    fc.assert(
      fc.property(
        fc.constantFrom<ThermalBasis>('similar', 'ambient'),
        fc.double({ min: -5, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 50, noNaN: true }),
        (basis, riseC, extra) => {
          const lo = thermalPriority({ riseC, basis }).priority;
          const hi = thermalPriority({ riseC: riseC + extra, basis }).priority;
          assert.ok(rank(hi) <= rank(lo));
          if (basis === 'similar') assert.notEqual(lo, 2);
        },
      ),
    );
  });
});

describe('loadCorrectedRiseC — ΔT_r = ΔT_m × (I_r / I_m)^n, Infraspection Institute 2023 [V]; n = 2 default [CP]', () => {
  const rows: { input: Parameters<typeof loadCorrectedRiseC>[0]; expected: number; note: string }[] = [
    { input: { riseC: 10, measuredA: 50, referenceA: 100 }, expected: 40, note: 'half load, n = 2 → ×4' },
    { input: { riseC: 10, measuredA: 50, referenceA: 100, exponent: 1.6 }, expected: 10 * 2 ** 1.6, note: 'n = 1.6' },
    { input: { riseC: 8, measuredA: 80, referenceA: 80 }, expected: 8, note: 'same current' },
    // never lowered at or above the reference load [CP] (REFERENCES "Thermography load correction"): was 9
    { input: { riseC: 36, measuredA: 120, referenceA: 60 }, expected: 36, note: 'above the reference load: as measured' },
  ];
  for (const { input, expected, note } of rows) {
    it(`${input.riseC} °C at ${input.measuredA} A → ${input.referenceA} A (${note})`, () => {
      assert.ok(Math.abs((loadCorrectedRiseC(input) ?? NaN) - expected) < 1e-9);
    });
  }
  it('rejects a reading taken at no load', () => {
    assert.throws(() => loadCorrectedRiseC({ riseC: 5, measuredA: 0, referenceA: 100 }), RangeError);
  });
});

describe('light-load readings — NFPA 70B 2023, surveys under at least 40 % of normal load [V]', () => {
  it('THERMOGRAPHY_LOAD_MIN_FRACTION is 0.4', () => {
    assert.equal(THERMOGRAPHY_LOAD_MIN_FRACTION, 0.4);
  });
  const rows: [number, number, boolean][] = [[39, 100, true], [40, 100, false], [80, 100, false], [0, 20, true], [8, 20, false]];
  for (const [measuredA, normalA, light] of rows) {
    it(`${measuredA} A of ${normalA} A normal → ${light ? 'light load' : 'enough load'}`, () => {
      assert.equal(takenUnderLightLoad({ measuredA, normalA }), light);
      assert.equal(lightLoadNote({ measuredA, normalA }) !== null, light);
    });
  }
  it('the note says the percentage and the 40 %', () => {
    assert.match(lightLoadNote({ measuredA: 25, normalA: 100 }) ?? '', /25 %.*40 %/);
  });
  it('rejects an unknown normal load', () => {
    assert.throws(() => takenUnderLightLoad({ measuredA: 5, normalA: 0 }), RangeError);
  });
});

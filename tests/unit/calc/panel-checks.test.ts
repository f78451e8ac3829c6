/**
 * The panel checks of issue 13 items 7–11, table-driven, each against its source (REFERENCES.md).
 * [V] seen in a published excerpt; [M] from memory; [CP] common practice / our own rule.
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import type { InsulationTempC } from '../../../shared/domain';
import {
  NEUTRAL_CAUTION,
  ambientCorrectionFactor,
  bundlingAdjustmentFactor,
  compareMeasured,
  componentTempCheck,
  conductorCheck,
  displayTemp,
  faultCurrentCheck,
  freePositionsFor,
  neutralCurrentA,
  riseTrend,
  spareCapacity,
  toCelsius,
} from '../../../shared/calc';

describe('faultCurrentCheck — NEC 110.9, 110.10, 110.24, 240.86 [V]', () => {
  const breakers = [
    { id: 'a', label: 'Position 1 (20 A)', interruptingKA: 10 },
    { id: 'b', label: 'Position 3 (20 A)', interruptingKA: 22 },
    { id: 'c', label: 'Position 5 (30 A)', interruptingKA: null },
  ];
  it('a breaker rated below the available fault current is flagged; one equal to it is adequate ("at least equal")', () => {
    const r = faultCurrentCheck({ availableKA: 22, panelRatingKA: 22, breakers });
    assert.equal(r.judged, true);
    if (!r.judged) return;
    assert.deepEqual(r.findings.map((f) => f.id), ['a']);
    assert.match(r.findings[0].message, /10 kA; 22 kA is available \(NEC 110\.9\)/);
    assert.deepEqual(r.notRecorded, ['Position 5 (30 A)']);
    assert.equal(r.seriesNote, null);
  });
  it('a panel whose short-circuit rating is below the available current is flagged (110.10)', () => {
    const r = faultCurrentCheck({ availableKA: 14, panelRatingKA: 10, breakers: [] });
    assert.ok(r.judged && r.findings[0].subject === 'panel' && /110\.10/.test(r.findings[0].message));
  });
  it('nothing is judged without a recorded available fault current: it is recorded, never computed', () => {
    const r = faultCurrentCheck({ availableKA: null, panelRatingKA: 10, breakers });
    assert.equal(r.judged, false);
    assert.match(!r.judged ? r.reason : '', /110\.24/);
  });
  it('a series-rated panel keeps the finding and adds the 240.86 caution', () => {
    const r = faultCurrentCheck({ availableKA: 22, panelRatingKA: 22, breakers, seriesRated: true });
    assert.ok(r.judged && r.findings.length === 1 && /240\.86/.test(r.seriesNote ?? ''));
  });
  it('refuses a negative or NaN figure', () => {
    assert.throws(() => faultCurrentCheck({ availableKA: Number.NaN, panelRatingKA: 10, breakers: [] }), RangeError);
    assert.throws(() => faultCurrentCheck({ availableKA: 10, panelRatingKA: -5, breakers: [] }), RangeError);
    assert.throws(
      () => faultCurrentCheck({ availableKA: 10, panelRatingKA: 10, breakers: [{ id: 'x', label: 'x', interruptingKA: 0 }] }),
      RangeError,
    );
  });
});

describe('spareCapacity — NEC 220.87 (existing load at 125 % of the measured peak + the new load) [V, wording M]', () => {
  const base = {
    system: '120/240V-1ph-3w' as const,
    spaces: 12,
    circuits: [
      { id: '1', position: 1, poles: 1 },
      { id: '2', position: 2, poles: 1 },
      { id: '3', position: 3, poles: 1 },
    ],
    panelRatingA: 200,
    basis: 'year' as const,
  };
  // "can this panel take a 30 A 2-pole at 240 V?" — taken at its full 7 200 VA
  const newLoad = { va: 7200, volts: 240, poles: 2 as const, continuous: false };
  it('100 A peak from a year of data: 125 A + 30 A = 155 A ≤ 200 A, fits with 45 A to spare, at positions 4 and 6', () => {
    const r = spareCapacity({ ...base, peakDemandA: 100, newLoad });
    assert.equal(r.existingA, 125);
    assert.equal(r.newLoadA, 30);
    assert.equal(r.totalA, 155);
    assert.equal(r.fits, true);
    assert.equal(r.headroomA, 45);
    assert.deepEqual(r.positions, [4, 6]);
    assert.match(r.rule, /NEC 220\.87.*a year of demand data/);
  });
  it('140 A peak: 175 A + 30 A = 205 A > 200 A, does not fit', () => {
    const r = spareCapacity({ ...base, peakDemandA: 140, newLoad });
    assert.equal(r.fits, false);
    assert.equal(r.headroomA, -5);
  });
  it('the feeder limits when its rating is lower than the panel’s', () => {
    const r = spareCapacity({ ...base, feederRatingA: 150, peakDemandA: 100, newLoad });
    assert.equal(r.limitedBy, 'feeder');
    assert.equal(r.fits, false);
  });
  it('a continuous new load counts at 125 % (210.19(A), 215.2(A)) [V]', () => {
    const r = spareCapacity({ ...base, peakDemandA: 0, newLoad: { ...newLoad, continuous: true } });
    assert.equal(r.newLoadA, 37.5);
  });
  it('a 3-pole new load on 208 V: VA / (√3 × 208) [handbook]', () => {
    const r = spareCapacity({
      ...base,
      system: '208Y/120V-3ph-4w',
      peakDemandA: 0,
      newLoad: { va: 10_000, volts: 208, poles: 3, continuous: false },
    });
    assert.ok(Math.abs(r.newLoadA - 27.757) < 0.001);
  });
  it('no free run of positions → positions null; refuses bad input', () => {
    const full = Array.from({ length: 12 }, (_, i) => ({ id: String(i), position: i + 1, poles: 1 }));
    assert.equal(freePositionsFor({ system: '120/240V-1ph-3w', spaces: 12 }, full, 1), null);
    assert.throws(() => spareCapacity({ ...base, peakDemandA: Number.NaN, newLoad }), RangeError);
    assert.throws(() => spareCapacity({ ...base, peakDemandA: -1, newLoad }), RangeError);
    assert.throws(() => spareCapacity({ ...base, peakDemandA: 10, newLoad: { ...newLoad, poles: 3 } }), RangeError);
  });
});

describe('neutralCurrentA — phasor sum of three linear phase currents [V]', () => {
  const rows: [number, number, number, number][] = [
    [100, 100, 100, 0], // balanced: no neutral current
    [100, 100, 0, 100],
    [100, 0, 0, 100],
    [100, 80, 60, Math.sqrt(1200)], // 34.64 A
  ];
  for (const [a, b, c, n] of rows) {
    it(`${a} / ${b} / ${c} A → ${n.toFixed(2)} A`, () => assert.ok(Math.abs(neutralCurrentA(a, b, c) - n) < 1e-9));
  }
  it('carries the non-linear-load caution [CP] and refuses bad input', () => {
    assert.match(NEUTRAL_CAUTION, /non-linear/);
    assert.throws(() => neutralCurrentA(-1, 0, 0), RangeError);
    assert.throws(() => neutralCurrentA(Number.NaN, 0, 0), RangeError);
  });
  it('compares measured with calculated amps per phase', () => {
    const r = compareMeasured({ A: 42, B: 30 }, { A: 40, B: 0, C: 10 });
    assert.deepEqual(r.map((x) => [x.phase, x.differenceA, x.ratio]), [['A', 2, 1.05], ['B', 30, null]]);
  });
});

describe('ambientCorrectionFactor — Table 310.15(B)(1) [M], oracle √((Tc − Ta)/(Tc − 30)) of 310.15(B) [V]', () => {
  // the top of each row's range; at or above the insulation's rating the conductor may not be used
  const tops = [10, 15, 20, 25, 30, 35, 40, 45, 50, 55, 60, 65, 70, 75, 80, 85, 90];
  for (const tc of [60, 75, 90] as InsulationTempC[]) {
    for (const ta of tops) {
      const expected = ta < tc ? Math.round(100 * Math.sqrt((tc - ta) / (tc - 30))) / 100 : null;
      it(`${tc} °C insulation at ${ta} °C → ${expected ?? 'not allowed'}`, () => {
        assert.equal(ambientCorrectionFactor(ta, tc), expected);
      });
    }
  }
  it('a part-degree ambient reads the next row (30.5 °C → 31–35 °C row)', () => {
    assert.equal(ambientCorrectionFactor(30.5, 90), 0.96);
  });
  it('60 °C insulation is not allowed from 56 °C', () => assert.equal(ambientCorrectionFactor(58, 60), null));
});

describe('bundlingAdjustmentFactor — Table 310.15(C)(1) [V]', () => {
  const rows: [number, number][] = [[3, 1], [4, 0.8], [6, 0.8], [7, 0.7], [9, 0.7], [10, 0.5], [20, 0.5], [21, 0.45], [30, 0.45], [31, 0.4], [40, 0.4], [41, 0.35]];
  for (const [n, f] of rows) it(`${n} current-carrying conductors → ${f}`, () => assert.equal(bundlingAdjustmentFactor(n), f));
  it('refuses 0 or a fraction', () => {
    assert.throws(() => bundlingAdjustmentFactor(0), RangeError);
    assert.throws(() => bundlingAdjustmentFactor(4.5), RangeError);
  });
});

describe('conductorCheck with corrections — 310.15(B)(1), 310.15(C)(1), ending at the termination column (110.14(C)) [V]', () => {
  const thhn12 = { size: '12' as const, material: 'Cu' as const, insulationTempC: 90 as const, terminalTempC: 60 as const };
  it('12 AWG THHN, 9 conductors: 30 A × 0.7 = 21 A, capped at 20 A by the 60 °C terminations → 20 A breaker ok [CP worked example]', () => {
    const r = conductorCheck({ ...thhn12, ratingA: 20, currentCarrying: 9 });
    assert.equal(r.ampacityA, 20);
    assert.equal(r.correctionFactor, 0.7);
    assert.equal(r.ok, true);
  });
  it('12 AWG THHN, 50 °C and 5 conductors: 30 × 0.82 × 0.8 = 19.68 A, next size up 20 A (240.4(B)) → 20 A ok', () => {
    const r = conductorCheck({ ...thhn12, ratingA: 20, ambientC: 50, currentCarrying: 5 });
    assert.ok(Math.abs((r.ampacityA ?? 0) - 19.68) < 1e-9);
    assert.equal(r.nextSizeUpApplied, true);
    assert.equal(r.ok, true);
  });
  it('12 AWG THHN, 12 conductors: 30 × 0.5 = 15 A → a 20 A breaker is too big', () => {
    const r = conductorCheck({ ...thhn12, ratingA: 20, currentCarrying: 12 });
    assert.equal(r.ampacityA, 15);
    assert.equal(r.ok, false);
    assert.match(r.reasons[0], /15 A at 60 °C.*Table 310\.15\(C\)\(1\)/);
  });
  it('60 °C insulation at 58 °C ambient may not be used', () => {
    const r = conductorCheck({ size: '10', material: 'Cu', insulationTempC: 60, ratingA: 30, ambientC: 58 });
    assert.equal(r.ok, false);
    assert.match(r.reasons[0], /may not be used at 58 °C/);
  });
  it('with neither recorded the answer is Table 310.16 at the termination column, as before', () => {
    const r = conductorCheck({ ...thhn12, ratingA: 20 });
    assert.equal(r.ampacityA, 20);
    assert.equal(r.correctionFactor, 1);
    assert.equal(r.correctionBasis, null);
  });
});

describe('thermography records — component temperature, trend, °F display', () => {
  it('a component at or above its insulation / termination rating is over (NEC 110.14(C) ratings) [V]', () => {
    assert.equal(componentTempCheck({ componentC: 82, ratingC: 75 }).over, true);
    assert.equal(componentTempCheck({ componentC: 75, ratingC: 75 }).over, true);
    assert.equal(componentTempCheck({ componentC: 41, ratingC: 75 }).marginC, 34);
    assert.throws(() => componentTempCheck({ componentC: Number.NaN, ratingC: 75 }), RangeError);
  });
  it('a rise more than 3 °C above every earlier survey deviates (NFPA 70B condition 2 [V]; threshold [CP])', () => {
    const t = riseTrend([
      { takenOn: '2026-01-10', riseC: 4 },
      { takenOn: '2024-01-12', riseC: 2 },
      { takenOn: '2025-01-11', riseC: 3 },
    ]);
    assert.deepEqual(t.points.map((p) => p.takenOn), ['2024-01-12', '2025-01-11', '2026-01-10']);
    assert.equal(t.changeC, 1);
    assert.equal(t.deviates, false);
    const grown = riseTrend([{ takenOn: '2025-01-11', riseC: 3 }, { takenOn: '2026-01-10', riseC: 9 }]);
    assert.equal(grown.deviates, true);
    assert.match(grown.message ?? '', /condition 2/);
    assert.equal(riseTrend([{ takenOn: '2026-01-10', riseC: 9 }]).changeC, null);
    assert.throws(() => riseTrend([{ takenOn: '10/01/2026', riseC: 9 }]), RangeError);
  });
  it('°F display: an absolute temperature adds 32, a rise does not (NIST SP 811) [V]', () => {
    assert.equal(displayTemp(100, 'F', 'absolute'), '212 °F');
    assert.equal(displayTemp(10, 'F', 'rise'), '18 °F');
    assert.equal(displayTemp(21.25, 'C', 'absolute'), '21.3 °C');
    assert.equal(toCelsius(212, 'F', 'absolute'), 100);
    assert.equal(toCelsius(18, 'F', 'rise'), 10);
    assert.throws(() => displayTemp(Number.NaN, 'C', 'rise'), RangeError);
  });
});

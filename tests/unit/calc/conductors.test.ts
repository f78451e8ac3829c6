import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import type { ConductorMaterial, ConductorSize, InsulationTempC } from '../../../shared/domain';
import {
  STANDARD_RATINGS_A,
  ampacity,
  conductorCheck,
  nextStandardRatingA,
  smallConductorLimitA,
} from '../../../shared/calc';

const T310_16 = 'NEC Table 310.16 (310.15(B)(16) in 2017), 2014/2017 text [V]';

// [size, Cu 60/75/90, Al 60/75/90] as printed in REFERENCES.md from the 2014/2017 text
const TABLE: [ConductorSize, [number, number, number], [number, number, number] | null][] = [
  ['14', [15, 20, 25], null],
  ['12', [20, 25, 30], [15, 20, 25]],
  ['10', [30, 35, 40], [25, 30, 35]],
  ['8', [40, 50, 55], [35, 40, 45]],
  ['6', [55, 65, 75], [40, 50, 55]],
  ['4', [70, 85, 95], [55, 65, 75]],
  ['3', [85, 100, 115], [65, 75, 85]],
  ['2', [95, 115, 130], [75, 90, 100]],
  ['1', [110, 130, 145], [85, 100, 115]],
  ['1/0', [125, 150, 170], [100, 120, 135]],
  ['2/0', [145, 175, 195], [115, 135, 150]],
  ['3/0', [165, 200, 225], [130, 155, 175]],
  ['4/0', [195, 230, 260], [150, 180, 205]],
  ['250', [215, 255, 290], [170, 205, 230]],
  ['300', [240, 285, 320], [195, 230, 260]],
  ['350', [260, 310, 350], [210, 250, 280]],
  ['400', [280, 335, 380], [225, 270, 305]],
  ['500', [320, 380, 430], [260, 310, 350]],
];
const TEMPS: InsulationTempC[] = [60, 75, 90];

describe(`ampacity — ${T310_16}`, () => {
  for (const [size, cu, al] of TABLE) {
    for (const [i, tempC] of TEMPS.entries()) {
      it(`Cu ${size} at ${tempC} °C → ${cu[i]} A`, () => {
        assert.equal(ampacity({ size, material: 'Cu', tempC }), cu[i]);
      });
      it(`Al ${size} at ${tempC} °C → ${al === null ? 'null (not listed)' : `${al[i]} A`}`, () => {
        assert.equal(ampacity({ size, material: 'Al', tempC }), al === null ? null : al[i]);
      });
    }
  }
  it('unknown size → null', () => {
    assert.equal(ampacity({ size: '750' as ConductorSize, material: 'Cu', tempC: 75 }), null);
  });
  it('pre-2011 value (Cu 14 AWG 60 °C = 20 A) is not used', () => {
    assert.equal(ampacity({ size: '14', material: 'Cu', tempC: 60 }), 15);
  });
});

describe('smallConductorLimitA — NEC 240.4(D), 2017–2023 [V]', () => {
  const rows: [ConductorSize, ConductorMaterial, number | null][] = [
    ['14', 'Cu', 15],
    ['12', 'Cu', 20],
    ['10', 'Cu', 30],
    ['8', 'Cu', null],
    ['12', 'Al', 15],
    ['10', 'Al', 25],
    ['14', 'Al', null], // not a listed aluminium size
    ['8', 'Al', null],
    ['250', 'Cu', null],
  ];
  for (const [size, material, expected] of rows) {
    it(`${material} ${size} → ${expected}`, () => {
      assert.equal(smallConductorLimitA(size, material), expected);
    });
  }
});

describe('STANDARD_RATINGS_A — NEC 240.6(A), 2023 [V]', () => {
  it('is the 2023 list (breakers and fuses), without the 601 A seen in 2017 material', () => {
    assert.deepEqual([...STANDARD_RATINGS_A], [
      15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350,
      400, 450, 500, 600, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
    ]);
  });
  const rows: [number, number | null][] = [[65, 70], [70, 70], [255, 300], [380, 400], [601, 700], [6001, null]];
  for (const [amps, next] of rows) {
    it(`next standard rating at or above ${amps} A → ${next}`, () => {
      assert.equal(nextStandardRatingA(amps), next);
    });
  }
});

describe('conductorCheck — NEC Table 310.16, 110.14(C), 240.4(B), 240.4(D) [V]; 240.4(B) conditions from memory', () => {
  const rows: {
    source: string;
    input: Parameters<typeof conductorCheck>[0];
    ok: boolean;
    allowedA: number | null;
    nextSizeUp?: boolean;
    reasons: number;
  }[] = [
    // terminations marked 75 °C unless the row says otherwise (NEC 110.14(C)(1)(a)(3))
    { source: '240.4(D): 12 Cu limited to 20 A though 25 A at 75 °C', input: { ratingA: 20, size: '12', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: true, allowedA: 20, reasons: 0 },
    { source: '240.4(D): 12 Cu on 25 A fails', input: { ratingA: 25, size: '12', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: false, allowedA: 20, reasons: 1 },
    { source: 'Table 310.16 + 240.4(D): 12 Cu on 30 A fails twice', input: { ratingA: 30, size: '12', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: false, allowedA: 20, reasons: 2 },
    { source: '240.4(D): 14 Cu 15 A', input: { ratingA: 15, size: '14', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: true, allowedA: 15, reasons: 0 },
    { source: 'Table 310.16 60 °C: 10 Cu on 30 A', input: { ratingA: 30, size: '10', material: 'Cu', insulationTempC: 60, terminalTempC: 75 }, ok: true, allowedA: 30, reasons: 0 },
    { source: '110.14(C): 60 °C terminals, 10 Cu 90 °C wire → 30 A', input: { ratingA: 30, size: '10', material: 'Cu', insulationTempC: 90, terminalTempC: 60 }, ok: true, allowedA: 30, reasons: 0 },
    { source: 'Table 310.16 75 °C: 8 Cu 50 A', input: { ratingA: 50, size: '8', material: 'Cu', insulationTempC: 75, terminalTempC: 75 }, ok: true, allowedA: 50, reasons: 0 },
    { source: 'Table 310.16 75 °C: 8 Cu on 60 A fails', input: { ratingA: 60, size: '8', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: false, allowedA: 50, reasons: 1 },
    { source: 'lower of insulation and terminal: 8 Cu 60 °C insulation → 40 A', input: { ratingA: 45, size: '8', material: 'Cu', insulationTempC: 60, terminalTempC: 75 }, ok: false, allowedA: 40, reasons: 1 },
    { source: '240.4(B): 6 Cu 65 A → 70 A device', input: { ratingA: 70, size: '6', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: true, allowedA: 70, nextSizeUp: true, reasons: 0 },
    { source: '240.4(B): 6 Cu on 80 A fails', input: { ratingA: 80, size: '6', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: false, allowedA: 70, nextSizeUp: true, reasons: 1 },
    { source: 'Table 310.16: 3 Cu 100 A is standard, no next size', input: { ratingA: 110, size: '3', material: 'Cu', insulationTempC: 75, terminalTempC: 75 }, ok: false, allowedA: 100, nextSizeUp: false, reasons: 1 },
    { source: '240.4(B): 1/0 Al 120 A → 125 A', input: { ratingA: 125, size: '1/0', material: 'Al', insulationTempC: 75, terminalTempC: 75 }, ok: true, allowedA: 125, nextSizeUp: true, reasons: 0 },
    { source: '240.4(B): 4/0 Al 180 A → 200 A', input: { ratingA: 200, size: '4/0', material: 'Al', insulationTempC: 90, terminalTempC: 75 }, ok: true, allowedA: 200, nextSizeUp: true, reasons: 0 },
    { source: '240.4(B): 250 Cu 255 A → 300 A', input: { ratingA: 300, size: '250', material: 'Cu', insulationTempC: 75, terminalTempC: 75 }, ok: true, allowedA: 300, nextSizeUp: true, reasons: 0 },
    { source: '240.4(B): 250 Cu on 350 A fails', input: { ratingA: 350, size: '250', material: 'Cu', insulationTempC: 75, terminalTempC: 75 }, ok: false, allowedA: 300, reasons: 1 },
    { source: '240.4(B): 500 Cu 380 A → 400 A', input: { ratingA: 400, size: '500', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: true, allowedA: 400, nextSizeUp: true, reasons: 0 },
    { source: '90 °C terminals allowed when given: 4 Cu 95 A → 100 A', input: { ratingA: 100, size: '4', material: 'Cu', insulationTempC: 90, terminalTempC: 90 }, ok: true, allowedA: 100, nextSizeUp: true, reasons: 0 },
    { source: '240.4(D) Al: 10 Al on 30 A fails (25 A limit)', input: { ratingA: 30, size: '10', material: 'Al', insulationTempC: 75, terminalTempC: 75 }, ok: false, allowedA: 25, reasons: 1 },
    { source: 'Table 310.16 lists no Al 14 AWG', input: { ratingA: 15, size: '14', material: 'Al', insulationTempC: 75, terminalTempC: 75 }, ok: false, allowedA: null, reasons: 1 },
  ];
  for (const row of rows) {
    it(row.source, () => {
      const result = conductorCheck(row.input);
      assert.equal(result.ok, row.ok);
      assert.equal(result.allowedA, row.allowedA);
      assert.equal(result.reasons.length, row.reasons);
      if (row.nextSizeUp !== undefined) assert.equal(result.nextSizeUpApplied, row.nextSizeUp);
    });
  }
  it('unknown terminations follow NEC 110.14(C)(1) [V]: 60 °C at 100 A or less or 14–1 AWG, else 75 °C (no longer 75 °C by default)', () => {
    assert.equal(conductorCheck({ ratingA: 20, size: '10', material: 'Cu', insulationTempC: 90 }).tempC, 60);
    assert.equal(conductorCheck({ ratingA: 20, size: '10', material: 'Cu', insulationTempC: 60 }).tempC, 60);
    assert.equal(conductorCheck({ ratingA: 20, size: '10', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }).tempC, 75);
    assert.equal(conductorCheck({ ratingA: 150, size: '1/0', material: 'Cu', insulationTempC: 90 }).tempC, 75);
  });
});

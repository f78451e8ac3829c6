import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { CONDUCTOR_SIZES } from '../../../shared/domain';
import type { ConductorMaterial, ConductorSize } from '../../../shared/domain';
import { TABLE_8_OHM_PER_KFT, resistanceOhmPerKft, voltageDrop } from '../../../shared/calc';

const close = (actual: number, expected: number, relTol: number): void => {
  assert.ok(Math.abs(actual - expected) <= relTol * Math.abs(expected), `${actual} ≉ ${expected}`);
};

describe('resistanceOhmPerKft — NEC Chapter 9 Table 8, 75 °C, stranded [V] values seen', () => {
  const rows: [ConductorSize, ConductorMaterial, number][] = [
    ['14', 'Cu', 3.14], ['12', 'Cu', 1.98], ['10', 'Cu', 1.24], ['8', 'Cu', 0.778], ['6', 'Cu', 0.491],
    ['4', 'Cu', 0.308], ['2', 'Cu', 0.194], ['1/0', 'Cu', 0.122], ['4/0', 'Cu', 0.0608],
    ['250', 'Cu', 0.0515], ['500', 'Cu', 0.0258],
    ['12', 'Al', 3.25], ['4/0', 'Al', 0.1], ['500', 'Al', 0.0424],
  ];
  for (const [size, material, ohms] of rows) {
    it(`${material} ${size} → ${ohms} Ω/kft`, () => {
      assert.equal(resistanceOhmPerKft(size, material), ohms);
    });
  }
  it('Al 14 AWG is not on file → null', () => {
    assert.equal(resistanceOhmPerKft('14', 'Al'), null);
  });
});

// The AWG sizes are defined geometrically (d = 0.005 in × 92^((36 − n) / 39), ASTM B258), kcmil by
// name; REFERENCES.md gives K ≈ 12.9 Ω·cmil/ft (Cu) and 21.2 (Al) [V]. Every Table 8 entry — the
// ones seen and the ones filled from memory — must agree with K × 1 000 / cmil within 2 %.
function circularMils(size: ConductorSize): number {
  if (Number(size) >= 250) return Number(size) * 1000;
  const gauge = size.endsWith('/0') ? 1 - Number(size[0]) : Number(size);
  const mils = 5 * 92 ** ((36 - gauge) / 39);
  return mils * mils;
}
describe('Table 8 entries from memory — checked against K × 1 000 / cmil (REFERENCES.md K [V], AWG definition)', () => {
  it('AWG definition reproduces the cmil figures in REFERENCES.md within 0.3 %', () => {
    const seen: [ConductorSize, number][] = [
      ['14', 4110], ['12', 6530], ['10', 10380], ['8', 16510], ['6', 26240], ['4', 41740],
      ['3', 52620], ['2', 66360], ['1', 83690], ['1/0', 105600],
    ];
    for (const [size, cmil] of seen) close(circularMils(size), cmil, 0.003);
  });
  for (const material of ['Cu', 'Al'] as const) {
    for (const size of CONDUCTOR_SIZES) {
      const ohms = TABLE_8_OHM_PER_KFT[material][size];
      if (ohms === undefined) continue;
      it(`${material} ${size}: ${ohms} Ω/kft (from memory unless listed above) ≈ K/cmil`, () => {
        const k = material === 'Cu' ? 12.9 : 21.2;
        close(ohms, (k * 1000) / circularMils(size), 0.02);
      });
    }
  }
});

describe('voltageDrop — NEC Chapter 9 Table 8 resistances; 2·R·I·L/1000 (1φ), √3·R·I·L/1000 (3φ) [V]', () => {
  const rows: { source: string; input: Parameters<typeof voltageDrop>[0]; volts: number; percent: number }[] = [
    {
      source: '12 Cu 1φ 120 V, 16 A, 100 ft: 2 × 1.98 × 16 × 100 / 1000',
      input: { size: '12', material: 'Cu', amps: 16, lengthFt: 100, volts: 120, phases: 1 },
      volts: 6.336, percent: 5.28,
    },
    {
      source: '4/0 Cu 3φ 480 V, 200 A, 250 ft: √3 × 0.0608 × 200 × 250 / 1000',
      input: { size: '4/0', material: 'Cu', amps: 200, lengthFt: 250, volts: 480, phases: 3 },
      volts: Math.sqrt(3) * 3.04, percent: (100 * Math.sqrt(3) * 3.04) / 480,
    },
    {
      source: '500 Al 3φ 208 V, 300 A, 200 ft: √3 × 0.0424 × 300 × 200 / 1000',
      input: { size: '500', material: 'Al', amps: 300, lengthFt: 200, volts: 208, phases: 3 },
      volts: Math.sqrt(3) * 2.544, percent: (100 * Math.sqrt(3) * 2.544) / 208,
    },
    {
      source: '10 Cu 1φ 240 V, 24 A, 150 ft',
      input: { size: '10', material: 'Cu', amps: 24, lengthFt: 150, volts: 240, phases: 1 },
      volts: 8.928, percent: 3.72,
    },
  ];
  for (const row of rows) {
    it(row.source, () => {
      const result = voltageDrop(row.input);
      assert.ok(result !== null);
      close(result.volts, row.volts, 1e-9);
      close(result.percent, row.percent, 1e-9);
    });
  }
  it('agrees with the K-factor formula 2·K·I·L/CM (REFERENCES.md [V]) within 1 %', () => {
    const table = voltageDrop({ size: '12', material: 'Cu', amps: 16, lengthFt: 100, volts: 120, phases: 1 });
    close(table?.volts ?? 0, (2 * 12.9 * 16 * 100) / 6530, 0.01);
  });
  it('null for a size with no Table 8 entry on file; zero current → 0', () => {
    assert.equal(voltageDrop({ size: '14', material: 'Al', amps: 10, lengthFt: 50, volts: 120, phases: 1 }), null);
    assert.equal(voltageDrop({ size: '12', material: 'Cu', amps: 0, lengthFt: 50, volts: 120, phases: 1 })?.percent, 0);
  });
  it('rejects volts ≤ 0 and negative length', () => {
    assert.throws(() => voltageDrop({ size: '12', material: 'Cu', amps: 1, lengthFt: 50, volts: 0, phases: 1 }), RangeError);
    assert.throws(() => voltageDrop({ size: '12', material: 'Cu', amps: 1, lengthFt: -5, volts: 120, phases: 1 }), RangeError);
  });
  it('property: drop is linear in current and length; 3φ / 1φ = √3 / 2', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...CONDUCTOR_SIZES),
        fc.double({ min: 0.1, max: 400, noNaN: true }),
        fc.double({ min: 1, max: 1000, noNaN: true }),
        (size, amps, lengthFt) => {
          const base = { size, material: 'Cu' as const, volts: 208 };
          const one = voltageDrop({ ...base, amps, lengthFt, phases: 1 });
          const doubled = voltageDrop({ ...base, amps: 2 * amps, lengthFt, phases: 1 });
          const three = voltageDrop({ ...base, amps, lengthFt, phases: 3 });
          assert.ok(one !== null && doubled !== null && three !== null);
          close(doubled.volts, 2 * one.volts, 1e-12);
          close(three.volts / one.volts, Math.sqrt(3) / 2, 1e-12);
        },
      ),
    );
  });
});

import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { unit } from 'mathjs';
import type { ConductorSize } from '../../../shared/domain';
import { convertTorque, fallbackSocketTorque, fallbackTorque, torqueVerdict } from '../../../shared/calc';
import type { ScrewKind, SocketAcrossFlatsIn, TorqueUnit } from '../../../shared/calc';

const close = (actual: number, expected: number, relTol: number): void => {
  assert.ok(Math.abs(actual - expected) <= relTol * Math.max(Math.abs(expected), 1e-300), `${actual} ≉ ${expected}`);
};

const UNITS: TorqueUnit[] = ['N·m', 'lbf-in', 'lbf-ft'];
const MATHJS_NAME: Record<TorqueUnit, string> = { 'N·m': 'N m', 'lbf-in': 'lbf in', 'lbf-ft': 'lbf ft' };

describe('convertTorque — unit definitions (1 N·m = 8.850746 lbf-in [V]); mathjs as independent oracle', () => {
  const rows: [number, TorqueUnit, TorqueUnit, number, number][] = [
    // value, from, to, expected, relative tolerance
    [1, 'N·m', 'lbf-in', 8.850746, 1e-7], // REFERENCES.md, 7 significant figures
    [1, 'lbf-ft', 'lbf-in', 12, 1e-12], // 1 ft = 12 in by definition
    [20, 'lbf-in', 'N·m', 20 / 8.850746, 1e-7],
    [250, 'lbf-in', 'lbf-ft', 250 / 12, 1e-12],
    [0, 'N·m', 'lbf-ft', 0, 0],
  ];
  for (const [value, from, to, expected, tol] of rows) {
    it(`${value} ${from} → ${expected} ${to}`, () => {
      if (expected === 0) assert.equal(convertTorque(value, from, to), 0);
      else close(convertTorque(value, from, to), expected, tol);
    });
  }
  it('property: agrees with mathjs unit conversion for every unit pair (relative 1e-9)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1e5, noNaN: true }), fc.constantFrom(...UNITS), fc.constantFrom(...UNITS), (value, from, to) => {
        const oracle = unit(value, MATHJS_NAME[from]).toNumber(MATHJS_NAME[to]);
        close(convertTorque(value, from, to), oracle, 1e-9);
      }),
    );
  });
  it('property: converting there and back returns the value', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), fc.constantFrom(...UNITS), fc.constantFrom(...UNITS), (value, from, to) => {
        const back = convertTorque(convertTorque(value, from, to), to, from);
        assert.ok(Math.abs(back - value) <= 1e-12 * Math.max(1, Math.abs(value)));
      }),
    );
  });
});

describe('fallbackTorque — UL 486A-486B tightening torque table (NEC Informative Annex I) [V]', () => {
  // [sizes of the printed row, slotted ≤ 1.2 × 6.4 mm, slotted larger, split-bolt, other hex] as N·m (lbf-in)
  type Cell = [number, number] | null;
  const TABLE: [ConductorSize[], Cell, Cell, Cell, Cell][] = [
    [['14', '12', '10'], [2.3, 20], [4.0, 35], [9.0, 80], [8.5, 75]], // printed 30–10 AWG
    [['8'], [2.8, 25], [4.5, 40], [9.0, 80], [8.5, 75]],
    [['6', '4'], [4.0, 35], [5.1, 45], [18.6, 165], [12.4, 110]],
    [['3'], [4.0, 35], [5.6, 50], [31.1, 275], [16.9, 150]],
    [['2'], [4.5, 40], [5.6, 50], [31.1, 275], [16.9, 150]],
    [['1'], null, [5.6, 50], [31.1, 275], [16.9, 150]],
    [['1/0', '2/0'], null, [5.6, 50], [43.5, 385], [20.3, 180]],
    [['3/0', '4/0'], null, [5.6, 50], [56.5, 500], [28.2, 250]],
    [['250', '300', '350'], null, [5.6, 50], [73.4, 650], [36.7, 325]],
  ];
  const SCREWS: ScrewKind[] = ['slotted-small', 'slotted-large', 'split-bolt', 'hex'];
  for (const [sizes, ...cells] of TABLE) {
    for (const size of sizes) {
      for (const [i, screw] of SCREWS.entries()) {
        const cell = cells[i];
        it(`${size} ${screw} → ${cell === null ? 'no entry' : `${cell[0]} N·m (${cell[1]} lbf-in)`}`, () => {
          const result = fallbackTorque({ size, screw });
          if (cell === null) assert.equal(result, null);
          else assert.deepEqual(result, { nm: cell[0], lbfIn: cell[1], basis: 'UL 486A-486B fallback' });
        });
      }
    }
  }
  it('400 and 500 kcmil are not on file → null', () => {
    assert.equal(fallbackTorque({ size: '400', screw: 'hex' }), null);
    assert.equal(fallbackTorque({ size: '500', screw: 'split-bolt' }), null);
  });
  it('printed N·m and lbf-in agree with each other within the printing (±6 %)', () => {
    for (const [sizes, ...cells] of TABLE) {
      for (const cell of cells) if (cell !== null) close(convertTorque(cell[0], 'N·m', 'lbf-in'), cell[1], 0.06);
      assert.ok(sizes.length > 0);
    }
  });
});

describe('fallbackSocketTorque — UL 486A-486B internal-drive socket heads by across-flats [V]', () => {
  const rows: [SocketAcrossFlatsIn, number][] = [
    ['1/8', 45], ['5/32', 100], ['3/16', 120], ['7/32', 150], ['1/4', 200], ['5/16', 275], ['3/8', 375], ['1/2', 500], ['9/16', 600],
  ];
  for (const [size, lbfIn] of rows) {
    it(`${size} in → ${lbfIn} lbf-in`, () => {
      const result = fallbackSocketTorque(size);
      assert.equal(result?.lbfIn, lbfIn);
      close(result?.nm ?? 0, lbfIn / 8.850746, 1e-7);
    });
  }
});

describe('torqueVerdict — NEC 110.14(D) maker’s value governs [V]; ±10 % window [CP] common practice', () => {
  const rows: { name: string; input: Parameters<typeof torqueVerdict>[0]; asFound: string | null; asLeft: string; warnings: number }[] = [
    { name: 'on the value', input: { specified: 20, asLeft: 20, unit: 'lbf-in' }, asFound: null, asLeft: 'ok', warnings: 0 },
    { name: '−10 % edge is ok', input: { specified: 20, asLeft: 18, unit: 'lbf-in' }, asFound: null, asLeft: 'ok', warnings: 0 },
    { name: 'under −10 % is loose (and warns)', input: { specified: 20, asLeft: 17.9, unit: 'lbf-in' }, asFound: null, asLeft: 'loose', warnings: 1 },
    { name: '+10 % edge is ok', input: { specified: 20, asLeft: 22, unit: 'lbf-in' }, asFound: null, asLeft: 'ok', warnings: 0 },
    { name: 'over +10 % is over (and warns)', input: { specified: 20, asLeft: 22.1, unit: 'lbf-in' }, asFound: null, asLeft: 'over', warnings: 1 },
    { name: 'found loose, left right', input: { specified: 50, asFound: 30, asLeft: 50, unit: 'lbf-in' }, asFound: 'loose', asLeft: 'ok', warnings: 0 },
    { name: 'found over', input: { specified: 10, asFound: 12, asLeft: 10, unit: 'N·m' }, asFound: 'over', asLeft: 'ok', warnings: 0 },
    { name: 'a ±5 % setting: −5 % ok, −5.5 % loose', input: { specified: 20, asFound: 19, asLeft: 18.9, unit: 'lbf-in', tolerancePct: 5 }, asFound: 'ok', asLeft: 'loose', warnings: 1 },
    { name: 'specified 4.0 N·m (35.4 lbf-in) on a small slotted screw, 12 AWG: > 1.5 × 20 lbf-in → warning [CP]', input: { specified: 4.0, asLeft: 4.0, unit: 'N·m', size: '12', screw: 'slotted-small' }, asFound: null, asLeft: 'ok', warnings: 1 },
    // 40 % or more above the table warns [CP] (was 1.5×: 46 % passed in silence)
    { name: 'specified 3.3 N·m (29.2 lbf-in) on the same screw: 46 % above → check the maker’s value', input: { specified: 3.3, asLeft: 3.3, unit: 'N·m', size: '12', screw: 'slotted-small' }, asFound: null, asLeft: 'ok', warnings: 1 },
    { name: 'specified 3.1 N·m (27.4 lbf-in) on the same screw: 37 % above → no warning', input: { specified: 3.1, asLeft: 3.1, unit: 'N·m', size: '12', screw: 'slotted-small' }, asFound: null, asLeft: 'ok', warnings: 0 },
    { name: 'specified 40 lbf-ft (480 lbf-in) on a 4/0 hex lug: > 1.5 × 250 → warning', input: { specified: 40, asLeft: 40, unit: 'lbf-ft', size: '4/0', screw: 'hex' }, asFound: null, asLeft: 'ok', warnings: 1 },
    { name: 'no fallback entry (1 AWG small slotted) → no comparison', input: { specified: 100, asLeft: 100, unit: 'lbf-in', size: '1', screw: 'slotted-small' }, asFound: null, asLeft: 'ok', warnings: 0 },
  ];
  for (const row of rows) {
    it(row.name, () => {
      const result = torqueVerdict(row.input);
      assert.equal(result.asFound, row.asFound);
      assert.equal(result.asLeft, row.asLeft);
      assert.equal(result.warnings.length, row.warnings, result.warnings.join(' | '));
    });
  }
  it('the far-above warning names the table value and asks to confirm the maker’s figure', () => {
    const [warning] = torqueVerdict({ specified: 4.0, asLeft: 4.0, unit: 'N·m', size: '12', screw: 'slotted-small' }).warnings;
    assert.match(warning, /20 lbf-in/);
    assert.match(warning, /maker/);
  });
  it('rejects a specified torque of 0', () => {
    assert.throws(() => torqueVerdict({ specified: 0, asLeft: 1, unit: 'N·m' }), RangeError);
  });
});

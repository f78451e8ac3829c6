import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { addMonthsUTC, nextDueDate } from '../../../shared/calc';

describe('nextDueDate — NFPA 70B 2023 condition-based intervals', () => {
  const rows: { source: string; input: Parameters<typeof nextDueDate>[0]; dueOn: string | null; months?: number; verified?: boolean }[] = [
    { source: 'panelboard, condition 1 → 60 months [V]', input: { equipment: 'panelboard', condition: 1, task: 'maintenance', lastDoneOn: '2023-03-15' }, dueOn: '2028-03-15', months: 60, verified: true },
    { source: 'panelboard, condition 2 → 36 months (from memory)', input: { equipment: 'panelboard', condition: 2, task: 'maintenance', lastDoneOn: '2023-03-15' }, dueOn: '2026-03-15', months: 36, verified: false },
    { source: 'panelboard, condition 3 → 12 months (from memory)', input: { equipment: 'panelboard', condition: 3, task: 'maintenance', lastDoneOn: '2023-03-15' }, dueOn: '2024-03-15', months: 12, verified: false },
    { source: 'load centre is a panelboard, condition 1 → 60 months [V]', input: { equipment: 'load-centre', condition: 1, task: 'maintenance', lastDoneOn: '2020-06-30' }, dueOn: '2025-06-30', months: 60 },
    { source: 'thermography, condition 1 → 12 months [V]', input: { equipment: 'panelboard', condition: 1, task: 'thermography', lastDoneOn: '2024-02-29' }, dueOn: '2025-02-28', months: 12, verified: true },
    { source: 'thermography, condition 2 → 12 months [V]', input: { equipment: 'switchboard', condition: 2, task: 'thermography', lastDoneOn: '2024-05-01' }, dueOn: '2025-05-01', months: 12 },
    { source: 'thermography, condition 3 → 6 months [V]', input: { equipment: 'panelboard', condition: 3, task: 'thermography', lastDoneOn: '2023-08-31' }, dueOn: '2024-02-29', months: 6 },
    { source: 'switchboard maintenance: no interval on file → null', input: { equipment: 'switchboard', condition: 1, task: 'maintenance', lastDoneOn: '2023-01-01' }, dueOn: null },
  ];
  for (const row of rows) {
    it(row.source, () => {
      const result = nextDueDate(row.input);
      if (row.dueOn === null) {
        assert.equal(result, null);
        return;
      }
      assert.ok(result !== null);
      assert.equal(result.dueOn, row.dueOn);
      if (row.months !== undefined) assert.equal(result.intervalMonths, row.months);
      if (row.verified !== undefined) assert.equal(result.verified, row.verified);
      assert.match(result.basis, /NFPA 70B 2023/);
      if (row.verified === false) assert.match(result.basis, /from memory/);
    });
  }
});

describe('addMonthsUTC — calendar months, UTC, month-end clamp', () => {
  const rows: [string, number, string][] = [
    ['2023-01-31', 1, '2023-02-28'],
    ['2024-01-31', 1, '2024-02-29'], // leap year
    ['2024-02-29', 12, '2025-02-28'],
    ['2024-02-29', 48, '2028-02-29'],
    ['2023-10-31', 1, '2023-11-30'],
    ['2023-12-15', 1, '2024-01-15'],
    ['2023-11-30', 3, '2024-02-29'],
    ['2100-01-31', 1, '2100-02-28'], // 2100 is not a leap year
    ['2000-01-31', 1, '2000-02-29'], // 2000 is
    ['2024-03-31', -1, '2024-02-29'],
    ['2023-05-10', 0, '2023-05-10'],
  ];
  for (const [date, months, expected] of rows) {
    it(`${date} + ${months} months → ${expected}`, () => {
      assert.equal(addMonthsUTC(date, months), expected);
    });
  }
  for (const bad of ['2023-02-30', '2023-13-01', '2023-00-10', '2023/01/01', '', '2023-1-1']) {
    it(`rejects "${bad}"`, () => {
      assert.throws(() => addMonthsUTC(bad, 1), RangeError);
    });
  }
  it('property: for days ≤ 28, adding then subtracting months returns the date; results are real dates', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1900, max: 2200 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 31 }),
        fc.integer({ min: -240, max: 240 }),
        (year, month, dayWanted, months) => {
          const last = new Date(Date.UTC(year, month, 0)).getUTCDate();
          const day = Math.min(dayWanted, last);
          const date = `${year}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
          const result = addMonthsUTC(date, months);
          const parsed = new Date(`${result}T00:00:00Z`);
          assert.equal(parsed.toISOString().slice(0, 10), result);
          if (day <= 28) assert.equal(addMonthsUTC(result, -months), date);
          const monthsApart = (parsed.getUTCFullYear() - year) * 12 + (parsed.getUTCMonth() + 1 - month);
          assert.equal(monthsApart, months);
        },
      ),
    );
  });
});

import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import { nuisanceTripFindings } from '../../../shared/calc';

// Basis for every row: trips well under the rating with a hot or loose termination point at the
// termination, not the breaker — [CP] common practice of the trade; thermal priority per
// ANSI/NETA MTS Table 100.18 [V].
describe('nuisanceTripFindings — [CP] common practice; hot = NETA MTS Table 100.18 priority 1–3 [V]', () => {
  const rows: { name: string; input: Parameters<typeof nuisanceTripFindings>[0]; suspect: boolean; low: number }[] = [
    {
      name: 'trips at 60 % + lug 20 °C over a similar one (P1) → suspect the termination',
      input: { ratingA: 20, trips: [{ at: '2024-05-01T10:00:00Z', loadA: 12 }], readings: [{ kind: 'thermal', riseC: 20, basis: 'similar' }] },
      suspect: true, low: 1,
    },
    {
      name: 'trips at 70 % + lug 25 °C over ambient (P2) → suspect',
      input: { ratingA: 100, trips: [{ at: '2024-05-01', loadA: 70 }, { at: '2024-05-03', loadA: 65 }], readings: [{ kind: 'thermal', riseC: 25, basis: 'ambient' }] },
      suspect: true, low: 2,
    },
    {
      name: 'trips at 50 % + torque found loose → suspect',
      input: { ratingA: 30, trips: [{ at: '2024-01-10', loadA: 15 }], readings: [{ kind: 'torque', verdict: 'loose' }] },
      suspect: true, low: 1,
    },
    {
      name: 'trips at 50 % + 12 °C over ambient (P3) → suspect',
      input: { ratingA: 30, trips: [{ at: '2024-01-10', loadA: 15 }], readings: [{ kind: 'thermal', riseC: 12, basis: 'ambient' }] },
      suspect: true, low: 1,
    },
    {
      name: 'trips at 50 % but only a 2 °C rise (P4) and torque ok → not suspect, advise checks',
      input: { ratingA: 30, trips: [{ at: '2024-01-10', loadA: 15 }], readings: [{ kind: 'thermal', riseC: 2, basis: 'similar' }, { kind: 'torque', verdict: 'ok' }] },
      suspect: false, low: 1,
    },
    {
      name: 'trips at 90 % with a hot lug → not a low-load trip, not suspect',
      input: { ratingA: 20, trips: [{ at: '2024-01-10', loadA: 18 }], readings: [{ kind: 'thermal', riseC: 30, basis: 'similar' }] },
      suspect: false, low: 0,
    },
    {
      name: 'exactly 80 % is not below 80 %',
      input: { ratingA: 20, trips: [{ at: '2024-01-10', loadA: 16 }], readings: [{ kind: 'torque', verdict: 'loose' }] },
      suspect: false, low: 0,
    },
    {
      name: 'no load recorded → cannot judge, asks for the load',
      input: { ratingA: 20, trips: [{ at: '2024-01-10' }, { at: '2024-01-11', loadA: null }], readings: [{ kind: 'torque', verdict: 'loose' }] },
      suspect: false, low: 0,
    },
    {
      name: 'no trips → nothing',
      input: { ratingA: 20, trips: [], readings: [{ kind: 'thermal', riseC: 50, basis: 'ambient' }] },
      suspect: false, low: 0,
    },
  ];
  for (const row of rows) {
    it(row.name, () => {
      const result = nuisanceTripFindings(row.input);
      assert.equal(result.suspectTermination, row.suspect);
      assert.equal(result.lowLoadTrips, row.low);
      if (row.suspect) assert.ok(result.reasons.some((r) => /suspect the termination, not the breaker/i.test(r)));
      else assert.ok(!result.reasons.some((r) => /suspect the termination/i.test(r)));
    });
  }
  it('counts what it saw and says why', () => {
    const result = nuisanceTripFindings({
      ratingA: 20,
      trips: [{ at: 'a', loadA: 10 }, { at: 'b' }],
      readings: [{ kind: 'thermal', riseC: 20, basis: 'similar' }, { kind: 'torque', verdict: 'loose' }, { kind: 'torque', verdict: 'over' }],
    });
    assert.deepEqual(
      [result.lowLoadTrips, result.tripsWithoutLoad, result.hotTerminations, result.looseTerminations],
      [1, 1, 1, 1],
    );
    assert.ok(result.reasons.some((r) => /under 80 %/.test(r)));
    assert.ok(result.reasons.some((r) => /priority 1/.test(r)));
    assert.ok(result.reasons.some((r) => /no load recorded/.test(r)));
  });
});

import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { instantaneousPickupCheck, netaMaxTripS300, tripBand, tripTestVerdict } from '../../../shared/calc';
import type { TripBandPoint } from '../../../shared/calc';

const close = (actual: number, expected: number, relTol = 1e-9): void => {
  assert.ok(Math.abs(actual - expected) <= relTol * Math.abs(expected), `${actual} ≉ ${expected}`);
};

// A made-up band for tests (not any maker's): decade-spaced so log–log values are easy by hand.
const BAND: TripBandPoint[] = [
  { multiple: 1.25, minS: 200, maxS: 4000 },
  { multiple: 2, minS: 10, maxS: 100 },
  { multiple: 8, minS: 1, maxS: 10 },
];

describe('tripBand — log–log interpolation of a time-current band [CP]', () => {
  const rows: [number, { minS: number; maxS: number } | null, string][] = [
    [2, { minS: 10, maxS: 100 }, 'on a point'],
    [8, { minS: 1, maxS: 10 }, 'last point'],
    [1.25, { minS: 200, maxS: 4000 }, 'first point'],
    [4, { minS: Math.sqrt(10), maxS: Math.sqrt(1000) }, 'geometric middle of 2× and 8× → geometric mean of times'],
    [2 * 4 ** 0.25, { minS: 10 ** 0.75, maxS: 10 ** 1.75 }, 'a quarter of the way in log multiple'],
    [1.2, null, 'below the band'],
    [10, null, 'above the band (no extrapolation)'],
  ];
  for (const [multiple, expected, note] of rows) {
    it(`${multiple.toFixed(3)}× → ${expected === null ? 'null' : `${expected.minS.toFixed(3)}–${expected.maxS.toFixed(3)} s`} (${note})`, () => {
      const result = tripBand(BAND, multiple);
      if (expected === null) {
        assert.equal(result, null);
      } else {
        assert.ok(result !== null);
        close(result.minS, expected.minS);
        close(result.maxS, expected.maxS);
      }
    });
  }
  it('points may come in any order', () => {
    assert.deepEqual(tripBand([...BAND].reverse(), 4), tripBand(BAND, 4));
  });
  it('no points → null; bad points throw', () => {
    assert.equal(tripBand([], 3), null);
    assert.throws(() => tripBand([{ multiple: 2, minS: 0, maxS: 1 }], 2), RangeError);
    assert.throws(() => tripBand([{ multiple: 2, minS: 5, maxS: 1 }], 2), RangeError);
    assert.throws(() => tripBand([{ multiple: 2, minS: 1, maxS: 5 }, { multiple: 2, minS: 2, maxS: 6 }], 2), RangeError);
  });

  const bandArb = fc
    .array(
      fc.record({
        multiple: fc.double({ min: 1.01, max: 100, noNaN: true }),
        minS: fc.double({ min: 0.01, max: 1e4, noNaN: true }),
        ratio: fc.double({ min: 1, max: 100, noNaN: true }),
      }),
      { minLength: 2, maxLength: 6 },
    )
    // an inverse-time band: both times fall (or stay) as the multiple rises (a rise is refused)
    .map((raw) => {
      const multiples = raw.map((p) => p.multiple).sort((a, b) => a - b);
      const mins = raw.map((p) => p.minS).sort((a, b) => b - a);
      const points = multiples.map((multiple, i) => ({ multiple, minS: mins[i], maxS: mins[i] * raw[i].ratio }));
      for (let i = points.length - 2; i >= 0; i -= 1) points[i].maxS = Math.max(points[i].maxS, points[i + 1].maxS);
      return points;
    })
    .filter((points) => new Set(points.map((p) => p.multiple)).size === points.length);

  it('property: interpolation stays inside the band (between the neighbouring points, min ≤ max)', () => {
    fc.assert(
      fc.property(bandArb, fc.double({ min: 0, max: 1, noNaN: true }), (points, t) => {
        const sorted = [...points].sort((a, b) => a.multiple - b.multiple);
        const lo = sorted[0].multiple;
        const hi = sorted[sorted.length - 1].multiple;
        const multiple = lo * (hi / lo) ** t;
        fc.pre(multiple >= lo && multiple <= hi);
        const result = tripBand(points, multiple);
        assert.ok(result !== null);
        const i = Math.max(0, sorted.findIndex((p) => p.multiple >= multiple) - 1);
        const a = sorted[i];
        const b = sorted[Math.min(i + 1, sorted.length - 1)];
        assert.ok(result.minS >= Math.min(a.minS, b.minS) && result.minS <= Math.max(a.minS, b.minS));
        assert.ok(result.maxS >= Math.min(a.maxS, b.maxS) && result.maxS <= Math.max(a.maxS, b.maxS));
        assert.ok(result.minS <= result.maxS);
      }),
    );
  });
  it('property: a power-law curve t = a × m^−b is reproduced exactly (straight line on log–log)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 0.5, max: 4, noNaN: true }),
        fc.double({ min: 1.5, max: 20, noNaN: true }),
        (a, b, m) => {
          const t = (x: number): number => a * x ** -b;
          const points = [1.5, 5, 20].map((x) => ({ multiple: x, minS: t(x), maxS: 3 * t(x) }));
          const result = tripBand(points, m);
          assert.ok(result !== null);
          close(result.minS, t(m), 1e-9);
          close(result.maxS, 3 * t(m), 1e-9);
        },
      ),
    );
  });
});

describe('netaMaxTripS300 — ANSI/NETA Table 100.7 at 300 %, FROM MEMORY, LOW CONFIDENCE [M]', () => {
  const rows: [number, number, number | null][] = [
    [20, 120, 50], [20, 480, 70], [30, 240, 50],
    [40, 240, 80], [50, 480, 100],
    [100, 208, 140], [100, 480, 160],
    [125, 240, 200], [150, 480, 250],
    [200, 208, 230], [225, 480, 275],
    [400, 240, 300], [400, 480, 350],
    [500, 240, null], [600, 480, 450],
    [800, 480, 500], [1000, 240, 600],
    [10, 120, null], [1200, 480, null], [100, 4160, null],
  ];
  for (const [ratingA, voltageV, expected] of rows) {
    it(`${ratingA} A at ${voltageV} V → ${expected} s (from memory, low confidence)`, () => {
      assert.equal(netaMaxTripS300({ ratingA, voltageV }), expected);
    });
  }
});

describe('tripTestVerdict — maker’s band first (ANSI/NETA ATS 7.6.1.1 [V]); NETA 300 % fallback [M, low confidence]; UL 489 100 % carry [V]', () => {
  const rows: {
    name: string;
    input: Parameters<typeof tripTestVerdict>[0];
    verdict: string | null;
    basis: string;
  }[] = [
    { name: 'maker band, inside → pass', input: { ratingA: 20, testA: 80, tripS: 20, band: BAND, voltageV: 120 }, verdict: 'pass', basis: 'maker-band' },
    { name: 'maker band, before minS → fast', input: { ratingA: 20, testA: 80, tripS: 2, band: BAND, voltageV: 120 }, verdict: 'fast', basis: 'maker-band' },
    { name: 'maker band, after maxS → slow', input: { ratingA: 20, testA: 80, tripS: 40, band: BAND, voltageV: 120 }, verdict: 'slow', basis: 'maker-band' },
    { name: 'maker band, did not trip → no-trip', input: { ratingA: 20, testA: 80, tripS: null, band: BAND, voltageV: 120 }, verdict: 'no-trip', basis: 'maker-band' },
    { name: 'maker band wins at 300 % too (3 s is fast on the band, NETA would pass it)', input: { ratingA: 20, testA: 60, tripS: 3, band: BAND, voltageV: 120 }, verdict: 'fast', basis: 'maker-band' },
    { name: 'trip at 100 % → unexpected-trip (UL 489: carries 100 % indefinitely)', input: { ratingA: 20, testA: 20, tripS: 600, voltageV: 120 }, verdict: 'unexpected-trip', basis: 'carry-rating' },
    { name: 'trip at 80 % → unexpected-trip, band or not', input: { ratingA: 20, testA: 16, tripS: 900, band: BAND, voltageV: 120 }, verdict: 'unexpected-trip', basis: 'carry-rating' },
    { name: 'held at 100 % → pass', input: { ratingA: 20, testA: 20, tripS: null, voltageV: 120 }, verdict: 'pass', basis: 'carry-rating' },
    { name: 'NETA fallback, 20 A at 120 V, 45 s ≤ 50 s → pass (from memory, low confidence)', input: { ratingA: 20, testA: 60, tripS: 45, voltageV: 120 }, verdict: 'pass', basis: 'neta-300pct-fallback' },
    { name: 'NETA fallback, 20 A at 120 V, 55 s > 50 s → slow (from memory)', input: { ratingA: 20, testA: 60, tripS: 55, voltageV: 120 }, verdict: 'slow', basis: 'neta-300pct-fallback' },
    { name: 'NETA fallback, 20 A at 480 V, 55 s ≤ 70 s → pass (from memory)', input: { ratingA: 20, testA: 60, tripS: 55, voltageV: 480 }, verdict: 'pass', basis: 'neta-300pct-fallback' },
    { name: 'NETA fallback, no trip → no-trip (from memory)', input: { ratingA: 100, testA: 300, tripS: null, voltageV: 208 }, verdict: 'no-trip', basis: 'neta-300pct-fallback' },
    { name: 'NETA fallback within ±5 % of 300 % (290 %) (from memory)', input: { ratingA: 100, testA: 290, tripS: 100, voltageV: 208 }, verdict: 'pass', basis: 'neta-300pct-fallback' },
    { name: 'band that does not reach 300 % → NETA fallback (from memory)', input: { ratingA: 20, testA: 60, tripS: 10, band: [{ multiple: 1.5, minS: 30, maxS: 300 }, { multiple: 2, minS: 10, maxS: 100 }], voltageV: 120 }, verdict: 'pass', basis: 'neta-300pct-fallback' },
    { name: '200 % with no band → no basis, no verdict', input: { ratingA: 20, testA: 40, tripS: 30, voltageV: 120 }, verdict: null, basis: 'none' },
    { name: '280 % with no band → outside the ±5 % of 300 %, no basis', input: { ratingA: 100, testA: 280, tripS: 100, voltageV: 208 }, verdict: null, basis: 'none' },
    { name: '500 A at 240 V, 300 %: NETA row has no ≤ 250 V figure → no basis', input: { ratingA: 500, testA: 1500, tripS: 100, voltageV: 240 }, verdict: null, basis: 'none' },
  ];
  for (const row of rows) {
    it(row.name, () => {
      const result = tripTestVerdict(row.input);
      assert.equal(result.verdict, row.verdict);
      assert.equal(result.basis, row.basis);
      assert.ok(result.basisNote.length > 0);
    });
  }
  it('the fallback is labelled: max from the table, minS 0, note says from memory and low confidence', () => {
    const result = tripTestVerdict({ ratingA: 40, testA: 120, tripS: 1, voltageV: 240 });
    assert.deepEqual(result.expected, { minS: 0, maxS: 80 });
    assert.equal(result.verdict, 'pass'); // the fallback has no minimum, so it cannot say 'fast'
    assert.match(result.basisNote, /from memory/);
    assert.match(result.basisNote, /low confidence/);
  });
  it('expected is the interpolated maker band', () => {
    const result = tripTestVerdict({ ratingA: 20, testA: 80, tripS: 5, band: BAND, voltageV: 120 });
    close(result.expected?.minS ?? 0, Math.sqrt(10));
    close(result.expected?.maxS ?? 0, Math.sqrt(1000));
    assert.equal(result.multiple, 4);
  });
  it('rejects a zero rating or negative time', () => {
    assert.throws(() => tripTestVerdict({ ratingA: 0, testA: 60, tripS: 5, voltageV: 120 }), RangeError);
    assert.throws(() => tripTestVerdict({ ratingA: 20, testA: 60, tripS: -1, voltageV: 120 }), RangeError);
  });
});

describe('instantaneousPickupCheck — ANSI/NETA Table 100.8', () => {
  const rows: { source: string; input: Parameters<typeof instantaneousPickupCheck>[0]; ok: boolean; lowA: number; highA: number }[] = [
    { source: '[V] worked example: 4 000 A setting → 2 800–5 600 A; 2 775 A fails', input: { settingA: 4000, pickupA: 2775, kind: 'thermal-magnetic-adjustable' }, ok: false, lowA: 2800, highA: 5600 },
    { source: '[V] thermal-magnetic −30 %: 2 800 A is on the edge → pass', input: { settingA: 4000, pickupA: 2800, kind: 'thermal-magnetic-adjustable' }, ok: true, lowA: 2800, highA: 5600 },
    { source: '[V] thermal-magnetic +40 %: 5 601 A fails', input: { settingA: 4000, pickupA: 5601, kind: 'thermal-magnetic-adjustable' }, ok: false, lowA: 2800, highA: 5600 },
    { source: '[V] thermal-magnetic: 4 100 A passes', input: { settingA: 4000, pickupA: 4100, kind: 'thermal-magnetic-adjustable' }, ok: true, lowA: 2800, highA: 5600 },
    { source: 'electronic ±30 % (from memory)', input: { settingA: 1000, pickupA: 1350, kind: 'electronic' }, ok: false, lowA: 700, highA: 1300 },
    { source: 'non-adjustable ±25 % (from memory)', input: { settingA: 200, pickupA: 240, kind: 'non-adjustable' }, ok: true, lowA: 150, highA: 250 },
  ];
  for (const row of rows) {
    it(row.source, () => {
      const result = instantaneousPickupCheck(row.input);
      assert.equal(result.ok, row.ok);
      assert.equal(result.lowA, row.lowA);
      assert.equal(result.highA, row.highA);
    });
  }
});

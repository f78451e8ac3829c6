/**
 * The band plot's geometry: log–log axes in whole decades, as makers print time-current curves
 * [CP]; the thermal band and the instantaneous band drawn apart (REFERENCES.md "Time-current
 * bands" [CP]). The band below is invented test data shaped like a small thermal-magnetic breaker's.
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import { bandPlot } from '../../../shared/calc';

const POINTS = [
  { multiple: 1.5, minS: 30, maxS: 300 },
  { multiple: 3, minS: 5, maxS: 60 },
  { multiple: 6, minS: 1, maxS: 10 },
];
const close = (a: number, b: number) => assert.ok(Math.abs(a - b) < 1e-9, `${a} ≠ ${b}`);

describe('bandPlot — log–log geometry [CP]', () => {
  const plot = bandPlot({
    points: POINTS,
    instantaneous: { multiple: 10, tolerancePct: 20 },
    tests: [{ multiple: 3, seconds: 20, label: '300 %, 20 s' }, { multiple: 1.5, seconds: null, label: 'no trip' }],
  });
  it('axes span whole decades around the data: 1–100 × rating, 0.01–1 000 s', () => {
    assert.deepEqual(plot.multiples, [1, 100]);
    assert.deepEqual(plot.seconds, [0.01, 1000]);
    assert.deepEqual(plot.xTicks.map((t) => t.label), ['1', '10', '100']);
    assert.deepEqual(plot.yTicks.map((t) => t.label), ['0.01', '0.1', '1', '10', '100', '1000']);
  });
  it('a decade is the same length anywhere on an axis (logarithmic)', () => {
    close(plot.xTicks[1].at - plot.xTicks[0].at, plot.xTicks[2].at - plot.xTicks[1].at);
    close(plot.yTicks[0].at - plot.yTicks[1].at, 0.2);
    close(plot.yTicks[5].at, 0); // the longest time at the top
  });
  it('the thermal band is one closed outline: upper edge left to right, lower edge back', () => {
    assert.equal(plot.thermal.length, 6);
    close(plot.thermal[0].x, Math.log10(1.5) / 2);
    assert.ok(plot.thermal[0].y < plot.thermal[5].y, 'the maximum time is above the minimum');
  });
  it('the instantaneous band is its own rectangle from 8× to 12× (10× ± 20 %), not joined to the thermal band', () => {
    assert.ok(plot.instantaneous);
    close(plot.instantaneous![0].x, Math.log10(8) / 2);
    close(plot.instantaneous![1].x, Math.log10(12) / 2);
    const lastThermalX = Math.max(...plot.thermal.map((p) => p.x));
    assert.ok(plot.instantaneous![0].x > lastThermalX);
  });
  it('a test inside the band sits between its edges; a no-trip mark sits at the top', () => {
    const t = plot.tests[0];
    const upper = plot.thermal[1]; // 3 × rating, 60 s
    const lower = plot.thermal[4]; // 3 × rating, 5 s
    close(t.x, upper.x);
    assert.ok(t.y > upper.y && t.y < lower.y);
    assert.equal(plot.tests[1].y, 0);
  });
  it('refuses a band that is not a band and a test of NaN', () => {
    assert.throws(() => bandPlot({ points: [] }), RangeError);
    assert.throws(() => bandPlot({ points: POINTS, tests: [{ multiple: Number.NaN, seconds: 1, label: '' }] }), RangeError);
  });
});

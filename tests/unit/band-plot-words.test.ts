/**
 * What the band plot says beside its geometry (shared/band-plot-words.ts) and the trend of a
 * termination's rise across surveys (shared/thermal-trend.ts). The band is invented test data
 * shaped like a small thermal-magnetic breaker's (not a maker's curve). A verdict must be a shape
 * AND a word (WCAG 2.2 SC 1.4.1, use of colour [V]); the plot's axes are log–log as makers print
 * time-current curves [CP]; a trend deviates per NFPA 70B 2023 condition 2 with our 3 °C threshold [CP].
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import { bandPlotView, markShape, markWord, plotTestOf } from '../../shared/band-plot-words';
import { terminationTrends, type TrendInput } from '../../shared/thermal-trend';
import { assessReading } from '../../shared/assess';
import type { ReadingFields } from '../../shared/records';

const BAND = {
  label: 'Test band (invented)',
  ratingA: 20,
  points: [
    { multiple: 1.5, minS: 30, maxS: 300 },
    { multiple: 3, minS: 5, maxS: 60 },
    { multiple: 6, minS: 1, maxS: 10 },
  ],
  instantaneousMultiple: 10,
  instantaneousTolerancePct: 20,
};

describe('band plot words', () => {
  it('a pass is a filled circle, any failure a cross, no judgement an open square — each with its word', () => {
    assert.equal(markShape('pass'), 'circle');
    for (const v of ['slow', 'fast', 'no-trip', 'unexpected-trip'] as const) assert.equal(markShape(v), 'cross');
    assert.equal(markShape(null), 'square');
    assert.equal(markWord('pass'), 'PASS');
    assert.equal(markWord('slow'), 'SLOW');
    assert.equal(markWord(null), 'NOT JUDGED');
  });
  it('a 60 A test of a 20 A band that tripped in 14 s sits at 3× and the caption names it and its verdict', () => {
    const view = bandPlotView(BAND, [{ testA: 60, tripS: 14, verdict: 'pass' }]);
    assert.ok(view);
    assert.equal(view.plot.tests.length, 1);
    assert.equal(view.plot.tests[0].multiple, 3);
    assert.deepEqual(view.verdicts, ['pass']);
    assert.match(view.caption, /PASS: 60 A \(300 %\), 14 s/);
    assert.match(view.caption, /Instantaneous pickup 10× ±20 %/);
    assert.match(view.caption, /Thermal band from 1\.5× \(30–300 s\) to 6× \(1–10 s\)/);
  });
  it('a test that did not trip is a mark at the top, said in words', () => {
    const view = bandPlotView(BAND, [{ testA: 30, tripS: null, verdict: 'no-trip' }]);
    assert.equal(view?.plot.tests[0].y, 0);
    assert.match(view?.caption ?? '', /NO TRIP: 30 A \(150 %\), did not trip/);
  });
  it('a band whose times rise with current cannot be drawn: null, not a wrong picture', () => {
    const bad = { ...BAND, points: [{ multiple: 2, minS: 5, maxS: 50 }, { multiple: 3, minS: 8, maxS: 60 }] };
    assert.equal(bandPlotView(bad), null);
  });
  it('a test with no current or a NaN time is left off the plot rather than drawn at NaN', () => {
    const view = bandPlotView(BAND, [{ testA: Number.NaN, tripS: 3, verdict: null }, { testA: 60, tripS: Number.NaN, verdict: null }]);
    assert.equal(view?.plot.tests.length, 0);
    assert.match(view?.caption ?? '', /No test points/);
  });
  it('a reading becomes a plot test only when its current and outcome are recorded', () => {
    assert.equal(plotTestOf({ testCurrentA: 60, tripped: null, tripTimeS: null }, null), null);
    assert.equal(plotTestOf({ testCurrentA: 60, tripped: true, tripTimeS: null }, null), null);
    assert.deepEqual(plotTestOf({ testCurrentA: 60, tripped: false, tripTimeS: 9 }, null), { testA: 60, tripS: null, verdict: null });
  });
});

const thermal = (temperatureC: number, referenceC: number, extra: Partial<ReadingFields> = {}): ReadingFields =>
  ({
    kind: 'thermal', inspectionId: 'i', panelId: 'p', circuitId: 'c', notes: '', component: 'lug', phase: 'B',
    temperatureC, referenceC, referenceBasis: 'similar', loadA: null, referenceLoadA: null, duringTestPulse: false,
    fastener: '', specified: null, unit: null, specSource: null, conductorSize: null, screw: null, screwSize: null,
    asFound: null, asFoundValue: null, asLeft: null, testCurrentA: null, tripped: null, tripTimeS: null, bandId: null, check: null,
    ...extra,
  }) as ReadingFields;
const input = (r: ReadingFields, takenOn: string | null): TrendInput => ({ reading: r, assessment: assessReading(r), takenOn });

describe('termination trends across surveys (NFPA 70B 2023 condition 2 [V]; 3 °C threshold [CP])', () => {
  it('the same lug on the same phase: 6 °C a year ago, 22 °C now — deviates', () => {
    const [t, ...rest] = terminationTrends([input(thermal(58, 36), '2026-11-12'), input(thermal(42, 36), '2025-11-03')]);
    assert.equal(rest.length, 0);
    assert.equal(t.label, 'Lug · phase B');
    assert.deepEqual(t.trend.points.map((p) => p.riseC), [6, 22]);
    assert.equal(t.trend.deviates, true);
  });
  it('another phase or component is another termination; one survey is no trend yet', () => {
    const trends = terminationTrends([input(thermal(40, 36), '2026-11-12'), input(thermal(40, 36, { phase: 'A' }), '2026-11-12')]);
    assert.equal(trends.length, 2);
    assert.ok(trends.every((t) => t.trend.points.length === 1 && t.trend.changeC === null && !t.trend.deviates));
  });
  it('two readings of one spot in one survey count once, the worse; a too-lightly-loaded one not at all', () => {
    const light = thermal(38, 36, { loadA: 1, referenceLoadA: 20 });
    const [t] = terminationTrends([input(thermal(40, 36), '2026-11-12'), input(thermal(45, 36), '2026-11-12'), input(light, '2025-11-03')]);
    assert.deepEqual(t.trend.points, [{ takenOn: '2026-11-12', riseC: 9 }]);
  });
  it('readings whose survey date is unknown are left out', () => {
    assert.deepEqual(terminationTrends([input(thermal(40, 36), null)]), []);
  });
});

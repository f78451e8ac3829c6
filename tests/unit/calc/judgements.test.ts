/**
 * The judgements a thermographer and a breaker tester rely on (issue 13, items 1–4 and 6): each row
 * names its source; [CP] is common practice; "from memory" where ../shared/REFERENCES.md marks [M].
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import {
  PANEL_LOAD_FIGURES,
  circuitWarnings,
  conductorCheck,
  loadCorrection,
  nuisanceTripFindings,
  torqueVerdict,
  tripTestVerdict,
  type TripBandPoint,
} from '../../../shared/calc';
import { assessReading, terminationReadingOf, type Assessment } from '../../../shared/assess';
import { readingCreateBody, bandCreateBody, type ReadingFields } from '../../../shared/records';

const id = '0190a0b0-0000-7000-8000-000000000001';
const thermal = (over: Partial<ReadingFields>): ReadingFields =>
  readingCreateBody.parse({
    inspectionId: id,
    panelId: id,
    kind: 'thermal',
    component: 'lug',
    referenceBasis: 'similar',
    ...over,
  });

/** The assessment as a thermal one (fails the test otherwise). */
function thermalOf(a: Assessment): Extract<Assessment, { kind: 'thermal' }> {
  assert.equal(a.kind, 'thermal');
  return a as Extract<Assessment, { kind: 'thermal' }>;
}

describe('load correction — raise light-load readings, never lower (Infraspection Institute 2023 [V]; n = 2 [CP]; NFPA 70B 2023 40 % minimum [V])', () => {
  const rows: {
    source: string;
    input: Parameters<typeof loadCorrection>[0];
    outcome: 'as-measured' | 'raised' | 'too-light';
    riseC: number | null;
  }[] = [
    { source: 'REFERENCES "never to lower one taken at or above the reference load" [CP]: 20 °C at 45 A, normal 30 A', input: { riseC: 20, measuredA: 45, referenceA: 30 }, outcome: 'as-measured', riseC: 20 },
    { source: 'same rule at exactly the reference load', input: { riseC: 8, measuredA: 30, referenceA: 30 }, outcome: 'as-measured', riseC: 8 },
    { source: 'square law, Infraspection Institute 2023 [V], n = 2 [CP]: 10 °C at 50 % → ×4', input: { riseC: 10, measuredA: 50, referenceA: 100 }, outcome: 'raised', riseC: 40 },
    { source: 'n = 1.6, the low end of the Infraspection range [V]', input: { riseC: 10, measuredA: 50, referenceA: 100, exponent: 1.6 }, outcome: 'raised', riseC: 10 * 2 ** 1.6 },
    { source: 'NFPA 70B 2023: 40 % of normal load is enough [V] → raised by (1/0.4)²', input: { riseC: 4, measuredA: 40, referenceA: 100 }, outcome: 'raised', riseC: 25 },
    { source: 'NFPA 70B 2023: under 40 % → too lightly loaded to judge [V]: 2 °C at 10 % is not 200 °C', input: { riseC: 2, measuredA: 10, referenceA: 100 }, outcome: 'too-light', riseC: null },
    { source: 'NFPA 70B 2023 [V]: 39 % is under the minimum', input: { riseC: 3, measuredA: 39, referenceA: 100 }, outcome: 'too-light', riseC: null },
  ];
  for (const row of rows) {
    it(row.source, () => {
      const result = loadCorrection(row.input);
      assert.equal(result.outcome, row.outcome);
      if (row.riseC === null) assert.equal(result.riseC, null);
      else assert.ok(Math.abs((result.riseC ?? NaN) - row.riseC) < 1e-9, `${result.riseC} ≠ ${row.riseC}`);
      assert.ok(result.reason.length > 0);
    });
  }
});

describe('assessReading, thermal — the cases of issue 13 (ANSI/NETA MTS Table 100.18 [V])', () => {
  it('20 °C over a similar lug at 45 A with a normal load of 30 A stays 20 °C: NETA priority 1, not P3', () => {
    const a = thermalOf(assessReading(thermal({ temperatureC: 50, referenceC: 30, loadA: 45, referenceLoadA: 30 })));
    assert.equal(a.judgedRiseC, 20);
    assert.equal(a.priority, 1); // > 15 °C similar → priority 1, NETA MTS Table 100.18
  });
  it('12 °C lug over body during a 4.7 s, 300 A trip-test pulse is judged raw: 12 °C, priority 3, not steady state', () => {
    const a = thermalOf(assessReading(
      thermal({ temperatureC: 44, referenceC: 32, loadA: 300, referenceLoadA: 50, duringTestPulse: true }),
    ));
    assert.equal(a.judgedRiseC, 12);
    assert.equal(a.priority, 3); // 4–15 °C similar → priority 3, NETA MTS Table 100.18
    assert.equal(a.steadyState, false);
    assert.match(a.notes.join(' '), /not thermal steady state/);
  });
  it('the pulse reading stays in the nuisance-trip findings: trips at 60 % of a 50 A rating + a hot lug → suspect the termination [CP]', () => {
    const reading = thermal({ temperatureC: 44, referenceC: 32, loadA: 300, referenceLoadA: 50, duringTestPulse: true });
    const a = assessReading(reading);
    const termination = terminationReadingOf(reading, a);
    assert.deepEqual(termination, { kind: 'thermal', riseC: 12, basis: 'similar' });
    const findings = nuisanceTripFindings({
      ratingA: 50,
      trips: [{ at: '2025-01-01', loadA: 30 }],
      readings: termination ? [termination] : [],
    });
    assert.equal(findings.hotTerminations, 1);
    assert.equal(findings.suspectTermination, true);
  });
  it('2 °C at 10 % load is "too lightly loaded to judge", with no priority and no number in hundreds (NFPA 70B 2023 [V])', () => {
    const reading = thermal({ temperatureC: 27, referenceC: 25, loadA: 10, referenceLoadA: 100 });
    const a = thermalOf(assessReading(reading));
    assert.equal(a.correction, 'too-light');
    assert.equal(a.judgedRiseC, null);
    assert.equal(a.priority, null);
    assert.match(a.summary, /too lightly loaded to judge/);
    assert.equal(terminationReadingOf(reading, a), null);
  });
});

// A made-up band (not any maker's): thermal points to 6×, instantaneous pickup 10× ±10 %.
const THERMAL_TO_6X: TripBandPoint[] = [
  { multiple: 1.35, minS: 100, maxS: 3000 },
  { multiple: 3, minS: 8, maxS: 60 },
  { multiple: 6, minS: 2, maxS: 12 },
];

describe('tripTestVerdict — thermal and instantaneous regions judged apart ([CP] REFERENCES "Time-current bands"; ANSI/NETA Table 100.8 [V])', () => {
  it('8× tripping in 3 s is not called slow by a line drawn into the instantaneous point; the thermal data stop at 6× → outside the band', () => {
    const band = [...THERMAL_TO_6X, { multiple: 10, minS: 0.005, maxS: 0.03 }];
    const result = tripTestVerdict({ ratingA: 50, testA: 400, tripS: 3, band, voltageV: 240, instantaneous: { multiple: 10, tolerancePct: 10 } });
    assert.notEqual(result.verdict, 'slow');
    assert.equal(result.verdict, null);
    assert.equal(result.region, 'thermal');
    assert.match(result.basisNote, /outside the band/);
  });
  it('8× in 3 s passes when the thermal points reach 8× (2–12 s at 6×, 1.2–6 s at 8×)', () => {
    const band = [...THERMAL_TO_6X, { multiple: 8, minS: 1.2, maxS: 6 }];
    const result = tripTestVerdict({ ratingA: 50, testA: 400, tripS: 3, band, voltageV: 240, instantaneous: { multiple: 10, tolerancePct: 10 } });
    assert.equal(result.verdict, 'pass');
    assert.equal(result.region, 'thermal');
  });
  it('12× (above 10× +10 %) clearing in 0.02 s passes as instantaneous; the NETA pickup check says within tolerance', () => {
    const result = tripTestVerdict({ ratingA: 50, testA: 600, tripS: 0.02, band: THERMAL_TO_6X, voltageV: 240, instantaneous: { multiple: 10, tolerancePct: 10 } });
    assert.equal(result.region, 'instantaneous');
    assert.equal(result.verdict, 'pass');
    assert.equal(result.instantaneous?.ok, true);
  });
  it('12× taking 2 s did not pick up instantaneously: slow', () => {
    const result = tripTestVerdict({ ratingA: 50, testA: 600, tripS: 2, band: THERMAL_TO_6X, voltageV: 240, instantaneous: { multiple: 10, tolerancePct: 10 } });
    assert.equal(result.verdict, 'slow');
    assert.equal(result.instantaneous?.ok, false);
  });
  it('5× clearing in 0.02 s picked up instantaneously below 10× −10 % (ANSI/NETA Table 100.8 check fails): fast', () => {
    const result = tripTestVerdict({ ratingA: 50, testA: 250, tripS: 0.02, band: THERMAL_TO_6X, voltageV: 240, instantaneous: { multiple: 10, tolerancePct: 10 } });
    assert.equal(result.verdict, 'fast');
    assert.equal(result.instantaneous?.ok, false);
  });
  it('a band for a 30 A breaker on a 20 A circuit is flagged, not silently used', () => {
    const result = tripTestVerdict({ ratingA: 20, testA: 60, tripS: 20, band: THERMAL_TO_6X, bandRatingA: 30, voltageV: 120 });
    assert.match(result.problems.join(' '), /band is for a 30 A breaker; this circuit is 20 A/);
    assert.notEqual(result.basis, 'maker-band');
  });
  it('a band whose maximum time rises with current is refused by the band schema with a field error', () => {
    const parsed = bandCreateBody.safeParse({
      label: 'bad',
      ratingA: 50,
      points: [{ multiple: 2, minS: 10, maxS: 100 }, { multiple: 4, minS: 5, maxS: 200 }],
    });
    assert.equal(parsed.success, false);
    assert.ok(parsed.error?.issues.some((i) => i.path.join('.') === 'points.1.maxS' && /rise/.test(i.message)));
  });
  it('assessReading flags the band’s rating in the summary', () => {
    const reading = readingCreateBody.parse({ inspectionId: id, panelId: id, kind: 'trip', circuitId: id, testCurrentA: 60, tripped: true, tripTimeS: 20 });
    const a = assessReading(reading, {
      circuit: { ratingA: 20 },
      panel: { system: '120/240V-1ph-3w' },
      band: { ratingA: 30, points: THERMAL_TO_6X, instantaneousMultiple: null, instantaneousTolerancePct: null },
    });
    assert.match(a.summary, /band is for a 30 A breaker; this circuit is 20 A/);
  });
});

describe('torqueVerdict — maker’s value ≥ 40 % above UL 486A-486B warns; the maker’s value governs (NEC 110.14(D) [V]; 40 % [CP])', () => {
  const rows: { source: string; input: Parameters<typeof torqueVerdict>[0]; warn: RegExp | null }[] = [
    { source: 'UL 486A-486B Table I.1 slotted ≤ 1.2 mm, 14–10 AWG: 20 lbf-in [V]; 28.4 is 42 % above', input: { specified: 28.4, asLeft: 28.4, unit: 'lbf-in', size: '12', screw: 'slotted-small' }, warn: /42 % above the UL 486A-486B value for this screw/ },
    { source: 'UL 486A-486B Table I.2, slotted smaller than No. 10, slot < 1.2 mm, 4.8 mm long: 0.79 N·m (7 lbf-in) [V]; 35.4 lbf-in is 406 % above', input: { specified: 35.4, asLeft: 35.4, unit: 'lbf-in', size: '12', screw: 'slotted-under-10-narrow', screwSize: '4.8' }, warn: /check the maker’s value: 406 % above/i },
    { source: 'UL 486A-486B Table I.1, 20 lbf-in: 27 lbf-in is 35 % above → no warning', input: { specified: 27, asLeft: 27, unit: 'lbf-in', size: '12', screw: 'slotted-small' }, warn: null },
    { source: 'UL 486A-486B Table I.3 socket 5/32 in: 100 lbf-in [V]; 150 is 50 % above', input: { specified: 150, asLeft: 150, unit: 'lbf-in', size: '4', screw: 'socket', screwSize: '5/32' }, warn: /50 % above/ },
  ];
  for (const row of rows) {
    it(row.source, () => {
      const v = torqueVerdict(row.input);
      if (row.warn === null) assert.deepEqual(v.warnings, []);
      else assert.ok(v.warnings.some((w) => row.warn?.test(w)), v.warnings.join(' | '));
      // the maker's value governs: as left at the specified value is ok
      assert.equal(v.asLeft, 'ok');
    });
  }
});

describe('terminations — NEC 110.14(C)(1) [V]: ≤ 100 A or 14–1 AWG at 60 °C unless listed and marked 75 °C', () => {
  const rows: { source: string; input: Parameters<typeof conductorCheck>[0]; ok: boolean; tempC: number }[] = [
    { source: '110.14(C)(1)(a), unknown marking: 8 AWG Cu 90 °C wire on a 50 A breaker → 40 A at 60 °C (Table 310.16 [V])', input: { ratingA: 50, size: '8', material: 'Cu', insulationTempC: 90, terminalTempC: null }, ok: false, tempC: 60 },
    { source: '110.14(C)(1)(a)(3): marked 75 °C → 50 A at 75 °C', input: { ratingA: 50, size: '8', material: 'Cu', insulationTempC: 90, terminalTempC: 75 }, ok: true, tempC: 75 },
    { source: '110.14(C)(1)(b): over 100 A and larger than 1 AWG → 75 °C when unknown: 3/0 Cu 200 A', input: { ratingA: 200, size: '3/0', material: 'Cu', insulationTempC: 75, terminalTempC: null }, ok: true, tempC: 75 },
    { source: '110.14(C)(1)(a): 14–1 AWG even over 100 A → 60 °C when unknown: 1 AWG Cu 110 A at 60 °C on a 125 A breaker', input: { ratingA: 125, size: '1', material: 'Cu', insulationTempC: 90, terminalTempC: null }, ok: false, tempC: 60 },
  ];
  for (const row of rows) {
    it(row.source, () => {
      const result = conductorCheck(row.input);
      assert.equal(result.ok, row.ok);
      assert.equal(result.tempC, row.tempC);
    });
  }
  const base = {
    position: 1, poles: 2, ratingA: 50, status: 'in-use' as const, description: 'Range', loadVA: 8000, continuous: false,
    conductorSize: '8' as const, conductorMaterial: 'Cu' as const, insulationTempC: 90 as const, lengthFt: 35, loadKind: 'appliance' as const,
  };
  it('circuitWarnings uses the panel’s termination rating, with the circuit’s override', () => {
    const panel = { system: '120/240V-1ph-3w' as const };
    assert.deepEqual(circuitWarnings(base, { ...panel, terminationTempC: null }).map((w) => w.code), ['conductor-too-small']);
    assert.deepEqual(circuitWarnings(base, { ...panel, terminationTempC: 75 }).map((w) => w.code), []);
    assert.deepEqual(circuitWarnings({ ...base, terminationTempC: 60 }, { ...panel, terminationTempC: 75 }).map((w) => w.code), ['conductor-too-small']);
    assert.match(circuitWarnings(base, { ...panel, terminationTempC: null })[0].message, /60 °C/);
    assert.match(circuitWarnings(base, { ...panel, terminationTempC: null })[0].message, /110\.14\(C\)/);
  });
});

describe('panel load figures are named for what they are (NEC 210.20(A), 215.3 [V])', () => {
  it('"Connected load" and "Sizing load" with the 125 % rule; no "Demand"', () => {
    assert.equal(PANEL_LOAD_FIGURES.connected.label, 'Connected load');
    assert.match(PANEL_LOAD_FIGURES.sizing.label, /^Sizing load/);
    assert.match(PANEL_LOAD_FIGURES.sizing.rule, /125 % of continuous/);
    assert.match(PANEL_LOAD_FIGURES.sizing.rule, /215\.3/);
    for (const f of Object.values(PANEL_LOAD_FIGURES)) assert.doesNotMatch(`${f.label} ${f.rule}`, /\bdemand\b/i);
  });
});

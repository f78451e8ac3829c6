import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import type { PanelSystem } from '../../../shared/domain';
import * as calc from '../../../shared/calc';
import { SAFETY_CAUTION, circuitWarnings } from '../../../shared/calc';
import type { WarningCircuit } from '../../../shared/calc';

const base: WarningCircuit = {
  position: 1,
  poles: 1,
  ratingA: 20,
  status: 'in-use',
  description: 'Receptacles, room 101',
  loadVA: 1200,
  continuous: false,
  conductorSize: '12',
  conductorMaterial: 'Cu',
  insulationTempC: 90,
  lengthFt: 50,
};
// terminations listed and marked 75 °C unless a test says otherwise (NEC 110.14(C)(1)(a)(3))
const panel208 = { system: '208Y/120V-3ph-4w' as PanelSystem, terminationTempC: 75 as const };

describe('circuitWarnings — NEC Table 310.16, 240.4(B)/(D), 210.20(A), 210.19(A) note, 408.4(A)', () => {
  const rows: { name: string; circuit: Partial<WarningCircuit>; system?: PanelSystem; codes: string[] }[] = [
    { name: 'a sound circuit → no warnings', circuit: {}, codes: [] },
    { name: 'Table 310.16 + 240.4(D) [V]: 12 Cu on 30 A → both', circuit: { ratingA: 30 }, codes: ['conductor-too-small', 'small-conductor-limit'] },
    { name: 'after the fix (20 A breaker) the warning clears', circuit: { ratingA: 20 }, codes: [] },
    { name: '240.4(D) [V]: 12 Cu on 25 A → 240.4(D) only (25 A ampacity at 75 °C)', circuit: { ratingA: 25 }, codes: ['small-conductor-limit'] },
    { name: '240.4(D) [V]: Al 12 on 20 A → 15 A limit', circuit: { conductorMaterial: 'Al', insulationTempC: 75 }, codes: ['small-conductor-limit'] },
    { name: 'Table 310.16 [V]: 8 Cu 60 °C on 50 A → too small (40 A)', circuit: { ratingA: 50, conductorSize: '8', insulationTempC: 60, loadVA: null }, codes: ['conductor-too-small'] },
    { name: 'Table 310.16 [V]: Al 14 is not a listed size', circuit: { conductorMaterial: 'Al', conductorSize: '14', ratingA: 15 }, codes: ['conductor-not-in-table'] },
    { name: 'insulation unknown: ampacity check skipped, 240.4(D) still applies', circuit: { ratingA: 30, insulationTempC: null }, codes: ['small-conductor-limit'] },
    { name: 'rating unknown: no conductor or load check', circuit: { ratingA: null, loadVA: 5000, continuous: true, lengthFt: null }, codes: [] },
    { name: '210.20(A) [V]: continuous 2 000 VA at 120 V (16.7 A) on 20 A → over 80 %', circuit: { loadVA: 2000, continuous: true }, codes: ['continuous-over-80'] },
    { name: '210.20(A) [V]: continuous 1 920 VA (16 A, exactly 80 %) → fine', circuit: { loadVA: 1920, continuous: true }, codes: [] },
    { name: 'noncontinuous 2 000 VA on 20 A → fine', circuit: { loadVA: 2000, continuous: false }, codes: [] },
    { name: 'load over the rating → load-over-rating (not also the 80 % one)', circuit: { loadVA: 3000, continuous: true, lengthFt: null }, codes: ['load-over-rating'] },
    { name: '2-pole 208 V continuous 3 500 VA (16.8 A) on 20 A → over 80 % (uses line-to-line)', circuit: { poles: 2, loadVA: 3500, continuous: true }, codes: ['continuous-over-80'] },
    { name: 'voltage drop [V Table 8; 3 % advice]: 12 Cu, 16 A, 100 ft at 120 V → 5.3 %', circuit: { loadVA: 1920, lengthFt: 100 }, codes: ['voltage-drop'] },
    { name: 'voltage drop: 40 ft → 2.1 %, fine', circuit: { loadVA: 1920, lengthFt: 40 }, codes: [] },
    { name: 'voltage drop: 2-pole 1φ 240 V, 16 A, 100 ft → 2.6 % of 240 V, fine', circuit: { poles: 2, loadVA: 3840, lengthFt: 100 }, system: '120/240V-1ph-3w', codes: [] },
    { name: 'voltage drop: 3-pole 208 V, 16 A, 200 ft → √3 × 1.98 × 16 × 200 / 1000 = 5.3 % of 208', circuit: { poles: 3, loadVA: Math.sqrt(3) * 208 * 16, lengthFt: 200 }, codes: ['voltage-drop'] },
    { name: 'voltage drop: length unknown → skipped', circuit: { loadVA: 1920, lengthFt: null }, codes: [] },
    { name: 'motor circuit: conductor findings become info (Art. 430/440, from memory)', circuit: { ratingA: 30, loadKind: 'motor' }, codes: ['conductor-too-small', 'small-conductor-limit'] },
    { name: 'space: no conductor checks, no directory checks', circuit: { status: 'space', ratingA: 60, description: '', loadVA: null }, codes: [] },
    { name: 'spare without "spare" in the description', circuit: { status: 'spare', description: '', loadVA: null }, codes: ['directory-spare-unlabelled'] },
    { name: '408.4(A) [V]: blank description', circuit: { description: '' }, codes: ['directory-blank'] },
    { name: '408.4(A) [V]: person’s name', circuit: { description: "Bob's office" }, codes: ['directory-person-name'] },
    { name: 'high-leg delta: 1-pole on B (position 3) → high-leg warning', circuit: { position: 3 }, system: '120/240V-3ph-4w-highleg', codes: ['high-leg-single-pole'] },
    { name: 'high-leg delta: 1-pole on A → fine', circuit: { position: 1 }, system: '120/240V-3ph-4w-highleg', codes: [] },
  ];
  for (const row of rows) {
    it(row.name, () => {
      const warnings = circuitWarnings({ ...base, ...row.circuit }, { system: row.system ?? panel208.system, terminationTempC: 75 });
      assert.deepEqual(warnings.map((w) => w.code), row.codes);
      for (const w of warnings) {
        assert.ok(w.severity === 'warning' || w.severity === 'info');
        assert.ok(w.message.length > 20);
      }
    });
  }
  it('severities: ordinary conductor findings are warnings; motor ones info; says-spare info', () => {
    assert.deepEqual(circuitWarnings({ ...base, ratingA: 30 }, panel208).map((w) => w.severity), ['warning', 'warning']);
    assert.deepEqual(circuitWarnings({ ...base, ratingA: 30, loadKind: 'hvac' }, panel208).map((w) => w.severity), ['info', 'info']);
    assert.deepEqual(circuitWarnings({ ...base, description: 'spare' }, panel208).map((w) => [w.code, w.severity]), [['directory-says-spare', 'info']]);
  });
  it('messages are plain words with the numbers an electrician needs', () => {
    const [tooSmall] = circuitWarnings({ ...base, ratingA: 30 }, panel208);
    assert.match(tooSmall.message, /12 AWG copper/);
    assert.match(tooSmall.message, /30 A/);
    assert.match(tooSmall.message, /25 A/);
    const [drop] = circuitWarnings({ ...base, loadVA: 1920, lengthFt: 100 }, panel208);
    assert.match(drop.message, /5\.3 %/);
  });
  it('a panel marked 75 °C; marked 60 °C or not recorded tightens the check (NEC 110.14(C)(1)(a) [V])', () => {
    const circuit = { ...base, ratingA: 30, conductorSize: '10' as const, insulationTempC: 90 as const, loadVA: null };
    assert.deepEqual(circuitWarnings(circuit, panel208), []);
    const sixAwg = { ...circuit, ratingA: 70, conductorSize: '6' as const };
    assert.deepEqual(circuitWarnings(sixAwg, panel208), []); // 65 A → 70 A by 240.4(B)
    assert.deepEqual(circuitWarnings(sixAwg, { ...panel208, terminationTempC: 60 }).map((w) => w.code), ['conductor-too-small']);
    // not recorded: 60 °C for 100 A or less (was 75 °C by default)
    assert.deepEqual(circuitWarnings(sixAwg, { system: panel208.system }).map((w) => w.code), ['conductor-too-small']);
  });
});

describe('SAFETY_CAUTION — NFPA 70E / AHJ / maker’s instructions wording [CP]', () => {
  it('says all four things', () => {
    assert.match(SAFETY_CAUTION, /de-energised/);
    assert.match(SAFETY_CAUTION, /NFPA 70E/);
    assert.match(SAFETY_CAUTION, /infrared scans with covers open/);
    assert.match(SAFETY_CAUTION, /trip testing/);
    assert.match(SAFETY_CAUTION, /authority having jurisdiction/);
    assert.match(SAFETY_CAUTION, /manufacturer/);
    assert.match(SAFETY_CAUTION, /licensed/);
    assert.match(SAFETY_CAUTION, /aids/);
  });
});

describe('shared/calc/index.ts — the public module', () => {
  const functions = [
    'phaseOf', 'panelLayout', 'occupiedPositions', 'ampacity', 'smallConductorLimitA', 'conductorCheck',
    'requiredOcpdA', 'panelLoad', 'unbalancePct', 'lightingDemandVA', 'receptacleDemandVA', 'voltageDrop',
    'loadCorrectedRiseC', 'thermalPriority', 'takenUnderLightLoad', 'tripBand', 'tripTestVerdict',
    'instantaneousPickupCheck', 'convertTorque', 'fallbackTorque', 'fallbackSocketTorque', 'torqueVerdict',
    'nextDueDate', 'nuisanceTripFindings', 'directoryWarnings', 'circuitWarnings',
  ];
  it('exports every required function', () => {
    const exported = calc as unknown as Record<string, unknown>;
    for (const name of functions) assert.equal(typeof exported[name], 'function', name);
    assert.ok(Array.isArray(calc.STANDARD_RATINGS_A));
    assert.equal(calc.THERMOGRAPHY_LOAD_MIN_FRACTION, 0.4);
    assert.equal(typeof calc.SAFETY_CAUTION, 'string');
  });
});

describe('circuitWarnings takes the circuit’s ambient and conductor count (NEC 310.15(B)(1), (C)(1))', () => {
  it('12 Cu 90 °C on 20 A: fine at 30 °C and 3 conductors; too small at 50 °C with 10 conductors', () => {
    // Table 310.16 [V]: 12 AWG Cu 30 A at 90 °C; Table 310.15(B)(1) [V]: 0.82 at 46–50 °C (90 °C
    // column); Table 310.15(C)(1) [V]: 50 % for 10–20 conductors → 30 × 0.82 × 0.5 = 12.3 A, next
    // standard size 15 A (240.4(B)) < 20 A
    assert.deepEqual(circuitWarnings(base, panel208).map((w) => w.code), []);
    const hot = circuitWarnings({ ...base, ambientC: 50, currentCarrying: 10 }, panel208);
    assert.deepEqual(hot.map((w) => w.code), ['conductor-too-small']);
    assert.match(hot[0].message, /310\.15\(B\)\(1\)/);
    assert.match(hot[0].message, /310\.15\(C\)\(1\)/);
  });
  it('an ambient the insulation may not be used at is a warning, not a pass', () => {
    // Table 310.15(B)(1) [V]: 60 °C insulation has no factor above 55 °C ambient
    const found = circuitWarnings({ ...base, insulationTempC: 60, ambientC: 58 }, panel208);
    assert.deepEqual(found.map((w) => w.code), ['conductor-not-in-table']);
    assert.match(found[0].message, /may not be used at 58 °C ambient \(NEC Table 310\.15\(B\)\(1\)\)/);
  });
});

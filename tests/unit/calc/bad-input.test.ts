/**
 * Every public function of shared/calc and shared/assess refuses a number that is not a number
 * (NaN, ±Infinity) or is negative where no negative makes sense, with a RangeError that names the
 * input — never an answer (DEVELOPERS.md, "Bad input"). Missing optional data is a different
 * thing: that comes back as null with a reason. The valid calls beside each row show the function
 * answers at all, so a row cannot pass by throwing for another reason.
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import * as calc from '../../../shared/calc';
import { assessReading } from '../../../shared/assess';
import type { ReadingFields } from '../../../shared/records';

const BAD = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, -1] as const;
const name = (x: number) => (Number.isNaN(x) ? 'NaN' : String(x));

type Case = {
  /** exported function name */
  fn: string;
  /** a call that must answer */
  valid: () => unknown;
  /** calls that must throw RangeError, one per bad number */
  bad: (x: number) => unknown;
  /** which of the bad numbers apply (default: all four) */
  values?: readonly number[];
  /** what the row is about */
  what: string;
};

const circuit = {
  position: 1, poles: 1, ratingA: 20, status: 'in-use' as const, description: 'Lights, room 101', loadVA: 1200,
  continuous: false, conductorSize: '12' as const, conductorMaterial: 'Cu' as const, insulationTempC: 90 as const, lengthFt: 50,
};
const panel = { system: '208Y/120V-3ph-4w' as const, busRatingA: 225, mainRatingA: 225 };
const spare = (peakDemandA: number) => ({
  system: '120/240V-1ph-3w' as const, spaces: 4, circuits: [], panelRatingA: 100, basis: 'year' as const, peakDemandA,
  newLoad: { va: 2400, volts: 240, poles: 2 as const, continuous: false },
});
const plc = (loadVA: number) => ({ position: 1, poles: 1, loadVA, continuous: true, loadKind: 'lighting' as const });

const CASES: Case[] = [
  { fn: 'rowOf', what: 'position', valid: () => calc.rowOf(3), bad: (x) => calc.rowOf(x) },
  { fn: 'phaseOf', what: 'position', valid: () => calc.phaseOf('208Y/120V-3ph-4w', 3), bad: (x) => calc.phaseOf('208Y/120V-3ph-4w', x) },
  { fn: 'occupiedPositions', what: 'position', valid: () => calc.occupiedPositions(1, 2), bad: (x) => calc.occupiedPositions(x, 2) },
  { fn: 'occupiedPositions', what: 'poles', valid: () => calc.occupiedPositions(1, 2), bad: (x) => calc.occupiedPositions(1, x) },
  { fn: 'panelLayout', what: 'spaces', valid: () => calc.panelLayout({ system: '120/240V-1ph-3w', spaces: 4 }, []), bad: (x) => calc.panelLayout({ system: '120/240V-1ph-3w', spaces: x }, []) },
  { fn: 'positionClash', what: 'candidate position', valid: () => calc.positionClash({ id: 'a', position: 1, poles: 1 }, []), bad: (x) => calc.positionClash({ id: 'a', position: x, poles: 1 }, []) },
  { fn: 'nextStandardRatingA', what: 'amperes (NEC 240.6(A))', valid: () => calc.nextStandardRatingA(21), bad: (x) => calc.nextStandardRatingA(x) },
  { fn: 'conductorCheck', what: 'rating (a negative rating was "ok")', valid: () => calc.conductorCheck({ ratingA: 20, size: '12', material: 'Cu', insulationTempC: 90 }), bad: (x) => calc.conductorCheck({ ratingA: x, size: '12', material: 'Cu', insulationTempC: 90 }) },
  { fn: 'terminationTempFor', what: 'rating', valid: () => calc.terminationTempFor({ ratingA: 20, size: '12', markedC: null }), bad: (x) => calc.terminationTempFor({ ratingA: x, size: '12', markedC: null }) },
  { fn: 'requiredOcpdA', what: 'continuous load (a negative one made a negative breaker)', valid: () => calc.requiredOcpdA({ continuousA: 16, noncontinuousA: 0 }), bad: (x) => calc.requiredOcpdA({ continuousA: x, noncontinuousA: 0 }) },
  { fn: 'requiredOcpdA', what: 'non-continuous load', valid: () => calc.requiredOcpdA({ continuousA: 0, noncontinuousA: 5 }), bad: (x) => calc.requiredOcpdA({ continuousA: 0, noncontinuousA: x }) },
  { fn: 'unbalancePct', what: 'a phase value', valid: () => calc.unbalancePct([1, 2, 3]), bad: (x) => calc.unbalancePct([1, x, 3]) },
  { fn: 'circuitCurrentA', what: 'load VA', valid: () => calc.circuitCurrentA({ system: '208Y/120V-3ph-4w', position: 1, poles: 1, loadVA: 1200 }), bad: (x) => calc.circuitCurrentA({ system: '208Y/120V-3ph-4w', position: 1, poles: 1, loadVA: x }) },
  { fn: 'panelLoad', what: 'a circuit load', valid: () => calc.panelLoad(panel, [plc(100)]), bad: (x) => calc.panelLoad(panel, [plc(x)]) },
  { fn: 'panelLoad', what: 'bus rating', valid: () => calc.panelLoad(panel, []), bad: (x) => calc.panelLoad({ ...panel, busRatingA: x }, []) },
  { fn: 'lightingDemandVA', what: 'VA', valid: () => calc.lightingDemandVA('dwelling', 5000), bad: (x) => calc.lightingDemandVA('dwelling', x) },
  { fn: 'receptacleDemandVA', what: 'VA', valid: () => calc.receptacleDemandVA(5000), bad: (x) => calc.receptacleDemandVA(x) },
  { fn: 'voltageDrop', what: 'amperes', valid: () => calc.voltageDrop({ size: '12', material: 'Cu', amps: 10, lengthFt: 50, volts: 120, phases: 1 }), bad: (x) => calc.voltageDrop({ size: '12', material: 'Cu', amps: x, lengthFt: 50, volts: 120, phases: 1 }) },
  { fn: 'voltageDrop', what: 'length', valid: () => calc.voltageDrop({ size: '12', material: 'Cu', amps: 10, lengthFt: 50, volts: 120, phases: 1 }), bad: (x) => calc.voltageDrop({ size: '12', material: 'Cu', amps: 10, lengthFt: x, volts: 120, phases: 1 }) },
  { fn: 'loadCorrection', what: 'rise (NaN went through)', valid: () => calc.loadCorrection({ riseC: 5, measuredA: 50, referenceA: 100 }), bad: (x) => calc.loadCorrection({ riseC: x, measuredA: 50, referenceA: 100 }), values: [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY] },
  { fn: 'loadCorrection', what: 'measured load', valid: () => calc.loadCorrection({ riseC: 5, measuredA: 50, referenceA: 100 }), bad: (x) => calc.loadCorrection({ riseC: 5, measuredA: x, referenceA: 100 }) },
  { fn: 'loadCorrection', what: 'reference load', valid: () => calc.loadCorrection({ riseC: 5, measuredA: 50, referenceA: 100 }), bad: (x) => calc.loadCorrection({ riseC: 5, measuredA: 50, referenceA: x }) },
  { fn: 'loadCorrectedRiseC', what: 'rise', valid: () => calc.loadCorrectedRiseC({ riseC: 5, measuredA: 50, referenceA: 100 }), bad: (x) => calc.loadCorrectedRiseC({ riseC: x, measuredA: 50, referenceA: 100 }), values: [Number.NaN, Number.POSITIVE_INFINITY] },
  { fn: 'thermalPriority', what: 'rise', valid: () => calc.thermalPriority({ riseC: 5, basis: 'similar' }), bad: (x) => calc.thermalPriority({ riseC: x, basis: 'similar' }), values: [Number.NaN, Number.POSITIVE_INFINITY] },
  { fn: 'takenUnderLightLoad', what: 'measured load', valid: () => calc.takenUnderLightLoad({ measuredA: 5, normalA: 10 }), bad: (x) => calc.takenUnderLightLoad({ measuredA: x, normalA: 10 }) },
  { fn: 'percentOfNormal', what: 'normal load', valid: () => calc.percentOfNormal(11, 12.5), bad: (x) => calc.percentOfNormal(11, x) },
  { fn: 'lightLoadNote', what: 'measured load', valid: () => calc.lightLoadNote({ measuredA: 5, normalA: 10 }), bad: (x) => calc.lightLoadNote({ measuredA: x, normalA: 10 }) },
  { fn: 'tripBand', what: 'multiple', valid: () => calc.tripBand([{ multiple: 2, minS: 1, maxS: 10 }], 2), bad: (x) => calc.tripBand([{ multiple: 2, minS: 1, maxS: 10 }], x) },
  { fn: 'netaMaxTripS300', what: 'rating', valid: () => calc.netaMaxTripS300({ ratingA: 20, voltageV: 120 }), bad: (x) => calc.netaMaxTripS300({ ratingA: x, voltageV: 120 }) },
  { fn: 'tripTestVerdict', what: 'rating', valid: () => calc.tripTestVerdict({ ratingA: 20, testA: 60, tripS: 20, voltageV: 120 }), bad: (x) => calc.tripTestVerdict({ ratingA: x, testA: 60, tripS: 20, voltageV: 120 }) },
  { fn: 'tripTestVerdict', what: 'trip time', valid: () => calc.tripTestVerdict({ ratingA: 20, testA: 60, tripS: 20, voltageV: 120 }), bad: (x) => calc.tripTestVerdict({ ratingA: 20, testA: 60, tripS: x, voltageV: 120 }) },
  { fn: 'instantaneousPickupCheck', what: 'setting', valid: () => calc.instantaneousPickupCheck({ settingA: 4000, pickupA: 4000, kind: 'electronic' }), bad: (x) => calc.instantaneousPickupCheck({ settingA: x, pickupA: 4000, kind: 'electronic' }) },
  { fn: 'instantaneousPickupCheck', what: 'pickup', valid: () => calc.instantaneousPickupCheck({ settingA: 4000, pickupA: 4000, kind: 'electronic' }), bad: (x) => calc.instantaneousPickupCheck({ settingA: 4000, pickupA: x, kind: 'electronic' }) },
  { fn: 'convertTorque', what: 'value (NaN went through)', valid: () => calc.convertTorque(1, 'N·m', 'lbf-in'), bad: (x) => calc.convertTorque(x, 'N·m', 'lbf-in') },
  { fn: 'convertTorque', what: 'value, same unit', valid: () => calc.convertTorque(1, 'N·m', 'N·m'), bad: (x) => calc.convertTorque(x, 'N·m', 'N·m') },
  { fn: 'torqueVerdict', what: 'as left (NaN was "ok")', valid: () => calc.torqueVerdict({ specified: 20, asLeft: 20, unit: 'lbf-in' }), bad: (x) => calc.torqueVerdict({ specified: 20, asLeft: x, unit: 'lbf-in' }) },
  { fn: 'torqueVerdict', what: 'as found', valid: () => calc.torqueVerdict({ specified: 20, asFound: 20, asLeft: 20, unit: 'lbf-in' }), bad: (x) => calc.torqueVerdict({ specified: 20, asFound: x, asLeft: 20, unit: 'lbf-in' }) },
  { fn: 'torqueVerdict', what: 'specified', valid: () => calc.torqueVerdict({ specified: 20, asLeft: 20, unit: 'lbf-in' }), bad: (x) => calc.torqueVerdict({ specified: x, asLeft: 20, unit: 'lbf-in' }) },
  { fn: 'makerValueWarning', what: 'specified', valid: () => calc.makerValueWarning({ specified: 20, unit: 'lbf-in', size: '12', screw: 'slotted-small' }), bad: (x) => calc.makerValueWarning({ specified: x, unit: 'lbf-in', size: '12', screw: 'slotted-small' }) },
  { fn: 'nextDueDate', what: 'condition (an NFPA 70B condition that does not exist)', valid: () => calc.nextDueDate({ equipment: 'panelboard', condition: 1, task: 'thermography', lastDoneOn: '2024-01-01' }), bad: (x) => calc.nextDueDate({ equipment: 'panelboard', condition: x as 1, task: 'thermography', lastDoneOn: '2024-01-01' }), values: [Number.NaN, 4, 0, -1] },
  { fn: 'maintenanceIntervalMonths', what: 'condition', valid: () => calc.maintenanceIntervalMonths('panelboard', 2, 'maintenance'), bad: (x) => calc.maintenanceIntervalMonths('panelboard', x as 1, 'maintenance'), values: [Number.NaN, 4, 0] },
  { fn: 'addMonthsUTC', what: 'months', valid: () => calc.addMonthsUTC('2024-01-31', 1), bad: (x) => calc.addMonthsUTC('2024-01-31', x), values: [Number.NaN, Number.POSITIVE_INFINITY, 1.5] },
  { fn: 'nuisanceTripFindings', what: 'rating', valid: () => calc.nuisanceTripFindings({ ratingA: 20, trips: [], readings: [] }), bad: (x) => calc.nuisanceTripFindings({ ratingA: x, trips: [], readings: [] }) },
  { fn: 'nuisanceTripFindings', what: 'a trip’s load', valid: () => calc.nuisanceTripFindings({ ratingA: 20, trips: [{ at: '2024-01-01', loadA: 5 }], readings: [] }), bad: (x) => calc.nuisanceTripFindings({ ratingA: 20, trips: [{ at: '2024-01-01', loadA: x }], readings: [] }) },
  { fn: 'circuitWarnings', what: 'rating (a negative rating was "ok")', valid: () => calc.circuitWarnings(circuit, panel), bad: (x) => calc.circuitWarnings({ ...circuit, ratingA: x }, panel) },
  { fn: 'circuitWarnings', what: 'load', valid: () => calc.circuitWarnings(circuit, panel), bad: (x) => calc.circuitWarnings({ ...circuit, loadVA: x }, panel) },
  { fn: 'circuitWarnings', what: 'length', valid: () => calc.circuitWarnings(circuit, panel), bad: (x) => calc.circuitWarnings({ ...circuit, lengthFt: x }, panel) },
  { fn: 'faultCurrentCheck', what: 'available fault current', valid: () => calc.faultCurrentCheck({ availableKA: 10, panelRatingKA: 10, breakers: [] }), bad: (x) => calc.faultCurrentCheck({ availableKA: x, panelRatingKA: 10, breakers: [] }) },
  { fn: 'faultCurrentCheck', what: 'a breaker’s interrupting rating', valid: () => calc.faultCurrentCheck({ availableKA: 10, panelRatingKA: null, breakers: [{ id: 'a', label: 'a', interruptingKA: 10 }] }), bad: (x) => calc.faultCurrentCheck({ availableKA: 10, panelRatingKA: null, breakers: [{ id: 'a', label: 'a', interruptingKA: x }] }) },
  { fn: 'spareCapacity', what: 'peak demand', valid: () => calc.spareCapacity(spare(50)), bad: (x) => calc.spareCapacity(spare(x)) },
  { fn: 'spareCapacity', what: 'new load VA', valid: () => calc.spareCapacity(spare(50)), bad: (x) => calc.spareCapacity({ ...spare(50), newLoad: { ...spare(50).newLoad, va: x } }) },
  { fn: 'freePositionsFor', what: 'poles', valid: () => calc.freePositionsFor({ system: '120/240V-1ph-3w', spaces: 4 }, [], 2), bad: (x) => calc.freePositionsFor({ system: '120/240V-1ph-3w', spaces: 4 }, [], x) },
  { fn: 'ambientCorrectionFactor', what: 'ambient', valid: () => calc.ambientCorrectionFactor(35, 90), bad: (x) => calc.ambientCorrectionFactor(x, 90), values: [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, -41] },
  { fn: 'bundlingAdjustmentFactor', what: 'conductor count', valid: () => calc.bundlingAdjustmentFactor(4), bad: (x) => calc.bundlingAdjustmentFactor(x) },
  { fn: 'conductorCheck', what: 'ambient', valid: () => calc.conductorCheck({ ratingA: 20, size: '12', material: 'Cu', insulationTempC: 90, ambientC: 35 }), bad: (x) => calc.conductorCheck({ ratingA: 20, size: '12', material: 'Cu', insulationTempC: 90, ambientC: x }), values: [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY] },
  { fn: 'neutralCurrentA', what: 'a phase current', valid: () => calc.neutralCurrentA(1, 2, 3), bad: (x) => calc.neutralCurrentA(1, x, 3) },
  { fn: 'compareMeasured', what: 'a measured current', valid: () => calc.compareMeasured({ A: 1 }, { A: 1 }), bad: (x) => calc.compareMeasured({ A: x }, { A: 1 }) },
  { fn: 'componentTempCheck', what: 'component temperature', valid: () => calc.componentTempCheck({ componentC: 40, ratingC: 75 }), bad: (x) => calc.componentTempCheck({ componentC: x, ratingC: 75 }), values: [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY] },
  { fn: 'componentTempCheck', what: 'rating', valid: () => calc.componentTempCheck({ componentC: 40, ratingC: 75 }), bad: (x) => calc.componentTempCheck({ componentC: 40, ratingC: x }) },
  { fn: 'riseTrend', what: 'a rise', valid: () => calc.riseTrend([{ takenOn: '2026-01-01', riseC: 2 }]), bad: (x) => calc.riseTrend([{ takenOn: '2026-01-01', riseC: x }]), values: [Number.NaN, Number.POSITIVE_INFINITY] },
  { fn: 'displayTemp', what: 'temperature', valid: () => calc.displayTemp(20, 'F', 'absolute'), bad: (x) => calc.displayTemp(x, 'F', 'absolute'), values: [Number.NaN, Number.POSITIVE_INFINITY] },
  { fn: 'toCelsius', what: 'temperature', valid: () => calc.toCelsius(68, 'F', 'absolute'), bad: (x) => calc.toCelsius(x, 'F', 'absolute'), values: [Number.NaN, Number.POSITIVE_INFINITY] },
  { fn: 'bandPlot', what: 'a test’s multiple', valid: () => calc.bandPlot({ points: [{ multiple: 2, minS: 1, maxS: 10 }, { multiple: 3, minS: 0.5, maxS: 5 }], tests: [{ multiple: 2, seconds: 3, label: '' }] }), bad: (x) => calc.bandPlot({ points: [{ multiple: 2, minS: 1, maxS: 10 }, { multiple: 3, minS: 0.5, maxS: 5 }], tests: [{ multiple: x, seconds: 3, label: '' }] }) },
];

describe('bad numbers are refused with a RangeError (DEVELOPERS.md "Bad input"; our convention)', () => {
  for (const c of CASES) {
    for (const x of c.values ?? BAD) {
      it(`${c.fn}: ${c.what} = ${name(x)}`, () => {
        c.valid();
        assert.throws(() => c.bad(x), (e: unknown) => e instanceof RangeError && e.message.length > 0);
      });
    }
  }
  it('every exported function of shared/calc has a row (names only: a new export needs one)', () => {
    const covered = new Set(CASES.map((c) => c.fn));
    // table look-ups over fixed vocabularies take no free numbers: nothing to refuse
    // bandProblem's answer is the reason itself (tested below)
    covered.add('bandProblem');
    const noNumbers = new Set(['ampacity', 'smallConductorLimitA', 'phaseToNeutralV', 'resistanceOhmPerKft', 'fallbackTorque', 'fallbackSocketTorque', 'personNameIn', 'directoryWarnings']);
    for (const [key, value] of Object.entries(calc)) {
      if (typeof value !== 'function' || noNumbers.has(key)) continue;
      assert.ok(covered.has(key), `no bad-input row for ${key}`);
    }
  });
});

describe('bandProblem names why a band cannot be used (it is the validator: the reason is its answer)', () => {
  for (const x of BAD) {
    it(`a point time of ${name(x)}`, () => {
      assert.equal(calc.bandProblem([{ multiple: 2, minS: 1, maxS: 10 }]), null);
      assert.match(calc.bandProblem([{ multiple: 2, minS: 1, maxS: x }]) ?? '', /finite and > 0/);
    });
  }
});

const reading = (over: Partial<ReadingFields>): ReadingFields => ({
  inspectionId: 'i', panelId: 'p', kind: 'thermal', circuitId: null, notes: '', component: 'lug', phase: null,
  temperatureC: 40, referenceC: 30, referenceBasis: 'similar', loadA: null, referenceLoadA: null, duringTestPulse: false,
  emissivity: null, reflectedC: null, distanceM: null, camera: '',
  fastener: '', specified: null, unit: null, specSource: null, conductorSize: null, screw: null, screwSize: null,
  asFound: null, asFoundValue: null, asLeft: null, testCurrentA: null, tripped: null, tripTimeS: null, bandId: null, check: null,
  ...over,
});

describe('assessReading refuses what the reading schema would (our convention)', () => {
  const rows: { what: string; r: ReadingFields }[] = [
    { what: 'thermal temperature NaN', r: reading({ temperatureC: Number.NaN }) },
    { what: 'thermal temperature missing (was taken as 0 °C)', r: reading({ temperatureC: null }) },
    { what: 'thermal load NaN (went through the load correction)', r: reading({ loadA: Number.NaN, referenceLoadA: 30 }) },
    { what: 'torque as left missing (was judged as 0)', r: reading({ kind: 'torque', specified: 20, unit: 'lbf-in', specSource: 'maker', asFound: 'held', asLeft: null }) },
    { what: 'torque as left negative', r: reading({ kind: 'torque', specified: 20, unit: 'lbf-in', specSource: 'maker', asFound: 'held', asLeft: -5 }) },
  ];
  for (const row of rows) {
    it(row.what, () => assert.throws(() => assessReading(row.r), RangeError));
  }
  it('a trip recorded "tripped" with no time is not judged (it was "fast"): null with the reason', () => {
    const a = assessReading(reading({ kind: 'trip', circuitId: 'c', testCurrentA: 60, tripped: true, tripTimeS: null }), {
      circuit: { ratingA: 20 },
      panel: { system: '120/240V-1ph-3w' },
    });
    assert.equal(a.kind, 'trip');
    assert.equal(a.kind === 'trip' ? a.result : 'x', null);
    assert.equal(a.priority, null);
    assert.match(a.summary, /time to trip/);
  });
});

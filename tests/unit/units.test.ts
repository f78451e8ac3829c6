/**
 * Temperatures shown and typed in the user's unit (shared/units.ts), stored in °C. Conversion:
 * °F = °C × 9/5 + 32 for a temperature; a rise (a difference) is × 9/5 only, no + 32 — SI Brochure
 * (9th ed.) and NIST SP 811 (2008) §B.9 [V]. Fixed points: water freezes at 0 °C = 32 °F and boils
 * at 100 °C = 212 °F at standard pressure (NIST SP 811) [V].
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import { formatTemp, fromCelsius, parseTempInput, tempInputText, unitSymbol } from '../../shared/units';
import { assessReading } from '../../shared/assess';
import type { ReadingFields } from '../../shared/records';

describe('temperature units — NIST SP 811 [V]', () => {
  it('fixed points convert exactly: 0 °C = 32 °F, 100 °C = 212 °F, −40 °C = −40 °F', () => {
    assert.equal(fromCelsius(0, 'F', 'absolute'), 32);
    assert.equal(fromCelsius(100, 'F', 'absolute'), 212);
    assert.equal(fromCelsius(-40, 'F', 'absolute'), -40);
    assert.equal(formatTemp(0, 'F', 'absolute'), '32 °F');
    assert.equal(formatTemp(100, 'F', 'absolute'), '212 °F');
    assert.equal(formatTemp(100, 'C', 'absolute'), '100 °C');
  });
  it('a rise converts by × 9/5 only — 10 °C of rise is 18 °F, not 50 °F', () => {
    assert.equal(fromCelsius(10, 'F', 'rise'), 18);
    assert.equal(formatTemp(10, 'F', 'rise'), '18 °F');
    assert.equal(formatTemp(0, 'F', 'rise'), '0 °F');
    // the demo's hot lug: 22 °C over the neighbouring lug is 39.6 °F of rise
    assert.equal(formatTemp(22, 'F', 'rise'), '39.6 °F');
    assert.notEqual(formatTemp(10, 'F', 'rise'), formatTemp(10, 'F', 'absolute'));
  });
  it('one decimal at most, none when whole; not recorded reads as the given word', () => {
    assert.equal(formatTemp(58, 'F', 'absolute'), '136.4 °F');
    assert.equal(formatTemp(21.25, 'C', 'absolute'), '21.3 °C');
    assert.equal(formatTemp(null, 'F', 'absolute'), '?');
    assert.equal(formatTemp(undefined, 'C', 'rise', 'not recorded'), 'not recorded');
    assert.equal(unitSymbol('F'), '°F');
  });
  it('refuses NaN and ±Infinity rather than showing "NaN °F"', () => {
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      assert.throws(() => formatTemp(bad, 'F', 'absolute'), RangeError);
      assert.throws(() => fromCelsius(bad, 'C', 'rise'), RangeError);
    }
  });
});

describe('typing a temperature in the chosen unit', () => {
  it('°F typed is stored as °C: 212 → 100, 32 → 0; a rise typed 18 °F is 10 °C', () => {
    assert.equal(parseTempInput('212', 'F', 'absolute'), 100);
    assert.equal(parseTempInput('32', 'F', 'absolute'), 0);
    assert.equal(parseTempInput('18', 'F', 'rise'), 10);
    assert.equal(parseTempInput(' 58 ', 'C', 'absolute'), 58);
  });
  it('an empty field is not recorded (null); text that is not a number is NaN for the schema to name', () => {
    assert.equal(parseTempInput('', 'F', 'absolute'), null);
    assert.ok(Number.isNaN(parseTempInput('hot', 'F', 'absolute')));
  });
  it('opening and saving in °F keeps the stored °C exactly (no drift from rounding)', () => {
    const shown = tempInputText(58.03, 'F', 'absolute');
    assert.equal(shown, '136.5');
    assert.equal(parseTempInput(shown, 'F', 'absolute', 58.03), 58.03);
    // a changed value is converted afresh
    assert.equal(parseTempInput('136.4', 'F', 'absolute', 58.03), 58);
    assert.equal(tempInputText(null, 'F', 'absolute'), '');
  });
});

describe('the assessment writes its rise in the chosen unit (ANSI/NETA MTS Table 100.18 priorities unchanged)', () => {
  const hotLug: ReadingFields = {
    kind: 'thermal', inspectionId: 'i', panelId: 'p', circuitId: null, notes: '', component: 'lug', phase: 'B',
    temperatureC: 58, referenceC: 36, referenceBasis: 'similar', loadA: null, referenceLoadA: null, duringTestPulse: false,
    fastener: '', specified: null, unit: null, specSource: null, conductorSize: null, screw: null, screwSize: null,
    asFound: null, asFoundValue: null, asLeft: null, testCurrentA: null, tripped: null, tripTimeS: null, bandId: null, check: null,
  } as ReadingFields;
  it('22 °C over a similar component: "ΔT 22 °C" by default, "ΔT 39.6 °F" in °F, P1 either way (> 15 °C similar)', () => {
    const c = assessReading(hotLug);
    const f = assessReading(hotLug, { temperatureUnit: 'F' });
    assert.match(c.summary, /^ΔT 22 °C over a similar component/);
    assert.match(f.summary, /^ΔT 39\.6 °F over a similar component/);
    assert.equal(c.priority, 1);
    assert.equal(f.priority, 1);
  });
});

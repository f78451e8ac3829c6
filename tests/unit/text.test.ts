/** Calendar dates and clean text (shared/text.ts), the rules every API body shares. */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { isCalendarDate, textProblem } from '../../shared/text';

describe('isCalendarDate', () => {
  // leap years by the Gregorian rule (ISO 8601 / the proleptic Gregorian calendar): divisible by
  // 4, except centuries, except those divisible by 400
  const cases: [string, boolean][] = [
    ['2026-01-31', true],
    ['2026-02-28', true],
    ['2026-02-29', false],
    ['2024-02-29', true],
    ['2000-02-29', true],
    ['1900-02-29', false],
    ['2026-02-31', false],
    ['2026-04-31', false],
    ['2026-12-31', true],
    ['2026-13-45', false],
    ['2026-00-10', false],
    ['2026-01-00', false],
    ['0000-01-01', false],
    ['9999-12-31', true],
    ['2026-1-01', false],
    ['2026-01-01T00:00', false],
  ];
  for (const [value, real] of cases) {
    it(`${value} is ${real ? '' : 'not '}a day of the calendar`, () => assert.equal(isCalendarDate(value), real));
  }
});

describe('textProblem', () => {
  it('refuses NUL, other controls and lone surrogates; keeps emoji (paired surrogates)', () => {
    assert.equal(textProblem('Panel LA — 🔌', false), null);
    assert.ok(textProblem('a\u0000b', false));
    assert.ok(textProblem('a\u0007b', true));
    assert.ok(textProblem('a\u009bb', true), 'a C1 control');
    assert.ok(textProblem('a\ud800b', true));
    assert.ok(textProblem('a\udc00', false));
  });
  it('line breaks and tabs only where text may run over several lines', () => {
    assert.equal(textProblem('one\n\ttwo\r\n', true), null);
    assert.ok(textProblem('one\ntwo', false));
    assert.ok(textProblem('one\ttwo', false));
  });
});

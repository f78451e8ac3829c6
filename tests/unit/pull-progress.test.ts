/** "Loading Tower: 3 of 9 parts" on a big building's first sync (lib/pull-progress.ts). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { describePullProgress, estimateParts, getPullProgress, setPullProgress } from '../../lib/pull-progress';

describe('pull progress', () => {
  it('estimates the parts from the rows still to come at the average page so far', () => {
    assert.equal(estimateParts({ pages: 1, rows: 1400 }, 15_400), 12);
    assert.equal(estimateParts({ pages: 3, rows: 4200 }, 1), 4);
    assert.equal(estimateParts({ pages: 3, rows: 4200 }, 0), 3);
    // a page of no rows so far cannot divide by zero
    assert.equal(estimateParts({ pages: 0, rows: 0 }, 5), 5);
  });

  it('reads as the header shows it', () => {
    assert.equal(describePullProgress({ buildingId: 'b', name: 'Tower', part: 3, parts: 9 }), 'Loading Tower: 3 of 9 parts');
  });

  it('tells its listeners and clears', () => {
    setPullProgress([{ buildingId: 'b', name: 'Tower', part: 1, parts: 9 }]);
    assert.equal(getPullProgress().length, 1);
    setPullProgress([]);
    assert.equal(getPullProgress().length, 0);
  });
});

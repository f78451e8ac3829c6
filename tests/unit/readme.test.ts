/**
 * The README a newcomer reads first says what the app does today: the inspector's row names the
 * inspections they record, and every port the scripts listen on is given as a default with the
 * variable that changes it.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { describe, it } from 'node:test';

const ROOT = path.resolve(__dirname, '..', '..');
const README = fs.readFileSync(path.join(ROOT, 'README.md'), 'utf8');

describe('README', () => {
  it('the role table says what the inspector does now', () => {
    const row = README.split('\n').find((l) => l.startsWith('| `inspector@ampwright.test`'));
    assert.ok(row, 'an inspector row');
    assert.doesNotMatch(row, /later release/);
    assert.match(row, /record/);
  });

  it('names the variable behind every port the start and test scripts use, and says the ports are defaults', () => {
    const scripts = ['start.sh', 'test.sh', 'lib.sh'].map((f) => fs.readFileSync(path.join(ROOT, 'scripts', f), 'utf8')).join('\n');
    const vars = [...new Set(scripts.match(/AMPWRIGHT_[A-Z0-9_]*PORT/g) ?? [])];
    assert.ok(vars.length >= 9, vars.join(' '));
    for (const v of vars) assert.ok(README.includes(`\`${v}\``), `README names ${v}`);
    assert.match(README, /defaults?/i);
  });
});

import { describe, it } from 'node:test';
import assert from 'node:assert/strict';
import type { CircuitStatus } from '../../../shared/domain';
import { directoryWarnings } from '../../../shared/calc';

const NEC = 'NEC 408.4(A), 2020/2023 [V]';

describe(`directoryWarnings — ${NEC}`, () => {
  const rows: [string | null, CircuitStatus, string[]][] = [
    // description, status, expected codes
    ['Lighting, room 104 north', 'in-use', []],
    ['Kitchen receptacles, east counter', 'in-use', []],
    ["Men's room lights", 'in-use', []],
    ["Janitor's closet receptacle", 'in-use', []],
    ['X-ray room 3', 'in-use', []], // "Ray" is not taken for a name
    ['RTU-2 condenser', 'in-use', []],
    ['', 'in-use', ['directory-blank']],
    ['   ', 'in-use', ['directory-blank']],
    [null, 'in-use', ['directory-blank']],
    ['misc', 'in-use', ['directory-vague']],
    ['Misc. lights', 'in-use', ['directory-vague']],
    ['?', 'in-use', ['directory-vague']],
    ['lights ??', 'in-use', ['directory-vague']],
    ['TBD', 'in-use', ['directory-vague']],
    ['stuff', 'in-use', ['directory-vague']],
    ['Various', 'in-use', ['directory-vague']],
    ['unknown', 'in-use', ['directory-vague']],
    ["Bob's office", 'in-use', ['directory-person-name']], // transient occupancy
    ["SUSAN'S OFFICE RECEPTACLES", 'in-use', ['directory-person-name']],
    ["Priya's office", 'in-use', ['directory-person-name']], // possessive of a name not in the list
    ['Wang\u2019s lab bench', 'in-use', ['directory-person-name']], // typographic apostrophe
    ['John', 'in-use', ['directory-person-name']],
    ['Office of Mr. Lee', 'in-use', ['directory-person-name']],
    ["Misc - Dave's desk", 'in-use', ['directory-vague', 'directory-person-name']],
    ['spare', 'in-use', ['directory-says-spare']],
    ['Spare', 'spare', []],
    ['SPARE 20A', 'spare', []],
    ['', 'spare', ['directory-spare-unlabelled']],
    ['Lights room 4', 'spare', ['directory-spare-unlabelled']],
    ['', 'space', []],
    ['misc', 'space', []],
  ];
  for (const [description, status, codes] of rows) {
    it(`${JSON.stringify(description)} (${status}) → ${codes.length === 0 ? 'no warning' : codes.join(', ')}`, () => {
      const warnings = directoryWarnings(description, status);
      assert.deepEqual(warnings.map((w) => w.code), codes);
      assert.ok(warnings.every((w) => w.message.length > 10));
    });
  }
});

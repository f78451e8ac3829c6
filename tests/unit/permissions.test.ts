/**
 * The one permission table (shared/permissions.ts): role × action × record state. The expected
 * rows are the product's role rules (DESIGN.md §2 users and §6 deficiency workflow), written out
 * here by hand so a change to the table has to change this test too.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { ROLES, type Role } from '../../shared/domain';
import { ACTIONS, can, rolesFor, type Action } from '../../shared/permissions';
import { may, nextStatuses } from '../../shared/deficiency';

const EXPECTED: Record<Action, readonly Role[]> = {
  // DESIGN.md §2: electricians edit schedules; admins keep buildings
  'building.create': ['admin', 'electrician'],
  'building.edit': ['admin', 'electrician'],
  'building.delete': ['admin'],
  'building.restore': ['admin'],
  'schedule.edit': ['admin', 'electrician'],
  // DESIGN.md §2: electricians record torque checks and trip tests, inspectors record inspections
  'inspection.record': ['admin', 'electrician', 'inspector'],
  'inspection.sign': ['admin', 'inspector'],
  // DESIGN.md §6: the deficiency workflow
  'deficiency.write': ['admin', 'electrician', 'inspector', 'owner'],
  'deficiency.raise': ['admin', 'inspector'],
  'deficiency.edit': ['admin', 'inspector'],
  'deficiency.reprioritise': ['admin', 'inspector'],
  'deficiency.assign': ['admin', 'inspector', 'electrician'],
  'deficiency.schedule': ['admin', 'inspector', 'electrician'],
  'deficiency.repair': ['admin', 'electrician'],
  'deficiency.verify': ['admin', 'inspector'],
  'deficiency.reopen': ['admin', 'inspector'],
  'deficiency.defer': ['owner', 'admin'],
  'deficiency.undefer': ['owner', 'admin'],
  'deficiency.accept': ['owner'],
  'deficiency.delete': ['admin', 'inspector'],
  'comment.add': ['admin', 'electrician', 'inspector', 'owner'],
  'band.edit': ['admin', 'electrician', 'inspector'],
  'settings.edit': ['admin'],
  // DESIGN.md §2: the admin keeps users and roles; the report goes out from whoever signs inspections
  'people.manage': ['admin'],
  'report.send': ['admin', 'inspector'],
  // the arc-flash label of a panel is kept with its schedule by electricians and admins; owners
  // and inspectors read it (issue 12 item 6, DEVELOPERS.md "Adding a record kind")
  'arc-flash.edit': ['admin', 'electrician'],
};

describe('the permission table', () => {
  it('names every action once and answers each role as the product rules say', () => {
    assert.deepEqual([...ACTIONS].sort(), Object.keys(EXPECTED).sort());
    for (const action of ACTIONS) {
      for (const role of ROLES) {
        assert.equal(can(role, action), EXPECTED[action].includes(role), `${role} × ${action}`);
      }
      assert.deepEqual([...rolesFor(action)].sort(), [...EXPECTED[action]].sort(), action);
    }
  });

  it('nobody without a role may do anything', () => {
    for (const action of ACTIONS) assert.equal(can(undefined, action), false, action);
  });

  it('a signed inspection is frozen for every role: nothing more is recorded in it, nor signed again', () => {
    for (const role of ROLES) {
      assert.equal(can(role, 'inspection.record', { signed: true }), false, role);
      assert.equal(can(role, 'inspection.sign', { signed: true }), false, role);
    }
    assert.equal(can('inspector', 'inspection.record', { signed: false }), true);
  });

  it('the deficiency workflow reads the same table', () => {
    for (const role of ROLES) {
      assert.equal(may(role, 'verify'), can(role, 'deficiency.verify'), role);
      assert.equal(may(role, 'accept'), can(role, 'deficiency.accept'), role);
    }
    // an electrician moves an open deficiency to scheduled or repaired, never deferred (DESIGN.md §6)
    assert.deepEqual(nextStatuses('electrician', 'open').map((n) => n.to).sort(), ['repaired', 'scheduled']);
    assert.deepEqual(nextStatuses('owner', 'open').map((n) => n.to), ['deferred']);
  });
});

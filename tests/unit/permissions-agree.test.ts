/**
 * The screens and the server answer "may this role do this?" from the same table
 * (shared/permissions.ts). For every role × action × record state, each server guard refuses
 * exactly what `can` refuses, and the screens ask `can` itself: no screen, component, hook or
 * client module compares a role by name any more (the scan below fails on a new one).
 *
 * The rules the table itself is checked against are in tests/unit/permissions.test.ts
 * (DESIGN.md §2 "Users" and §6 "Deficiency workflow"); here: the frozen signed inspection
 * (DEVELOPERS.md "The condition record": sign-off freezes the inspection and its readings) and who
 * writes each synced kind (DEVELOPERS.md "Adding a record kind", step 3).
 */
import assert from 'node:assert/strict';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, it } from 'node:test';
import { ROLES, type Role } from '../../shared/domain';
import { ACTIONS, can, type Action, type RecordState } from '../../shared/permissions';
import { checkDeficiencyRaise, may } from '../../shared/deficiency';
import { requireAdmin, requireScheduleEditor, type Actor } from '../../server/auth/access';
import { requireOrgAdmin } from '../../server/services/access';
import { RECORD_SPECS, bandSpec } from '../../server/sync/kinds';
import { arcFlashSpec } from '../../server/sync/kinds/arc-flash';

const STATES: readonly RecordState[] = [{}, { signed: false }, { signed: true }];

/** Does a guard that throws on refusal let this through? */
function passes(guard: () => void): boolean {
  try {
    guard();
    return true;
  } catch {
    return false;
  }
}

function actorWith(role: Role): Actor {
  return { userId: 'u', roles: new Map([['org', role]]), grants: new Set() };
}

describe('the server guards and the screens read one table', () => {
  it('the schedule guard answers as `can` for every role and schedule action', () => {
    for (const role of ROLES) {
      for (const action of ['schedule.edit', 'building.create', 'building.edit'] as const satisfies readonly Action[]) {
        assert.equal(passes(() => requireScheduleEditor(role, action)), can(role, action), `${role} × ${action}`);
      }
    }
  });

  it('the admin guards (building delete and restore, people) answer as `can`', () => {
    for (const role of ROLES) {
      for (const action of ['building.delete', 'building.restore'] as const satisfies readonly Action[]) {
        assert.equal(passes(() => requireAdmin(role, action, 'do it')), can(role, action), `${role} × ${action}`);
      }
      assert.equal(passes(() => requireOrgAdmin(actorWith(role), 'org', 'do it')), can(role, 'people.manage'), role);
    }
  });

  it('raising a deficiency: the server check, the workflow and `can` agree', () => {
    for (const role of ROLES) {
      assert.equal(checkDeficiencyRaise(role) === null, can(role, 'deficiency.raise'), role);
      assert.equal(may(role, 'raise'), can(role, 'deficiency.raise'), role);
    }
  });

  it('every synced kind writes under the action its rule names', () => {
    // DESIGN.md §2: inspections, readings, trips and their photos are the field team's record;
    // a deficiency is written by anyone (each field then has its own action) and deleted by its
    // raisers; the band library is kept by the field team; the arc-flash label is the schedule
    // keepers' (electricians and admins), as the panel it hangs on.
    const expected: Record<string, { write: Action; remove: Action }> = {
      inspection: { write: 'inspection.record', remove: 'inspection.record' },
      reading: { write: 'inspection.record', remove: 'inspection.record' },
      trip: { write: 'inspection.record', remove: 'inspection.record' },
      photo: { write: 'inspection.record', remove: 'inspection.record' },
      deficiency: { write: 'deficiency.write', remove: 'deficiency.delete' },
      'arc-flash': { write: 'arc-flash.edit', remove: 'arc-flash.edit' },
    };
    for (const spec of [...RECORD_SPECS, arcFlashSpec]) {
      assert.deepEqual({ write: spec.write, remove: spec.remove ?? spec.write }, expected[spec.kind], spec.kind);
    }
    assert.equal(bandSpec.write, 'band.edit');
    assert.deepEqual(ROLES.filter((r) => can(r, 'arc-flash.edit')).sort(), ['admin', 'electrician']);
  });

  it('a signature freezes recording and signing for every role, and nothing else', () => {
    for (const role of ROLES) {
      for (const action of ACTIONS) {
        for (const state of STATES) {
          const frozen = state.signed === true && (action === 'inspection.record' || action === 'inspection.sign');
          assert.equal(can(role, action, state), can(role, action) && !frozen, `${role} × ${action} × ${JSON.stringify(state)}`);
        }
      }
    }
  });
});

/** Every .ts/.tsx file under these client folders. */
function clientFiles(): string[] {
  const root = path.resolve(__dirname, '../..');
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const full = path.join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (/\.tsx?$/.test(name)) out.push(path.relative(root, full));
    }
  };
  for (const top of ['app', 'components', 'hooks', 'lib']) walk(path.join(root, top));
  return out;
}

describe('no screen decides by a role name', () => {
  // A comparison with a role by name outside the table. These files compare roles as data, not
  // as permission: the invitation form's chosen role (an owner invitation needs buildings) and
  // the people list (the last admin cannot be demoted; an owner row lists grants).
  const ROLE_AS_DATA = new Set(['components/access/access-invite.tsx', 'components/access/access-people.tsx']);
  const ROLE_CHECK = /\brole\s*[!=]==?\s*'(admin|electrician|inspector|owner)'|'(admin|electrician|inspector|owner)'\s*[!=]==?\s*\w*role\b/i;

  it('app/, components/, hooks/ and lib/ ask `can` instead', () => {
    const offenders = clientFiles()
      .filter((file) => !ROLE_AS_DATA.has(file))
      .flatMap((file) =>
        readFileSync(path.resolve(__dirname, '../..', file), 'utf8')
          .split('\n')
          .map((line, i) => ({ where: `${file}:${i + 1}`, line }))
          .filter(({ line }) => ROLE_CHECK.test(line)),
      );
    assert.deepEqual(offenders, []);
  });
});

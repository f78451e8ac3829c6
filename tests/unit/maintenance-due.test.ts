import { describe, it } from 'node:test';
import assert from 'node:assert/strict';

import { dueWords, isDue, maintenanceDue, type DueInspection, type DuePanel } from '../../shared/maintenance-due';

const panel = (id: string, condition: 1 | 2 | 3, kind: DuePanel['kind'] = 'panelboard'): DuePanel => ({
  id,
  buildingId: 'b1',
  tag: id.toUpperCase(),
  kind,
  condition,
});
const insp = (id: string, kind: DueInspection['kind'], performedOn: string, panelIds: string[], deletedAt: string | null = null): DueInspection => ({
  id,
  kind,
  performedOn,
  panelIds,
  deletedAt,
});
const find = (items: ReturnType<typeof maintenanceDue>, panelId: string, task: 'thermography' | 'maintenance') =>
  items.find((i) => i.panelId === panelId && i.task === task)!;

describe('maintenance due list (NFPA 70B 2023 intervals as shared/calc/maintenance.ts documents them)', () => {
  const today = '2026-06-15';

  it('panelboard condition 1: maintenance 60 months after the last full maintenance (NFPA 70B 2023, seen in the published text); thermography 12 months', () => {
    const items = maintenanceDue([panel('la', 1)], [insp('i1', 'full-maintenance', '2024-03-10', ['la'])], today);
    const m = find(items, 'la', 'maintenance');
    assert.equal(m.dueOn, '2029-03-10');
    assert.equal(m.intervalMonths, 60);
    assert.equal(m.state, 'later');
    assert.equal(m.verified, true);
    const t = find(items, 'la', 'thermography');
    // NFPA 70B 2023: thermographic survey at least every 12 months → 2025-03-10, overdue on 2026-06-15
    assert.equal(t.dueOn, '2025-03-10');
    assert.equal(t.intervalMonths, 12);
    assert.equal(t.state, 'overdue');
    assert.equal(dueWords(t), 'overdue by 462 days');
  });

  it('condition 3: thermography every 6 months (NFPA 70B 2023); maintenance 12 months (from memory, marked unverified)', () => {
    const items = maintenanceDue([panel('lb', 3)], [insp('i1', 'full-maintenance', '2026-01-01', ['lb'])], today);
    const t = find(items, 'lb', 'thermography');
    assert.equal(t.dueOn, '2026-07-01');
    assert.equal(t.intervalMonths, 6);
    assert.equal(t.state, 'soon', '16 days away: within 30 days');
    const m = find(items, 'lb', 'maintenance');
    assert.equal(m.intervalMonths, 12);
    assert.equal(m.verified, false);
    assert.match(m.basis, /from memory/);
  });

  it('condition 2: maintenance every 36 months (from memory)', () => {
    const items = maintenanceDue([panel('p', 2)], [insp('i1', 'full-maintenance', '2025-01-31', ['p'])], today);
    assert.equal(find(items, 'p', 'maintenance').dueOn, '2028-01-31');
  });

  it('thermography counts from the later of a thermal survey or a full maintenance; maintenance only from a full maintenance', () => {
    const items = maintenanceDue(
      [panel('la', 1)],
      [insp('m', 'full-maintenance', '2024-01-01', ['la']), insp('t', 'thermal-survey', '2026-02-01', ['la']), insp('v', 'visual', '2026-05-01', ['la'])],
      today,
    );
    assert.equal(find(items, 'la', 'thermography').lastInspectionId, 't');
    assert.equal(find(items, 'la', 'thermography').dueOn, '2027-02-01');
    assert.equal(find(items, 'la', 'maintenance').lastInspectionId, 'm');
  });

  it('an inspection only counts for the panels it covers, and deleted inspections do not count', () => {
    const items = maintenanceDue(
      [panel('la', 1), panel('lb', 1)],
      [insp('t', 'thermal-survey', '2026-02-01', ['la']), insp('gone', 'thermal-survey', '2026-03-01', ['lb'], '2026-03-02')],
      today,
    );
    assert.equal(find(items, 'la', 'thermography').state, 'later');
    assert.equal(find(items, 'lb', 'thermography').state, 'never');
  });

  it('no inspection on record: due now, counted as due', () => {
    const [first] = maintenanceDue([panel('x', 1)], [], today);
    assert.equal(first.state, 'never');
    assert.equal(first.dueOn, null);
    assert.equal(dueWords(first), 'no inspection on record — due now');
    assert.equal(isDue(first), true);
    assert.equal(first.task, 'maintenance');
    assert.match(first.basis, /once done, NFPA 70B 2023, panelboards in condition 1: every 60 months/);
  });

  it('a panel with other inspections but no full maintenance says which is missing, not "no inspection on record"', () => {
    // the demo's panel LA: a thermal survey and a torque audit, never a full maintenance
    const items = maintenanceDue(
      [panel('la', 2)],
      [insp('s', 'thermal-survey', '2026-05-26', ['la']), insp('q', 'torque-audit', '2026-05-28', ['la'])],
      today,
    );
    const m = find(items, 'la', 'maintenance');
    assert.equal(m.state, 'never');
    assert.equal(dueWords(m), 'no full maintenance on record — due now');
    assert.doesNotMatch(m.basis, /no inspection on record/);
    assert.deepEqual(m.lastInspection, { kind: 'torque-audit', performedOn: '2026-05-28' });
    assert.equal(find(items, 'la', 'thermography').state, 'later');
    // a panel never inspected at all still says so
    const [x] = maintenanceDue([panel('x', 1)], [insp('s', 'thermal-survey', '2026-05-26', ['la'])], today);
    assert.equal(dueWords(x), 'no inspection on record — due now');
    assert.equal(x.lastInspection, null);
  });

  it('a switchboard has no maintenance interval on file (calc returns null): said so, not counted as due', () => {
    const items = maintenanceDue([panel('msb', 1, 'switchboard')], [insp('f', 'full-maintenance', '2026-01-10', ['msb'])], today);
    const m = find(items, 'msb', 'maintenance');
    assert.equal(m.state, 'no-interval');
    assert.equal(isDue(m), false);
    assert.equal(find(items, 'msb', 'thermography').dueOn, '2027-01-10');
  });

  it('overdue first (longest overdue first), then never inspected, then due soon, then later', () => {
    const items = maintenanceDue(
      [panel('a', 1), panel('b', 1), panel('c', 1)],
      [
        insp('ta', 'thermal-survey', '2025-06-01', ['a']), // due 2026-06-01: overdue 14 days
        insp('tb', 'thermal-survey', '2024-06-01', ['b']), // due 2025-06-01: overdue 379 days
        insp('fc', 'full-maintenance', '2025-07-01', ['c']), // thermography due 2026-07-01: soon
      ],
      today,
    );
    assert.deepEqual(
      items.map((i) => `${i.tag} ${i.task} ${i.state}`),
      [
        'B thermography overdue',
        'A thermography overdue',
        'A maintenance never',
        'B maintenance never',
        'C thermography soon',
        'C maintenance later',
      ],
    );
  });
});

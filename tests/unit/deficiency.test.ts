/** The deficiency workflow rules (shared/deficiency.ts): our product's rules, not a standard. */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { checkDeficiencyChange, dueOnFor, nextStatuses } from '../../shared/deficiency';
import { DEFAULT_DUE_DAYS, organisationSettingsSchema } from '../../shared/records';
import { fieldErrors } from '../../shared/schemas';
import type { DeficiencyFields } from '../../shared/records';

const base: DeficiencyFields = {
  panelId: null, circuitId: null, inspectionId: null, readingId: null, source: 'manual', check: null,
  title: 'Hot lug', description: '', priority: 2, priorityReason: '', dueOn: '2026-12-01', status: 'open',
  assigneeId: null, repairNote: '', deferReason: '', reviewOn: null, acceptedAt: null,
};
const change = (role: Parameters<typeof checkDeficiencyChange>[0]['role'], after: Partial<DeficiencyFields>, repairPhotos = 0, before = base) =>
  checkDeficiencyChange({ role, before, after: { ...before, ...after }, changed: Object.keys(after), repairPhotos });

describe('deficiency workflow', () => {
  it('each role is offered only its own steps', () => {
    assert.deepEqual(nextStatuses('electrician', 'open').map((s) => s.to), ['scheduled', 'repaired']);
    assert.deepEqual(nextStatuses('owner', 'open').map((s) => s.to), ['deferred']);
    assert.deepEqual(nextStatuses('inspector', 'repaired').map((s) => s.to), ['verified', 'open']);
    assert.deepEqual(nextStatuses('owner', 'deferred').map((s) => s.to), ['open']);
    assert.deepEqual(nextStatuses('electrician', 'verified'), []);
  });

  it('a repair needs a note or a photo', () => {
    assert.ok(change('electrician', { status: 'repaired' }).fields.repairNote);
    assert.deepEqual(change('electrician', { status: 'repaired' }, 1).fields, {});
    assert.deepEqual(change('electrician', { status: 'repaired', repairNote: 'retorqued' }).fields, {});
  });

  it('refuses steps outside the role, and transitions that do not exist', () => {
    assert.match(change('owner', { status: 'repaired', repairNote: 'x' }).forbidden ?? '', /Owners cannot mark a repair done/);
    assert.match(change('electrician', { title: 'New words' }).forbidden ?? '', /Electricians cannot edit/);
    assert.equal(change('inspector', { status: 'verified' }).fields.status, 'An open deficiency cannot become verified');
  });

  it('an unchanged field sent again is no change', () => {
    assert.equal(change('owner', { title: base.title, status: 'deferred', deferReason: 'budget', reviewOn: '2027-01-01' }).forbidden, null);
  });

  it('due dates count calendar days from the day raised (defaults 0/30/90/365 [CP]: P1 "now" is due the day it is raised)', () => {
    assert.equal(dueOnFor(1, '2026-12-28'), '2026-12-28');
    assert.equal(dueOnFor(2, '2026-12-28'), '2027-01-27');
    assert.equal(dueOnFor(3, '2026-12-28'), '2027-03-28');
    assert.equal(dueOnFor(4, '2028-03-01'), '2029-03-01');
    assert.equal(dueOnFor(2, '2026-01-31', { 1: 1, 2: 14, 3: 60, 4: 180 }), '2026-02-14');
  });
});

describe('organisation due days (shared/records.ts organisationSettingsSchema)', () => {
  const check = (dueDays: Record<number, number>) =>
    organisationSettingsSchema.safeParse({ dueDays, keepPhotoLocation: false });

  it('the defaults fit the words: P1 now today, then soon, planned, watch', () => {
    assert.deepEqual(DEFAULT_DUE_DAYS, { 1: 0, 2: 30, 3: 90, 4: 365 });
    assert.equal(check(DEFAULT_DUE_DAYS).success, true);
  });

  it('a later priority may not be due sooner than an earlier one; the field that breaks the order is named', () => {
    const r = check({ 1: 0, 2: 30, 3: 14, 4: 365 });
    assert.equal(r.success, false);
    const fields = fieldErrors(r.error!);
    assert.match(fields['dueDays.3'] ?? '', /P3 planned.*at least 30 days.*P2 soon/);
    assert.equal(Object.keys(fields).length, 1);
    // equal is fine: an organisation may give P1 and P2 the same day
    assert.equal(check({ 1: 0, 2: 0, 3: 0, 4: 0 }).success, true);
  });

  it('whole days, not negative', () => {
    assert.ok(fieldErrors(check({ 1: -1, 2: 30, 3: 90, 4: 365 }).error!)['dueDays.1']);
    assert.ok(fieldErrors(check({ 1: 0.5, 2: 30, 3: 90, 4: 365 }).error!)['dueDays.1']);
  });
});

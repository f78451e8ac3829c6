/**
 * The arc-flash label of a panel (shared/arc-flash.ts): its review day and its checks.
 * Sources: NFPA 70E 130.5(H) [2021 ed., REFERENCES.md V] — a label gives the nominal voltage,
 * the arc-flash boundary and either the incident energy with its working distance or the PPE
 * category, not both; 130.5(G) [2021 ed., V; the 2024 paragraph letter from memory] — the study
 * is reviewed at intervals of no more than 5 years.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import {
  arcFlashCreateBody,
  arcFlashOverdue,
  arcFlashPatchBody,
  arcFlashProblems,
  arcFlashReviewDue,
  currentLabel,
  latestStudyDate,
  type ArcFlashLabel,
} from '../../shared/arc-flash';
import { fieldErrors } from '../../shared/schemas';

const PANEL = '0190a000-0000-7000-8000-000000000001';
const good = {
  panelId: PANEL,
  studyDate: '2023-04-12',
  incidentEnergyCalCm2: 4.2,
  boundaryIn: 36,
  workingDistanceIn: 18,
  nominalV: 480,
  studyBy: 'R. Engineer, PE',
};

function errorsOf(body: unknown): Record<string, string> {
  const parsed = arcFlashCreateBody.safeParse(body);
  return parsed.success ? {} : fieldErrors(parsed.error);
}

describe('arc-flash review due (NFPA 70E 130.5(G): at most 5 years)', () => {
  it('is the same day five years after the study', () => {
    assert.equal(arcFlashReviewDue('2023-04-12'), '2028-04-12');
    assert.equal(arcFlashReviewDue('2019-12-31'), '2024-12-31');
  });

  it('a study of 29 February is due on 28 February five years on, never later [CP]', () => {
    assert.equal(arcFlashReviewDue('2024-02-29'), '2029-02-28');
    // 2020 + 5 = 2025 (not leap); 1996 + 5 = 2001 (not leap)
    assert.equal(arcFlashReviewDue('1996-02-29'), '2001-02-28');
  });

  it('is overdue only after its review day', () => {
    assert.equal(arcFlashOverdue('2023-04-12', '2028-04-12'), false);
    assert.equal(arcFlashOverdue('2023-04-12', '2028-04-13'), true);
    assert.equal(arcFlashOverdue('2019-01-01', '2026-12-03'), true);
  });
});

describe('arc-flash label checks, field by field', () => {
  it('takes a label with the incident energy, or one with the PPE category (130.5(H))', () => {
    assert.deepEqual(errorsOf(good), {});
    assert.deepEqual(errorsOf({ ...good, incidentEnergyCalCm2: null, ppeCategory: 2 }), {});
    // 0 cal/cm² is a figure a study can give (below 1.2 cal/cm² no arc-rated clothing is required [CP])
    assert.deepEqual(errorsOf({ ...good, incidentEnergyCalCm2: 0 }), {});
  });

  it('needs one of incident energy and PPE category, and not both (130.5(H))', () => {
    const neither = errorsOf({ ...good, incidentEnergyCalCm2: null });
    assert.ok(neither.incidentEnergyCalCm2 && neither.ppeCategory, JSON.stringify(neither));
    assert.match(errorsOf({ ...good, ppeCategory: 3 }).ppeCategory, /not both/);
  });

  it('refuses a negative energy, a category outside 1–4, a boundary or distance of 0, a voltage of 0', () => {
    const errors = errorsOf({ ...good, incidentEnergyCalCm2: -1, boundaryIn: 0, workingDistanceIn: -18, nominalV: 0 });
    assert.deepEqual(Object.keys(errors).sort(), ['boundaryIn', 'incidentEnergyCalCm2', 'nominalV', 'workingDistanceIn']);
    for (const ppeCategory of [0, 5, 2.5]) {
      assert.ok(errorsOf({ ...good, incidentEnergyCalCm2: null, ppeCategory }).ppeCategory, String(ppeCategory));
    }
  });

  it('refuses a study date that is not a day of the calendar, or in the future', () => {
    assert.ok(errorsOf({ ...good, studyDate: '2023-02-30' }).studyDate);
    assert.ok(errorsOf({ ...good, studyDate: '12/04/2023' }).studyDate);
    assert.deepEqual(arcFlashProblems({ ...good, ppeCategory: null, studyDate: '2026-12-04' }, '2026-12-03'), {
      studyDate: 'cannot be in the future',
    });
    assert.deepEqual(arcFlashProblems({ ...good, ppeCategory: null, studyDate: '2026-12-03' }, '2026-12-03'), {});
    assert.ok(errorsOf({ ...good, studyDate: '2999-01-01' }).studyDate);
  });

  it('"today" somewhere on earth is at most one day ahead of UTC (UTC+14)', () => {
    assert.equal(latestStudyDate(new Date('2026-12-03T09:59:00Z')), '2026-12-03');
    assert.equal(latestStudyDate(new Date('2026-12-03T10:00:00Z')), '2026-12-04');
  });

  it('requires who did the study, and a patch names only what changes', () => {
    assert.ok(errorsOf({ ...good, studyBy: '  ' }).studyBy);
    assert.equal(arcFlashPatchBody.safeParse({ nominalV: 208 }).success, true);
    assert.equal(arcFlashPatchBody.safeParse({ panelId: PANEL }).success, false);
    assert.equal(arcFlashPatchBody.safeParse({ studyDate: '2999-01-01' }).success, false);
  });
});

describe('the label a panel shows', () => {
  it('is the latest study', () => {
    const row = (id: string, studyDate: string, updatedAt: string) => ({ id, studyDate, updatedAt }) as ArcFlashLabel;
    assert.equal(currentLabel([row('a', '2018-01-01', 'z'), row('b', '2023-04-12', 'a'), row('c', '2020-06-30', 'm')])?.id, 'b');
    assert.equal(currentLabel([]), undefined);
  });
});

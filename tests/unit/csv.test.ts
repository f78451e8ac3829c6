import { describe, it } from 'node:test';
import assert from 'node:assert/strict';

import { DEMO_BUILDINGS, type DemoPanel } from '../../scripts/demo-data';
import {
  CSV_HEADERS,
  csvFileName,
  parseScheduleCsv,
  planImport,
  scheduleToCsv,
  type ExistingCircuit,
  type ParseContext,
} from '../../shared/csv';
import type { CircuitFields } from '../../shared/schemas';

/** the breaker identity and corrections the CSV does not carry */
const BREAKER_NOT_RECORDED = {
  interruptingKA: null, breakerMake: '', catalogueNumber: '', ambientC: null, currentCarrying: null, verifiedOn: null, verifiedBy: null,
};
const BAND = { id: '00000000-0000-7000-8000-0000000000b1', label: 'Maker curve 20 A thermal-magnetic' };

/** A demo panel's circuits as the app holds them (ids for the panels fed, by key). */
function demoSchedule(panel: DemoPanel, idOf: (key: string) => string): ExistingCircuit[] {
  return panel.circuits.map((c, i) => {
    const { feedsPanelKey, ...rest } = c;
    return {
      ...rest,
      id: `c-${panel.key}-${i}`,
      feedsPanelId: feedsPanelKey ? idOf(feedsPanelKey) : null,
      ...BREAKER_NOT_RECORDED,
      bandId: null,
    };
  });
}

function contextFor(panel: DemoPanel, buildingPanels: DemoPanel[], idOf: (key: string) => string): ParseContext {
  return {
    panel: { id: idOf(panel.key), system: panel.system, spaces: panel.spaces },
    panels: buildingPanels.map((p) => ({ id: idOf(p.key), tag: p.tag })),
    bands: [BAND],
  };
}

const strip = ({ id: _id, ...fields }: ExistingCircuit): CircuitFields => fields;

const clinic = DEMO_BUILDINGS.find((b) => b.key === 'clinic')!;
const panelKeys = DEMO_BUILDINGS.flatMap((b) => b.panels.map((p) => p.key));
/** a stable UUID per demo panel (the schemas want UUIDs) */
const idOf = (key: string) => `00000000-0000-7000-8000-${String(panelKeys.indexOf(key) + 1).padStart(12, '0')}`;
const LA = clinic.panels.find((p) => p.tag === 'LA')!;
const ctxLA = contextFor(LA, clinic.panels, idOf);

/** A small file against clinic LA: header + rows. */
function file(...rows: string[]): string {
  return [CSV_HEADERS.join(','), ...rows].join('\n');
}
// Position,Poles,Rating (A),Breaker type,Description,Load kind,Load (VA),Continuous,Conductor size,
// Conductor material,Insulation (°C),One-way length (ft),Status,Feeds panel,Handle lock,Trip band,Notes
const row = (position: number, poles: number, rating: number | '', description = 'Exam 1 receptacles') =>
  `${position},${poles},${rating},standard,${description},receptacles,900,no,12 AWG,Cu,75,40,${rating === '' ? 'space' : 'in-use'},,no,,`;

describe('panel schedule CSV: round trip (every field of circuitFields except ids, which travel as tag/label)', () => {
  for (const building of DEMO_BUILDINGS) {
    for (const panel of building.panels) {
      it(`${building.name} ${panel.tag}: export → parse gives back the same ${panel.circuits.length} circuits`, () => {
        const circuits = demoSchedule(panel, idOf);
        const ctx = contextFor(panel, building.panels, idOf);
        const csv = scheduleToCsv(circuits, ctx);
        const parsed = parseScheduleCsv(csv, ctx);
        assert.deepEqual(parsed.fileProblems, []);
        assert.deepEqual(parsed.rows.flatMap((r) => r.problems), []);
        assert.deepEqual(
          parsed.rows.map((r) => r.circuit),
          [...circuits].sort((a, b) => a.position - b.position).map(strip),
        );
        // applied to the same panel, nothing changes
        const plan = planImport(parsed, circuits, false);
        assert.equal(plan.blocked, false);
        assert.equal(plan.creates.length + plan.patches.length + plan.deletes.length, 0);
        assert.equal(plan.unchanged, circuits.length);
      });
    }
  }

  it('feeds panel travels as the tag of the panel fed (clinic MDP feeds LA and LB)', () => {
    const mdp = clinic.panels.find((p) => p.tag === 'MDP')!;
    const ctx = contextFor(mdp, clinic.panels, idOf);
    const csv = scheduleToCsv(demoSchedule(mdp, idOf), ctx);
    const lines = csv.split('\r\n');
    assert.ok(lines.some((l) => l.includes(',LA,')), 'a row names LA as the panel it feeds');
    assert.ok(!csv.includes(idOf('clinic-LA')), 'no ids in the file');
  });

  it('a trip band travels as its label, and an unknown label is a problem of that row', () => {
    const circuits = demoSchedule(LA, idOf).map((c, i) => (i === 0 ? { ...c, bandId: BAND.id } : c));
    const csv = scheduleToCsv(circuits, ctxLA);
    assert.equal(parseScheduleCsv(csv, ctxLA).rows[0].circuit?.bandId, BAND.id);
    const bad = parseScheduleCsv(csv.replace(BAND.label, 'No such curve'), ctxLA);
    assert.match(bad.rows[0].problems[0], /^row 2: unknown trip band "No such curve"/);
  });

  it('quoted commas, quotes and newlines in descriptions and notes survive', () => {
    const circuits = demoSchedule(LA, idOf);
    circuits[0] = { ...circuits[0], description: 'Exam 3, 4 & "hall" receptacles', notes: 'Line one\nLine two, with a comma\r\nLine "three"' };
    const csv = scheduleToCsv(circuits, ctxLA);
    const parsed = parseScheduleCsv(csv, ctxLA);
    assert.deepEqual(parsed.fileProblems, []);
    const first = parsed.rows.find((r) => r.circuit?.position === circuits[0].position)!;
    assert.equal(first.circuit?.description, circuits[0].description);
    assert.equal(first.circuit?.notes, circuits[0].notes);
    // a multi-line value is still one spreadsheet row: the next circuit is row 3
    assert.equal(parsed.rows[1].row, 3);
  });

  it('file name is <tag>-schedule.csv', () => {
    assert.equal(csvFileName('LA'), 'LA-schedule.csv');
    assert.equal(csvFileName('2LA / east'), '2LA-east-schedule.csv');
  });
});

describe('panel schedule CSV: malformed files are refused with a reason per row', () => {
  it('names each bad row: rating not a NEC 240.6(A) standard rating, overlap with a 2-pole', () => {
    // rows 2..6; a 2-pole at 5 takes 5 and 7 (standard numbering [CP]), so row 6 at 7 overlaps it
    const text = file(row(1, 1, 20), row(3, 1, 20), row(4, 1, 23), row(5, 2, 30), row(7, 1, 20));
    const plan = planImport(parseScheduleCsv(text, ctxLA), [], false);
    assert.equal(plan.blocked, true);
    const problems = plan.rows.flatMap((r) => r.problems);
    assert.deepEqual(problems, [
      'row 4: rating 23 A is not a standard rating (NEC 240.6(A)).',
      'row 6: position 7 overlaps the 2-pole at 5 of row 5.',
    ]);
    // a row with a problem still names its position: that position is not "left out of the file"
    const la = planImport(parseScheduleCsv(scheduleToCsv(demoSchedule(LA, idOf), ctxLA).replace(/^3,1,20,/m, '3,1,23,'), ctxLA), demoSchedule(LA, idOf), false);
    assert.equal(la.kept.length, 0);
    assert.equal(la.rows.filter((r) => r.problems.length).length, 1);
  });

  it('overlap with a circuit that stays in the panel (positions the file leaves out are kept)', () => {
    const existing: ExistingCircuit[] = [{ ...strip({ ...demoSchedule(LA, idOf)[0] }), id: 'x', position: 5, poles: 2 }];
    const plan = planImport(parseScheduleCsv(file(row(7, 1, 20)), ctxLA), existing, false);
    assert.deepEqual(plan.rows[0].problems, ['row 2: position 7 overlaps the 2-pole at 5 that stays in the panel.']);
    // …and no overlap once the user asks to remove what the file leaves out
    const removing = planImport(parseScheduleCsv(file(row(7, 1, 20)), ctxLA), existing, true);
    assert.equal(removing.blocked, false);
    assert.deepEqual(removing.deletes.map((c) => c.id), ['x']);
  });

  it('unknown conductor size and breaker type, past the last space, missing values', () => {
    const text = file(
      '1,1,20,standard,Exam 1,receptacles,900,no,13 AWG,Cu,75,40,in-use,,no,,',
      '3,1,20,magnetic-only,Exam 2,receptacles,900,no,12,Cu,75,40,in-use,,no,,',
      `${LA.spaces + 1},1,20,standard,Too far,receptacles,,no,12,Cu,75,,in-use,,no,,`,
      ',1,20,standard,No position,receptacles,,no,12,Cu,75,,in-use,,no,,',
      '9,1,,standard,No rating,receptacles,,no,12,Cu,75,,in-use,,no,,',
    );
    const parsed = parseScheduleCsv(text, ctxLA);
    const problems = parsed.rows.map((r) => r.problems);
    assert.match(problems[0][0], /^row 2: unknown conductor size "13 AWG"/);
    assert.match(problems[1][0], /^row 3: unknown breaker type "magnetic-only"/);
    assert.equal(problems[2][0], `row 4: position ${LA.spaces + 1} is past the panel's last space (${LA.spaces}).`);
    assert.equal(problems[3][0], 'row 5: the position is missing.');
    assert.equal(problems[4][0], 'row 6: rating (a): a breaker needs its trip rating.');
    assert.ok(parsed.rows.every((r) => r.circuit === null));
  });

  it('a 3-pole breaker on a single-phase panel (panelLayout rule: needs a three-phase bus)', () => {
    const cottage = DEMO_BUILDINGS.find((b) => b.key === 'cottage')!;
    const lc1 = cottage.panels[0];
    assert.equal(lc1.system, '120/240V-1ph-3w');
    const ctx = contextFor(lc1, cottage.panels, idOf);
    const parsed = parseScheduleCsv(file(row(1, 3, 30)), ctx);
    assert.equal(parsed.rows[0].problems[0], 'row 2: a 3-pole breaker at 1 needs a three-phase bus; this panel is single-phase.');
  });

  it('wrong headers: unknown and missing columns, no rows read', () => {
    const parsed = parseScheduleCsv('Slot,Amps,Description\n1,20,Lights\n', ctxLA);
    assert.deepEqual(parsed.rows, []);
    assert.ok(parsed.fileProblems.includes('row 1: unknown column "Slot" (the columns are: ' + CSV_HEADERS.join(', ') + ').'));
    assert.ok(parsed.fileProblems.includes('row 1: the column "Position" is missing.'));
    assert.ok(parsed.fileProblems.includes('row 1: the column "Rating (A)" is missing.'));
  });

  it('unparseable: an unclosed quote and a row with the wrong number of values', () => {
    const broken = parseScheduleCsv(file(row(1, 1, 20), row(3, 1, 20).replace('standard,', 'standard,"Exam 2')), ctxLA);
    assert.ok(broken.fileProblems.some((p) => /^row 3: a quoted value is not closed/.test(p)), broken.fileProblems.join(' | '));
    const short = parseScheduleCsv(file(row(1, 1, 20), '3,1,20'), ctxLA);
    assert.ok(short.fileProblems.includes(`row 3: 3 values where the header has ${CSV_HEADERS.length} columns.`));
    assert.equal(planImport(short, [], false).blocked, true);
  });

  it('an empty file and a header without rows are refused', () => {
    assert.equal(parseScheduleCsv('', ctxLA).fileProblems.length, 1);
    assert.deepEqual(parseScheduleCsv(file(), ctxLA).fileProblems, ['The file has a header but no circuits.']);
  });
});

describe('panel schedule CSV: the import plan', () => {
  it('patches only the fields that changed, creates new positions, keeps or removes the rest', () => {
    const circuits = demoSchedule(LA, idOf);
    const byPos = [...circuits].sort((a, b) => a.position - b.position);
    const changed = byPos.map((c) => ({ ...c }));
    changed[0].description = 'Exam 1 & 2 receptacles (renamed)';
    const withoutLast = changed.slice(0, -1);
    const plan = planImport(parseScheduleCsv(scheduleToCsv(withoutLast, ctxLA), ctxLA), circuits, false);
    assert.equal(plan.blocked, false);
    assert.deepEqual(plan.patches, [{ row: 2, circuitId: byPos[0].id, position: byPos[0].position, fields: { description: 'Exam 1 & 2 receptacles (renamed)' }, before: { description: byPos[0].description } }]);
    assert.deepEqual(plan.kept.map((c) => c.id), [byPos[byPos.length - 1].id]);
    assert.equal(plan.deletes.length, 0);
    const removing = planImport(parseScheduleCsv(scheduleToCsv(withoutLast, ctxLA), ctxLA), circuits, true);
    assert.deepEqual(removing.deletes.map((c) => c.id), [byPos[byPos.length - 1].id]);

    const fresh = planImport(parseScheduleCsv(file(row(1, 1, 20)), ctxLA), [], false);
    assert.equal(fresh.creates.length, 1);
    assert.equal(fresh.creates[0].fields.conductorSize, '12');
  });
});

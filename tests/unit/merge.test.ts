/**
 * The per-field last-writer-wins rule of shared/merge.ts (SYNC.md "Last writer wins, per field"):
 * decisions table by table, then fast-check properties — the same writes in any order, with any
 * duplication, converge to the same row and field_meta, and the latest stamp of a field always wins.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { formatHlc } from '../../shared/hlc';
import {
  FIELD_GROUPS,
  completeGroups,
  decideWrite,
  mergeWrite,
  unitsOf,
  type FieldMeta,
  type FieldWrite,
} from '../../shared/merge';

const T0 = Date.UTC(2026, 2, 1, 8, 0, 0, 0);
const stamp = (ms: number, device: string, counter = 0) => formatHlc({ wallMs: T0 + ms, counter, deviceId: device });
const meta = (hlc: string, version: number, device: string) => ({ hlc, version, device });

describe('FIELD_GROUPS', () => {
  it('position and poles are one group', () => {
    assert.ok(FIELD_GROUPS.some((g) => g.includes('position') && g.includes('poles')));
    assert.deepEqual(unitsOf(['notes', 'poles', 'position', 'ratingA']), [['notes'], ['position', 'poles'], ['ratingA']]);
  });

  it('completeGroups fills a missing member from the row, and nothing else', () => {
    const row = { position: 5, poles: 2, notes: 'n' };
    assert.deepEqual(completeGroups({ position: 7 }, row), { position: 7, poles: 2 });
    assert.deepEqual(completeGroups({ notes: 'x' }, row), { notes: 'x' });
  });
});

describe('decideWrite: one write against stored stamps', () => {
  const stored: FieldMeta = {
    description: meta(stamp(100, 'b'), 7, 'b'),
    position: meta(stamp(50, 'a'), 5, 'a'),
    poles: meta(stamp(50, 'a'), 5, 'a'),
  };
  const row = { description: 'Corridor lights', position: 3, poles: 1, notes: '' };
  const rows: { name: string; write: FieldWrite; outcome: string; concurrent: boolean; conflict: boolean }[] = [
    {
      name: 'a field never stamped applies',
      write: { hlc: stamp(1, 'a'), device: 'a', fields: { notes: 'x' } },
      outcome: 'apply', concurrent: false, conflict: false,
    },
    {
      name: 'a later stamp applies (REST write, no base version: never concurrent)',
      write: { hlc: stamp(200, 'server'), device: 'server', fields: { description: 'East lights' } },
      outcome: 'apply', concurrent: false, conflict: false,
    },
    {
      name: 'an earlier stamp loses, and losing to another device is a conflict',
      write: { hlc: stamp(90, 'a'), device: 'a', fields: { description: 'West lights' }, baseVersion: 7 },
      outcome: 'lose', concurrent: false, conflict: true,
    },
    {
      name: 'the very same stamp is a replay: no-op',
      write: { hlc: stamp(100, 'b'), device: 'b', fields: { description: 'Corridor lights' }, baseVersion: 6 },
      outcome: 'same', concurrent: false, conflict: false,
    },
    {
      name: 'same millisecond and counter: the greater device id wins the tie',
      write: { hlc: stamp(100, 'c'), device: 'c', fields: { description: 'Lobby' }, baseVersion: 3 },
      outcome: 'apply', concurrent: true, conflict: true,
    },
    {
      name: 'same millisecond and counter, smaller device id loses the tie',
      write: { hlc: stamp(100, 'a'), device: 'a', fields: { description: 'Lobby' }, baseVersion: 7 },
      outcome: 'lose', concurrent: false, conflict: true,
    },
    {
      name: 'a later write over an unseen write from elsewhere is concurrent: logged though it wins',
      write: { hlc: stamp(300, 'a'), device: 'a', fields: { description: 'Stair lights' }, baseVersion: 6 },
      outcome: 'apply', concurrent: true, conflict: true,
    },
    {
      name: 'concurrent but the same value: nothing is lost, no conflict',
      write: { hlc: stamp(300, 'a'), device: 'a', fields: { description: 'Corridor lights' }, baseVersion: 6 },
      outcome: 'apply', concurrent: true, conflict: false,
    },
    {
      name: 'overwriting the own device’s unseen write is not a conflict',
      write: { hlc: stamp(300, 'b'), device: 'b', fields: { description: 'Stair' }, baseVersion: 1 },
      outcome: 'apply', concurrent: false, conflict: false,
    },
    {
      name: 'a group is decided once: poles alone against the group stamp',
      write: { hlc: stamp(40, 'c'), device: 'c', fields: { poles: 2 }, baseVersion: 5 },
      outcome: 'lose', concurrent: false, conflict: true,
    },
  ];
  for (const r of rows) {
    it(r.name, () => {
      const [d] = decideWrite(stored, r.write, row);
      assert.equal(d.outcome, r.outcome);
      assert.equal(d.concurrent, r.concurrent);
      assert.equal(d.conflict, r.conflict);
    });
  }

  it('mergeWrite stamps every member of a group with one stamp', () => {
    const write = { hlc: stamp(400, 'c'), device: 'c', fields: { position: 9, poles: 2 } };
    const out = mergeWrite(row, stored, write, { version: 12, user: 'u1' });
    assert.deepEqual(out.applied, ['position', 'poles']);
    assert.equal(out.row.position, 9);
    assert.equal(out.row.poles, 2);
    assert.deepEqual(out.meta.position, { hlc: write.hlc, version: 12, device: 'c', user: 'u1' });
    assert.deepEqual(out.meta.poles, out.meta.position);
    assert.deepEqual(out.meta.description, stored.description, 'untouched fields keep their stamp');
    assert.equal(row.position, 3, 'inputs are not changed');
  });
});

// ---------- properties ----------

const DEVICES = ['a', 'b', 'c'];
const SINGLE_FIELDS = ['description', 'notes', 'ratingA'] as const;
const START = { description: '', notes: '', ratingA: null as number | null, position: 1, poles: 1 };

interface GeneratedWrite extends FieldWrite {
  version: number;
}

/** Writes with distinct stamps (one stamp is one write), each carrying whole groups. */
const writesArb: fc.Arbitrary<GeneratedWrite[]> = fc
  .uniqueArray(
    fc.record({
      ms: fc.integer({ min: 0, max: 30 }),
      counter: fc.integer({ min: 0, max: 2 }),
      device: fc.constantFrom(...DEVICES),
      description: fc.option(fc.constantFrom('Lights', 'Receptacles', 'Pump'), { nil: undefined }),
      notes: fc.option(fc.string({ maxLength: 4 }), { nil: undefined }),
      ratingA: fc.option(fc.option(fc.constantFrom(15, 20, 30), { nil: null }), { nil: undefined }),
      group: fc.option(fc.record({ position: fc.integer({ min: 1, max: 42 }), poles: fc.constantFrom(1, 2, 3) }), {
        nil: undefined,
      }),
      baseVersion: fc.integer({ min: 0, max: 5 }),
    }),
    { minLength: 1, maxLength: 12, selector: (w) => `${w.ms}/${w.counter}/${w.device}` },
  )
  .map((raw) =>
    raw.map((w, i) => {
      const fields: Record<string, unknown> = {};
      for (const f of SINGLE_FIELDS) if (w[f] !== undefined) fields[f] = w[f];
      if (w.group) Object.assign(fields, w.group);
      return { hlc: stamp(w.ms, w.device, w.counter), device: w.device, fields, baseVersion: w.baseVersion, version: i + 1 };
    }),
  );

function applyAll(writes: readonly GeneratedWrite[]) {
  let row: Record<string, unknown> = { ...START };
  let m: FieldMeta = {};
  for (const w of writes) {
    const out = mergeWrite(row, m, w, { version: w.version, user: `user-${w.device}` });
    row = out.row;
    m = out.meta;
  }
  return { row, meta: m };
}

/** The writes in the order given by `order` (a permutation), each repeated `repeats[i]` extra times. */
const scheduleArb = writesArb.chain((writes) =>
  fc.tuple(
    fc.constant(writes),
    fc.shuffledSubarray(writes, { minLength: writes.length, maxLength: writes.length }),
    fc.array(fc.nat({ max: writes.length - 1 }), { maxLength: 10 }),
    fc.array(fc.nat({ max: 1000 }), { maxLength: 10 }),
  ),
);

describe('merge properties (fast-check)', () => {
  it('any order, any duplication: the same row and the same field_meta', () => {
    fc.assert(
      fc.property(scheduleArb, ([writes, shuffled, dupIndexes, positions]) => {
        const schedule = [...shuffled];
        dupIndexes.forEach((idx, k) => schedule.splice((positions[k] ?? 0) % (schedule.length + 1), 0, writes[idx]));
        assert.deepEqual(applyAll(schedule), applyAll(writes));
      }),
      { numRuns: 500 },
    );
  });

  it('the latest stamp of each field (or group) is the value that stays', () => {
    fc.assert(
      fc.property(scheduleArb, ([, shuffled]) => {
        const { row, meta: m } = applyAll(shuffled);
        for (const field of [...SINGLE_FIELDS, 'position', 'poles']) {
          const writers = shuffled.filter((w) => field in w.fields);
          if (writers.length === 0) {
            assert.equal(row[field], START[field as keyof typeof START]);
            assert.equal(m[field], undefined);
            continue;
          }
          const latest = writers.reduce((a, b) => (b.hlc > a.hlc ? b : a));
          assert.deepEqual(row[field], latest.fields[field], field);
          assert.equal(m[field].hlc, latest.hlc);
          assert.equal(m[field].device, latest.device);
        }
        assert.equal(m.position?.hlc, m.poles?.hlc, 'one stamp for the group');
      }),
      { numRuns: 500 },
    );
  });

  it('a write that applied is never undone by an earlier one arriving later', () => {
    fc.assert(
      fc.property(writesArb, (writes) => {
        const sorted = [...writes].sort((x, y) => (x.hlc < y.hlc ? -1 : 1));
        const newestFirst = applyAll([...sorted].reverse());
        const oldestFirst = applyAll(sorted);
        assert.deepEqual(newestFirst, oldestFirst);
      }),
    );
  });
});

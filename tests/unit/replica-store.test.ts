/** How the device's copy is split into stored entries and read back (lib/replica-store.ts). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import type { BuildingCopy } from '../../lib/replica';
import {
  addCircuits,
  buildingOfPanel,
  circuitsByPanel,
  copyKeys,
  headOf,
  joinCopy,
  panelOfPath,
  parseHead,
  parseIndex,
  parsePanelCircuits,
  sameRows,
} from '../../lib/replica-store';
import type { Building, Circuit, Panel } from '../../shared/schemas';

const id = (n: number) => `0190a000-0000-7000-8000-${String(n).padStart(12, '0')}`;
const sync = (n: number, version = 3) => ({ id: id(n), updatedAt: '2026-01-01T00:00:00.000Z-0000-seed', updatedBy: null, deletedAt: null, version });
const building: Building = { ...sync(1), organisationId: id(99), name: 'Clinic', address: '1 Lane', notes: '', role: 'electrician', panelCount: 2 };
const panel = (n: number, tag: string): Panel => ({
  ...sync(n), buildingId: id(1), tag, location: 'Basement', kind: 'panelboard', system: '120/240V-1ph-3w',
  busRatingA: 225, mainRatingA: 200, shortCircuitKA: 10, spaces: 42, fedFromPanelId: null, fedFromPosition: null,
  maker: '', model: '', installedOn: null, condition: 1,
} as Panel);
const circuit = (n: number, panelN: number, position: number): Circuit => ({
  ...sync(n), panelId: id(panelN), position, poles: 1, ratingA: 20, breakerType: 'standard', description: `Room ${position}`,
  loadKind: 'receptacles', loadVA: 900, continuous: false, conductorSize: '12', conductorMaterial: 'Cu', insulationTempC: 75,
  lengthFt: 40, status: 'in-use', feedsPanelId: null, handleLock: false, notes: '', bandId: null,
} as Circuit);

const copy: BuildingCopy = {
  building,
  panels: { [id(10)]: panel(10, 'LA'), [id(11)]: panel(11, 'LB') },
  circuits: { [id(20)]: circuit(20, 10, 1), [id(21)]: circuit(21, 10, 3), [id(22)]: circuit(22, 11, 1) },
  conflicts: {},
  cursor: 7,
};

describe('splitting a building copy for storage', () => {
  it('the entry holds everything but the circuits, which are grouped by panel (an empty panel listed)', () => {
    const head = headOf(copy);
    assert.equal('circuits' in head, false);
    assert.equal(head.cursor, 7);
    const groups = circuitsByPanel({ ...copy, panels: { ...copy.panels, [id(12)]: panel(12, 'LC') } });
    assert.deepEqual([...groups.keys()], [id(10), id(11), id(12)]);
    assert.deepEqual(groups.get(id(10))!.map((c) => c.position), [1, 3]);
    assert.deepEqual(groups.get(id(12)), []);
  });

  it('joining the entry and every panel gives the same copy back', () => {
    const stored = JSON.parse(JSON.stringify(headOf(copy)));
    const circuits = [...circuitsByPanel(copy).values()].flat();
    assert.deepEqual(joinCopy(stored, JSON.parse(JSON.stringify(circuits))), copy);
  });

  it('rows are compared by identity: the same objects are not written again', () => {
    const rows = Object.values(copy.circuits);
    assert.equal(sameRows(rows, [...rows]), true);
    assert.equal(sameRows(rows, [rows[0], rows[1], { ...rows[2] }]), false);
    assert.equal(sameRows(undefined, []), false);
  });

  it('circuits loaded later never replace a row already in memory (it may be a newer edit)', () => {
    const edited = { ...copy.circuits[id(20)], description: 'Edited while loading' };
    const partial = joinCopy(headOf(copy), [edited]);
    const whole = addCircuits(partial, Object.values(copy.circuits));
    assert.equal(whole.circuits[id(20)].description, 'Edited while loading');
    assert.equal(Object.keys(whole.circuits).length, 3);
  });

  it('keys are per user, and every key of a building starts with its entry key', () => {
    const keys = copyKeys('u1');
    assert.ok(keys.panel(id(1), id(10)).startsWith(keys.building(id(1))));
    assert.ok(keys.index.startsWith(keys.prefix));
    assert.notEqual(copyKeys('u2').prefix, keys.prefix);
  });

  it('a reload on a schedule or a circuit loads that panel first', () => {
    assert.equal(panelOfPath(`/panels/${id(10)}`), id(10));
    assert.equal(panelOfPath(`/panels/${id(10)}/circuits/${id(20)}`), id(10));
    assert.equal(panelOfPath('/buildings/x'), null);
    assert.equal(buildingOfPanel({ [id(1)]: headOf(copy) }, id(11)), id(1));
    assert.equal(buildingOfPanel({ [id(1)]: headOf(copy) }, id(12)), null);
  });
});

describe('reading stored entries back', () => {
  it('a good entry, index and schedule parse', () => {
    assert.equal(parseHead(JSON.stringify(headOf(copy))).ok, true);
    assert.equal(parseIndex(JSON.stringify({ buildingIds: [id(1)], lastSyncAt: null })).ok, true);
    assert.equal(parsePanelCircuits(JSON.stringify(Object.values(copy.circuits))).ok, true);
  });

  it('a panel with no entry has no circuits', () => {
    assert.deepEqual(parsePanelCircuits(null), { ok: true, value: [] });
  });

  it('a queued row without what the server fills in, or an older copy without a newer field, still parses', () => {
    const { bandId: _added_later, ...older } = copy.circuits[id(20)];
    const queued = { id: id(30), panelId: id(10), position: 5, poles: 1, description: 'New', version: 0 };
    assert.equal(parsePanelCircuits(JSON.stringify([older, queued])).ok, true);
  });

  const damaged: [string, string, (raw: string) => { ok: boolean }][] = [
    ['cut short', JSON.stringify(headOf(copy)).slice(0, 40), parseHead],
    ['not an object', '42', parseHead],
    ['a field of the wrong type', JSON.stringify({ ...headOf(copy), building: 42 }), parseHead],
    ['a row without its id', JSON.stringify({ ...headOf(copy), panels: { x: { tag: 'LA' } } }), parseHead],
    ['no cursor', JSON.stringify({ ...headOf(copy), cursor: 'seven' }), parseHead],
    ['a circuit with a text position', JSON.stringify([{ ...copy.circuits[id(20)], position: 'one' }]), parsePanelCircuits],
    ['an index without its list', JSON.stringify({ lastSyncAt: null }), parseIndex],
  ];
  for (const [what, raw, parse] of damaged) {
    it(`refuses an entry that is ${what}, saying why`, () => {
      const parsed = parse(raw) as { ok: boolean; problem?: string };
      assert.equal(parsed.ok, false);
      assert.match(parsed.problem ?? '', /not readable|expected shape/);
    });
  }
});

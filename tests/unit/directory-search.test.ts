/** Searching a building's directory (shared/directory-search.ts): our product's behaviour. */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { searchDirectory, type SearchCircuit } from '../../shared/directory-search';

const panels = [
  { id: 'p1', tag: '2LA' },
  { id: 'p2', tag: 'LA' },
  { id: 'p3', tag: 'RP-1' },
];
const c = (id: string, panelId: string, position: number, description: string, poles = 1, notes = ''): SearchCircuit => ({
  id, panelId, position, poles, description, notes, status: 'in-use',
});
const circuits = [
  c('a', 'p1', 14, 'Walk-in cooler evaporator'),
  c('b', 'p1', 13, 'Kitchen receptacles'),
  c('c', 'p2', 14, 'Exam 3 lights'),
  c('d', 'p1', 20, 'Reach-in freezer'),
  c('e', 'p3', 5, 'Rooftop unit RTU-2', 3),
  c('f', 'p2', 3, 'Walkin cooler lights'),
];
const ids = (q: string) => searchDirectory(q, panels, circuits).map((m) => m.circuit.id);

describe('directory search', () => {
  it('finds the breaker at a panel and position however it is written', () => {
    assert.deepEqual(ids('2LA-14'), ['a']);
    assert.deepEqual(ids('what is on 2LA-14'), ['a']);
    assert.deepEqual(ids('2la 14'), ['a']);
    assert.deepEqual(ids('LA14'), ['c']);
  });

  it('a position inside a multi-pole breaker finds that breaker', () => {
    // a 3-pole at 5 occupies 5, 7 and 9 (standard panelboard numbering)
    assert.deepEqual(ids('RP-1 9'), ['e']);
  });

  it('finds what a breaker feeds from a question, ignoring the filler words', () => {
    assert.deepEqual(ids('which breaker feeds the walk-in cooler'), ['a', 'f']);
    assert.deepEqual(ids('freezer'), ['d']);
    assert.deepEqual(ids('coolers'), ['a', 'f']);
  });

  it('every meaningful word must match; nothing for a question about nothing', () => {
    assert.deepEqual(ids('walk-in freezer'), []);
    assert.deepEqual(ids('which breaker'), []);
    assert.deepEqual(ids(''), []);
  });
});

/**
 * The words people use (shared/trade-thesaurus.ts) and typos (fuse.js). Descriptions invented;
 * the abbreviations are the common ones on panel directories [CP].
 */
describe('directory search by the words people use', () => {
  const trade = [
    c('fr', 'p1', 1, 'Vaccine refrigerator, nurse station'),
    c('fg', 'p1', 2, 'Staff fridge'),
    c('fz', 'p1', 3, 'Chest freezer, store'),
    c('wc', 'p1', 4, 'Walk-in cooler'),
    c('rt', 'p1', 5, 'RTU-1 rooftop', 3),
    c('ah', 'p1', 11, 'AHU-2 supply fan', 3),
    c('cd', 'p1', 17, 'Condenser CU-3', 2),
    c('rc', 'p1', 19, 'Recepts, exam 2'),
    c('ou', 'p1', 21, 'Outlets corridor'),
    c('lt', 'p1', 23, 'Ltg, exam 2'),
    c('wh', 'p1', 25, 'EWH-1', 2),
    c('wh2', 'p1', 27, 'Water heater, laundry', 2),
    c('kt', 'p1', 29, 'Kit counter GFI'),
    c('br', 'p1', 31, 'BR 2 lts & recs'),
    c('ba', 'p1', 33, 'Bathroom GFCI'),
  ];
  const found = (q: string) => searchDirectory(q, panels, trade).map((m) => m.circuit.id);

  it('"fridge" finds refrigerators first, then what a fridge is a kind of less strongly', () => {
    // the user's own word ranks before its synonym; coolers and freezers (narrower) come last
    assert.deepEqual(found('fridge'), ['fg', 'fr', 'fz', 'wc']);
    assert.deepEqual(found('which breaker feeds the vaccine fridge'), ['fr']);
    // a narrower word does not widen: a freezer is not every fridge
    assert.deepEqual(found('freezer'), ['fz']);
  });

  it('air conditioning finds the units it is made of; a unit finds only itself', () => {
    assert.deepEqual(found('A/C'), ['rt', 'ah', 'cd']);
    assert.deepEqual(found('hvac'), ['rt', 'ah', 'cd']);
    assert.deepEqual(found('air handler'), ['ah']);
    assert.deepEqual(found('rooftop unit'), ['rt']);
    assert.deepEqual(found('condensing unit'), ['cd']);
  });

  it('receptacles, lights, water heaters, rooms and GFCI by their short forms', () => {
    assert.deepEqual(found('receptacle'), ['rc', 'ou', 'br']);
    assert.deepEqual(found('plugs exam'), ['rc']);
    assert.deepEqual(found('lighting'), ['lt', 'br']);
    assert.deepEqual(found('water heater'), ['wh2', 'wh']);
    assert.deepEqual(found('WH'), ['wh', 'wh2']);
    assert.deepEqual(found('kitchen'), ['kt']);
    assert.deepEqual(found('bedroom'), ['br']);
    assert.deepEqual(found('bath'), ['ba']);
    assert.deepEqual(found('gfci'), ['ba', 'kt']);
  });

  it('a typo still finds the word meant (fuse.js), ranked below an exact match', () => {
    assert.deepEqual(found('refrigerater'), ['fr', 'fg']);
    assert.deepEqual(found('vacine'), ['fr']);
    assert.deepEqual(found('condensor'), ['cd']);
    // short words are not guessed at: three letters are too few to tell a typo from another word
    assert.deepEqual(found('kat'), []);
    assert.deepEqual(found('hot tub'), []);
  });
});

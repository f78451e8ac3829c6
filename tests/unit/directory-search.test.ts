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

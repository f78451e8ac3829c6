/**
 * The door-card parser over many line shapes. The layouts are the usual panelboard directory
 * layouts (odd positions left, even right; one column 1…42) [CP]; ratings are checked against the
 * NEC 240.6(A) standard list only later, by the CSV import's checks (tests/unit/door-card-check.test.ts).
 */
import { describe, it } from 'node:test';
import assert from 'node:assert/strict';

import { parseDoorCard, type OcrLine } from '../../shared/door-card/parse';
import { median3 } from '../../shared/door-card/denoise';
import { readPosition, readRating, repairDigits } from '../../shared/door-card/tokens';

const BOX = { x0: 0, y0: 0, x1: 100, y1: 10 };
const line = (text: string, confidence = 92): OcrLine => ({ text, confidence, bbox: BOX });
type Row = [position: number, poles: number, ratingA: number | null, description: string, status?: string];
const short = (lines: string[]) =>
  parseDoorCard(lines.map((t) => line(t))).circuits.map((c): Row => {
    const row: Row = [c.position, c.poles, c.ratingA, c.description];
    if (c.status !== 'in-use') row.push(c.status);
    return row;
  });

describe('a rating token', () => {
  const cases: [string, { ratingA: number; poles: number | null } | null][] = [
    ['20', { ratingA: 20, poles: null }],
    ['20A', { ratingA: 20, poles: null }],
    ['20a', { ratingA: 20, poles: null }],
    ['40aA', { ratingA: 40, poles: null }], // a doubled A, a typical slip of the engine on typed cards
    ['2P-30', { ratingA: 30, poles: 2 }],
    ['2P30A', { ratingA: 30, poles: 2 }],
    ['3P-60', { ratingA: 60, poles: 3 }],
    ['2P-40aA', { ratingA: 40, poles: 2 }],
    ['30/2', { ratingA: 30, poles: 2 }],
    ['30A/2P', { ratingA: 30, poles: 2 }],
    ['2O', { ratingA: 20, poles: null }], // O for 0
    ['2OA', { ratingA: 20, poles: null }],
    ['l5A', { ratingA: 15, poles: null }], // l for 1
    ['IS', null], // no real digit: a word, never a number
    ['3S', { ratingA: 35, poles: null }], // S for 5
    ['2P-B0', { ratingA: 80, poles: 2 }], // B for 8
    ['Lobby', null],
    ['4P-30', null], // no 4-pole breakers in a panelboard position
  ];
  for (const [raw, want] of cases) {
    it(`"${raw}" → ${want ? `${want.ratingA} A${want.poles ? `, ${want.poles} poles` : ''}` : 'not a rating'}`, () => {
      const got = readRating(raw);
      assert.deepEqual(got && { ratingA: got.ratingA, poles: got.poles }, want);
    });
  }
});

describe('a position token', () => {
  const cases: [string, { start: number; poles: number | null } | null][] = [
    ['7', { start: 7, poles: null }],
    ['07', { start: 7, poles: null }],
    ['7.', { start: 7, poles: null }],
    ['(7)', { start: 7, poles: null }],
    ['l3', { start: 13, poles: null }],
    ['I', { start: 1, poles: null }],
    ['S', { start: 5, poles: null }],
    ['1-3', { start: 1, poles: 2 }],
    ['2,4,6', { start: 2, poles: 3 }],
    ['1-4', null], // a range must stay on one side (step 2)
    ['0', null],
    ['99', null], // past the largest panel we read
    ['Lobby', null],
  ];
  for (const [raw, want] of cases) {
    it(`"${raw}" → ${want ? `${want.start}${want.poles ? ` (${want.poles} poles)` : ''}` : 'not a position'}`, () => {
      const got = readPosition(raw);
      assert.deepEqual(got && { start: got.start, poles: got.poles }, want);
    });
  }
  it('repairs look-alikes only into digits', () => assert.equal(repairDigits('lO-SB'), '10-58'));
});

describe('line shapes', () => {
  const cases: [string, string[], Row[]][] = [
    ['rating before the text', ['1 20A Lobby lights'], [[1, 1, 20, 'Lobby lights']]],
    ['rating after the text', ['1 Lobby lights 20A'], [[1, 1, 20, 'Lobby lights']]],
    ['a bare rating before', ['3 20 Corridor receptacles'], [[3, 1, 20, 'Corridor receptacles']]],
    ['a bare standard rating after', ['3 Corridor receptacles 20'], [[3, 1, 20, 'Corridor receptacles']]],
    ['a room number that is no standard rating stays text', ['5 Office 116'], [[5, 1, null, 'Office 116']]],
    ['2P-30 before', ['1 2P-30 Dryer'], [[1, 2, 30, 'Dryer']]],
    ['30/2 after', ['1 Dryer 30/2'], [[1, 2, 30, 'Dryer']]],
    ['a pole word beside the rating', ['1 2P 30A Water heater'], [[1, 2, 30, 'Water heater']]],
    ['a range 1-3', ['1-3 30A Dryer'], [[1, 2, 30, 'Dryer']]],
    ['a range 2-4-6 with 3P', ['2-4-6 3P-60 Rooftop unit 1'], [[2, 3, 60, 'Rooftop unit 1']]],
    ['SPARE with a rating', ['9 20A SPARE'], [[9, 1, 20, '', 'spare']]],
    ['SPACE', ['11 SPACE'], [[11, 1, null, '', 'space']]],
    ['a position with nothing', ['13'], [[13, 1, null, '', 'space']]],
    ['OCR noise in the numbers', ['l5 2OA Break room', 'I7 Kitchen 3OA'], [[15, 1, 20, 'Break room'], [17, 1, 30, 'Kitchen']]],
    ['a trailing dot after the position', ['7. 20A Exit signs'], [[7, 1, 20, 'Exit signs']]],
    [
      'two columns on one line',
      ['1 20A Lobby lights 2 20A Corridor receptacles', '3 Exam 1 receptacles 20A 4 Exam 2 receptacles 20A'],
      [
        [1, 1, 20, 'Lobby lights'],
        [2, 1, 20, 'Corridor receptacles'],
        [3, 1, 20, 'Exam 1 receptacles'],
        [4, 1, 20, 'Exam 2 receptacles'],
      ],
    ],
    [
      'two columns where the left text holds the right position number',
      ['1 20A Room 2 lights 2 20A Receptacles'],
      [
        [1, 1, 20, 'Room 2 lights'],
        [2, 1, 20, 'Receptacles'],
      ],
    ],
    [
      'a 2-pole by a continuation mark on the next position of its side',
      ['1 30A Dryer 2 20A Lights', '3 — 4 20A Plugs'],
      [
        [1, 2, 30, 'Dryer'],
        [2, 1, 20, 'Lights'],
        [4, 1, 20, 'Plugs'],
      ],
    ],
    [
      'a 3-pole by two continuation marks',
      ['1 60A Chiller', '3 "', '5 "'],
      [[1, 3, 60, 'Chiller']],
    ],
    [
      'positions covered by a 2P range and left empty are folded',
      ['1-3 2P-30 Dryer', '3', '5 20A Fan'],
      [
        [1, 2, 30, 'Dryer'],
        [5, 1, 20, 'Fan'],
      ],
    ],
    [
      'stray marks the engine reads from grain are dropped',
      ['11 30/2 Dryer', '13 -- : 14 20A Reception desk', '17 SPARE 20A ; 18 20A Server closet', '41 SPACE 42 SPACE !'],
      [
        [11, 2, 30, 'Dryer'],
        [14, 1, 20, 'Reception desk'],
        [17, 1, 20, '', 'spare'],
        [18, 1, 20, 'Server closet'],
        [41, 1, null, '', 'space'],
        [42, 1, null, '', 'space'],
      ],
    ],
    ['a lone ditto mark is still a continuation', ['1 2P-30 Dryer', '3 "'], [[1, 2, 30, 'Dryer']]],
    ['headings and notes are not circuits', ['PANEL LA DIRECTORY', 'CKT DESCRIPTION AMPS', '1 20A Lights'], [[1, 1, 20, 'Lights']]],
  ];
  for (const [name, lines, want] of cases) {
    it(name, () => assert.deepEqual(short(lines), want));
  }

  it('keeps the lines it could not read, for the review', () => {
    const draft = parseDoorCard([line('PANEL LA'), line('1 20A Lights')]);
    assert.deepEqual(draft.unread.map((u) => u.text), ['PANEL LA']);
  });

  it('names every repair, so the review can mark the line', () => {
    const [c] = parseDoorCard([line('l5 2OA Break room')]).circuits;
    assert.deepEqual(c.notes, ['position read as 15 from "l5"', 'rating read as 20 A from an unclear number']);
  });

  it('says when the poles are written two ways', () => {
    const [c] = parseDoorCard([line('1-3 3P-40 Heater')]).circuits;
    assert.equal(c.poles, 2);
    assert.match(c.notes.join(' '), /poles written two ways \(2 and 3\)/);
  });

  it('notes a position read twice and keeps both for the review', () => {
    const cs = parseDoorCard([line('7 20A Lights'), line('7 20A Lights again')]).circuits;
    assert.equal(cs.length, 2);
    assert.ok(cs.every((c) => c.notes.some((n) => n.startsWith('position 7 read twice'))));
  });

  it('gives a half-line the box and the lowest confidence of its own words', () => {
    const words = ['1', '20A', 'Lights', '2', '20A', 'Plugs'].map((text, i) => ({
      text,
      confidence: i === 5 ? 41 : 95,
      bbox: { x0: i * 100, y0: 0, x1: i * 100 + 90, y1: 20 },
    }));
    const cs = parseDoorCard([{ text: words.map((w) => w.text).join(' '), confidence: 80, bbox: { x0: 0, y0: 0, x1: 590, y1: 20 }, words }]).circuits;
    assert.deepEqual(cs.map((c) => [c.position, c.confidence, c.bbox.x0, c.bbox.x1]), [
      [1, 95, 0, 290],
      [2, 41, 300, 590],
    ]);
  });

  it('does not read positions past the panel when told its spaces', () => {
    assert.deepEqual(parseDoorCard([line('43 20A Lights')], { spaces: 42 }).circuits, []);
  });

  it('reads a whole 42-space two-column card', () => {
    const lines: string[] = [];
    for (let p = 1; p <= 42; p += 2) lines.push(`${p} 20A Load ${p} ${p + 1} 20A Load ${p + 1}`);
    const cs = parseDoorCard(lines.map((t) => line(t))).circuits;
    assert.deepEqual(cs.map((c) => c.position), Array.from({ length: 42 }, (_v, i) => i + 1));
    assert.ok(cs.every((c) => c.description === `Load ${c.position}` && c.ratingA === 20));
  });
});

describe('the 3×3 median before reading', () => {
  // a 5×5 white field (255) with one dark speck and a 3-pixel-wide dark stroke down the right
  const W = 255;
  const image = Uint8Array.from([
    W, W, W, 0, 0,
    W, 0, W, 0, 0,
    W, W, W, 0, 0,
    W, W, W, 0, 0,
    W, W, W, 0, 0,
  ]);
  it('takes out a lone speck and keeps a stroke', () => {
    const out = median3(image, 5, 5);
    assert.equal(out[1 * 5 + 1], W, 'the speck is gone');
    assert.deepEqual([3, 4].map((x) => out[2 * 5 + x]), [0, 0], 'the stroke stays');
  });
  it('gives the median of each 3×3 neighbourhood (against sorting, on pseudo-random pixels)', () => {
    const w = 17;
    const h = 11;
    let seed = 7;
    const grey = Uint8Array.from({ length: w * h }, () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31), seed % 256));
    const out = median3(grey, w, h);
    const at = (x: number, y: number) => grey[Math.min(h - 1, Math.max(0, y)) * w + Math.min(w - 1, Math.max(0, x))];
    for (let y = 0; y < h; y += 1) {
      for (let x = 0; x < w; x += 1) {
        const window = [-1, 0, 1].flatMap((dy) => [-1, 0, 1].map((dx) => at(x + dx, y + dy))).sort((a, b) => a - b);
        assert.equal(out[y * w + x], window[4], `pixel ${x},${y}`);
      }
    }
  });
  it('refuses a buffer that is not the size it is said to be', () => {
    assert.throws(() => median3(image, 4, 5), /25 bytes do not make a 4×5 image/);
  });
});

/**
 * Recognised lines of a panel's door card → a draft schedule (pure: no React, no OCR engine).
 *
 * The layouts read (common practice for panelboard directories [CP], NEC 408.4(A) asks only that
 * each circuit be identified):
 * - one column, 1…42, one position per line;
 * - two columns, odd positions left and even right, both on one recognised line
 *   ("1 20A Lighting   2 20A Receptacles") or each column read as its own block;
 * - the rating before the text ("7 20A Lobby lights") or after it ("7 Lobby lights 20A");
 * - ratings "20", "20A", "2P-30", "30/2", "2P 30A"; a multi-pole breaker written as a range
 *   ("1-3 Dryer 30A") or with a pole mark, or by a continuation mark ("—", "\"", "tie") on the
 *   next position of the same side.
 * Every repair or guess is named in the line's `notes`, so the review shows why a line is marked.
 */
import { STANDARD_RATINGS_A } from '../calc/conductors';
import { readPoleWord, readPosition, readRating, type PositionToken } from './tokens';

export interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export interface OcrWord {
  text: string;
  /** 0–100 as the engine reports it */
  confidence: number;
  bbox: Box;
}

/** One line as the OCR engine gave it. */
export interface OcrLine {
  text: string;
  confidence: number;
  bbox: Box;
  /** the line's words; when they match the text's tokens one to one, a half-line gets its own box */
  words?: readonly OcrWord[];
}

export type DraftStatus = 'in-use' | 'spare' | 'space';

export interface DraftCircuit {
  /** stable key for the review list: "<line>:<part>" */
  key: string;
  position: number;
  poles: 1 | 2 | 3;
  ratingA: number | null;
  description: string;
  status: DraftStatus;
  /** 0–100: the lowest word confidence of the part (the line's when no words) */
  confidence: number;
  /** where on the photo the part was read (pixels of the recognised image) */
  bbox: Box;
  /** the text the part was read from */
  source: string;
  /** the index of the OCR line */
  line: number;
  /** repairs and guesses, in words, for the review */
  notes: string[];
}

export interface DoorCardDraft {
  circuits: DraftCircuit[];
  /** lines with no position the parser could read (headings, notes, smudges) */
  unread: { line: number; text: string; confidence: number; bbox: Box }[];
}

export interface ParseOptions {
  /** the panel's spaces: positions beyond are not read as positions */
  spaces?: number;
}

/** Below this confidence (0–100) a line is marked for a closer look [our choice, measured on typed cards]. */
export const LOW_CONFIDENCE = 80;

/** Marks a card uses for "the same breaker continues here" on the next position of its side. */
const CONTINUATION = /^(?:[-–—_~"'“”〃=|↑^]+|tie|tied|ditto|same|do\.?|cont\.?|cont'd)$/i;
const SPARE = /^spare$/i;
/** Lone punctuation that is no mark of a card's own. */
const STRAY = /^[.,:;!'`‘’·•]+$/;
const SPACE = /^(?:space|blank|empty|none|n\/a|—)$/i;

interface Part {
  tokens: string[];
  words: readonly OcrWord[] | null;
}

/**
 * Reads every recognised line into draft circuits. Duplicates (a position read twice) are kept
 * both, with a note, so the review decides; positions covered by a multi-pole breaker are folded.
 */
export function parseDoorCard(lines: readonly OcrLine[], options: ParseOptions = {}): DoorCardDraft {
  const maxPosition = options.spaces ?? 84;
  const circuits: DraftCircuit[] = [];
  const unread: DoorCardDraft['unread'] = [];
  lines.forEach((line, index) => {
    const tokens = line.text.split(/\s+/).filter((t) => t !== '');
    const words = line.words && line.words.length === tokens.length ? line.words : null;
    const first = tokens.length > 0 ? readPosition(tokens[0], maxPosition) : null;
    if (!first) {
      if (line.text.trim() !== '') unread.push({ line: index, text: line.text.trim(), confidence: line.confidence, bbox: line.bbox });
      return;
    }
    const parts = splitColumns(tokens, words, first, maxPosition);
    parts.forEach((part, partIndex) => {
      const circuit = readPart(part, line, index, partIndex, maxPosition);
      if (circuit) circuits.push(circuit);
    });
  });
  return { circuits: foldContinuations(circuits), unread };
}

/** Where the right column starts on a two-column line, if it does: the even position after the odd. */
function splitColumns(tokens: string[], words: readonly OcrWord[] | null, first: PositionToken, maxPosition: number): Part[] {
  const whole: Part[] = [{ tokens, words }];
  if (first.start % 2 === 0) return whole;
  let best = -1;
  let bestScore = -1;
  for (let i = 2; i < tokens.length; i += 1) {
    const p = readPosition(tokens[i], maxPosition);
    if (!p || p.start !== first.start + 1) continue;
    // prefer a candidate beside a rating (either layout) over a number inside a description
    const beside = [tokens[i - 1], tokens[i + 1]].filter((t): t is string => t !== undefined);
    const score = (beside.some((t) => readRating(t)?.marked || readPoleWord(t) !== null) ? 2 : 0) + (p.repaired ? 0 : 1);
    if (score > bestScore) {
      best = i;
      bestScore = score;
    }
  }
  if (best < 0) return whole;
  return [
    { tokens: tokens.slice(0, best), words: words ? words.slice(0, best) : null },
    { tokens: tokens.slice(best), words: words ? words.slice(best) : null },
  ];
}

function readPart(part: Part, line: OcrLine, lineIndex: number, partIndex: number, maxPosition: number): DraftCircuit | null {
  const notes: string[] = [];
  const position = readPosition(part.tokens[0], maxPosition);
  if (!position) return null;
  if (position.repaired) notes.push(`position read as ${position.start} from "${part.tokens[0]}"`);

  // a separate pole word ("2P") may stand anywhere; the rating stands first or last
  let poleWord: number | null = null;
  // grain on a photo is read as lone dots, colons and ticks; one mark alone may be a ditto
  const marks = part.tokens.slice(1);
  const kept = marks.length > 1 ? marks.filter((t) => !STRAY.test(t)) : marks;
  const rest = kept.filter((token) => {
    const pw = poleWord === null ? readPoleWord(token) : null;
    if (pw !== null) poleWord = pw;
    return pw === null;
  });
  const ratingAt = pickRating(rest);
  const found = ratingAt === null ? null : readRating(rest[ratingAt]);
  const description = rest.filter((_t, i) => i !== ratingAt);
  if (found?.repaired) notes.push(`rating read as ${found.ratingA} A from an unclear number`);
  const polesBy = [position.poles, found?.poles ?? null, poleWord].filter((p): p is number => p !== null);
  const poles = (polesBy[0] ?? 1) as 1 | 2 | 3;
  if (new Set(polesBy).size > 1) notes.push(`poles written two ways (${polesBy.join(' and ')}): ${poles} taken`);

  const text = description.join(' ').trim();
  let status: DraftStatus = 'in-use';
  let desc = text;
  if (SPARE.test(text)) {
    status = 'spare';
    desc = '';
  } else if (SPACE.test(text) || (text === '' && !found)) {
    status = 'space';
    desc = '';
    if (text === '') notes.push('nothing written at this position: taken as a space');
  } else if (text === '' && found) {
    notes.push('a rating but no description');
  }
  const words = part.words;
  const bbox = words && words.length > 0 ? unionBox(words.map((w) => w.bbox)) : line.bbox;
  const confidence = words && words.length > 0 ? Math.min(...words.map((w) => w.confidence)) : line.confidence;
  return {
    key: `${lineIndex}:${partIndex}`,
    position: position.start,
    poles,
    ratingA: status === 'space' ? null : (found?.ratingA ?? null),
    description: CONTINUATION.test(text) ? text : desc,
    status,
    confidence: Math.round(confidence),
    bbox,
    source: part.tokens.join(' '),
    line: lineIndex,
    notes,
  };
}

/**
 * A continuation mark at the next position of the same side makes the breaker above it one pole
 * more (up to 3); a position already covered by a multi-pole breaker and holding only such a mark
 * (or nothing) is folded into it.
 */
function foldContinuations(circuits: DraftCircuit[]): DraftCircuit[] {
  const sorted = [...circuits].sort((a, b) => a.position - b.position || a.line - b.line);
  const out: DraftCircuit[] = [];
  const startAt = new Map<number, DraftCircuit>();
  const coveredBy = new Map<number, DraftCircuit>();
  for (const c of sorted) {
    const isMark = CONTINUATION.test(c.description) && c.ratingA === null;
    const emptyLine = c.status === 'space' && c.ratingA === null && c.source.trim().split(/\s+/).length === 1;
    const cover = coveredBy.get(c.position);
    if (cover && (isMark || emptyLine)) continue;
    const above = startAt.get(c.position - 2) ?? coveredBy.get(c.position - 2);
    if (isMark && above && above.poles < 3 && above.position + 2 * above.poles === c.position) {
      above.poles = (above.poles + 1) as 2 | 3;
      above.notes.push(`${above.poles}-pole: position ${c.position} is marked as its continuation`);
      coveredBy.set(c.position, above);
      continue;
    }
    if (isMark) {
      c.description = '';
      c.notes.push('a continuation mark with no breaker above it on this side');
    }
    const dup = startAt.get(c.position);
    if (dup) {
      c.notes.push(`position ${c.position} read twice (also "${dup.source}")`);
      if (!dup.notes.some((n) => n.startsWith(`position ${c.position} read twice`))) dup.notes.push(`position ${c.position} read twice (also "${c.source}")`);
    } else startAt.set(c.position, c);
    for (let p = 1; p < c.poles; p += 1) coveredBy.set(c.position + 2 * p, c);
    out.push(c);
  }
  return out;
}

/**
 * Which token is the rating: the first or the last (a bare number at the start only with text
 * after it, at the end only with text before it, as a description may end in a room number that
 * is no standard rating); failing those, a token marked with A or a pole count anywhere.
 */
function pickRating(rest: readonly string[]): number | null {
  if (rest.length === 0) return null;
  const first = readRating(rest[0]);
  if (first && (first.marked || rest.length > 1)) return 0;
  const lastIndex = rest.length - 1;
  const last = readRating(rest[lastIndex]);
  if (last && (last.marked || (lastIndex > 0 && STANDARD_RATINGS_A.includes(last.ratingA)))) return lastIndex;
  if (first && rest.length === 1) return 0;
  const marked = rest.findIndex((t) => readRating(t)?.marked === true);
  return marked >= 0 ? marked : null;
}

function unionBox(boxes: readonly Box[]): Box {
  return {
    x0: Math.min(...boxes.map((b) => b.x0)),
    y0: Math.min(...boxes.map((b) => b.y0)),
    x1: Math.max(...boxes.map((b) => b.x1)),
    y1: Math.max(...boxes.map((b) => b.y1)),
  };
}

/** True when the review should ask for a closer look at this line. */
export function needsLook(c: DraftCircuit): boolean {
  return c.confidence < LOW_CONFIDENCE || c.notes.length > 0;
}

/**
 * Reading the numbers of a door-card line: positions ("7", "1-3", "2,4,6") and breaker ratings
 * ("20", "20A", "2P-30", "30/2", "2P 30A"), with the usual OCR slips inside a number repaired
 * (`l`/`I`/`|` → 1, `O`/`o` → 0, `S`/`s` → 5, `B` → 8). Pure: no React, no OCR engine.
 *
 * The repairs are made only where a number is expected (the position slot, a rating token that
 * has at least one real digit), so a description word such as "SOB" or "Lobby" is never touched.
 */

/** Letters an OCR engine mistakes for digits in a typed card, and the digit meant. */
const DIGIT_LOOKALIKES: Readonly<Record<string, string>> = {
  l: '1',
  I: '1',
  i: '1',
  '|': '1',
  '!': '1',
  O: '0',
  o: '0',
  D: '0',
  Q: '0',
  S: '5',
  s: '5',
  B: '8',
  Z: '2',
  z: '2',
};

/** `"2O"` → `"20"`; characters that are neither a digit nor a look-alike are kept as they are. */
export function repairDigits(raw: string): string {
  let out = '';
  for (const ch of raw) out += /\d/.test(ch) ? ch : (DIGIT_LOOKALIKES[ch] ?? ch);
  return out;
}

/** True when `raw` is a whole number once look-alikes are repaired (and has at most 3 digits). */
function wholeNumber(raw: string, needRealDigit: boolean): number | null {
  if (raw === '' || raw.length > 3) return null;
  if (needRealDigit && !/\d/.test(raw)) return null;
  const fixed = repairDigits(raw);
  return /^\d{1,3}$/.test(fixed) ? Number(fixed) : null;
}

/** Trailing punctuation a card or the engine puts after a number: "1.", "1)", "1:", "12," */
const trimPunct = (raw: string) => raw.replace(/^[([{]+/, '').replace(/[.,:;)\]}]+$/, '');

export interface PositionToken {
  /** first position the breaker takes */
  start: number;
  /** poles spelled by a range: "1-3" = 2, "1-3-5" = 3; null for a single number */
  poles: number | null;
  /** true when a look-alike letter was read as a digit */
  repaired: boolean;
}

/**
 * A position slot: "7", "07", "l3", "1-3", "1-3-5", "2,4", "2/4/6". A range must step by 2 (the
 * poles of one breaker stack down one side) and hold 2 or 3 numbers.
 */
export function readPosition(raw: string, maxPosition = 84): PositionToken | null {
  const t = trimPunct(raw);
  if (t === '') return null;
  const parts = t.split(/[-–,/]/);
  if (parts.length > 3 || parts.some((p) => p === '')) return null;
  // a lone letter ("I", "S") is a look-alike only in the position slot, where a number must be
  const numbers = parts.map((p) => wholeNumber(p, false));
  if (numbers.some((n) => n === null)) return null;
  const ns = numbers as number[];
  if (ns[0] < 1 || ns[0] > maxPosition) return null;
  for (let i = 1; i < ns.length; i += 1) if (ns[i] !== ns[i - 1] + 2) return null;
  return { start: ns[0], poles: ns.length > 1 ? ns.length : null, repaired: repairDigits(t) !== t };
}

export interface RatingToken {
  ratingA: number;
  /** poles the token spells ("2P-30", "30/2"); null for a bare rating */
  poles: number | null;
  repaired: boolean;
  /** true when the token carries an A or a pole mark, so it cannot be a room number */
  marked: boolean;
}

/** "40aA" and "20a" are common slips for "40A"/"20A". */
const AMP_SUFFIX = /[aA]+$/;

/**
 * One token as a rating: "20", "20A", "2P-30", "2P30A", "30/2", "30A/2P", "3P-60". Needs at least
 * one real digit, so words are never read as ratings. The pole count must be 1–3.
 */
export function readRating(raw: string): RatingToken | null {
  const t = trimPunct(raw);
  if (!/\d/.test(t) || t.length > 9) return null;
  // "2P-30" / "2P30" / "2P-30A"
  let m = /^([^\W_]{1,2}?)[pP][-–/]?([^\W_]{1,3}?)(?:[aA]+)?$/.exec(t);
  if (m) {
    const poles = wholeNumber(m[1], false);
    const amps = wholeNumber(m[2], false);
    if (poles !== null && poles >= 1 && poles <= 3 && amps !== null) return made(amps, poles, t, true);
  }
  // "30/2" / "30A/2P" / "30-2P"
  m = /^([^\W_]{1,3}?)(?:[aA]+)?[/–-]([^\W_])[pP]?$/.exec(t);
  if (m) {
    const amps = wholeNumber(m[1], false);
    const poles = wholeNumber(m[2], false);
    if (amps !== null && poles !== null && poles >= 1 && poles <= 3) return made(amps, poles, t, true);
  }
  // "20" / "20A" / "20aA"
  const bare = t.replace(AMP_SUFFIX, '');
  const amps = wholeNumber(bare, false);
  if (amps !== null && amps > 0) return made(amps, null, t, bare !== t);
  return null;
}

function made(ratingA: number, poles: number | null, token: string, marked: boolean): RatingToken | null {
  if (ratingA <= 0) return null;
  const digitsOnly = token.replace(/[aApP/–-]/g, '');
  return { ratingA, poles, repaired: repairDigits(digitsOnly) !== digitsOnly, marked };
}

/** A separate pole word: "2P", "2-pole", "2POLE", "3Ø"? (only the P forms). */
export function readPoleWord(raw: string): number | null {
  const m = /^([123lI])[-\s]?(?:p|P|pole|POLE|Pole)$/.exec(trimPunct(raw));
  return m ? Number(repairDigits(m[1])) : null;
}

/**
 * Search a building's circuit directory the way people ask: by place ("2LA-14", "LA 14", "la14")
 * or by what a breaker feeds ("which breaker feeds the walk-in cooler"). Pure: the owner's
 * screen runs it on the device's copy, offline. "fridge" finds a refrigerator (shared/trade-thesaurus.ts)
 * and "refrigerater" too (typos through fuse.js).
 */
import Fuse from 'fuse.js';
import { occupiedPositions } from './calc/layout';
import { TRADE_THESAURUS } from './trade-thesaurus';

export interface SearchPanel {
  id: string;
  tag: string;
}
export interface SearchCircuit {
  id: string;
  panelId: string;
  position: number;
  poles: number;
  description: string;
  notes: string;
  status: string;
}

export interface DirectoryMatch<C extends SearchCircuit = SearchCircuit> {
  circuit: C;
  panel: SearchPanel;
  /** 'place' for a panel + position asked for; 'words' for a description match */
  kind: 'place' | 'words';
  /** how well the query's words matched: 3 each for the word itself, 2 for a synonym, 1 for a
   * narrower term or a near spelling (place matches rank first) */
  score: number;
}

/** Words that carry no meaning in a question about a directory. */
const FILLER = new Set([
  'a', 'an', 'the', 'which', 'what', 'where', 'whats', 'is', 'are', 'on', 'of', 'for', 'to', 'in', 'at',
  'breaker', 'breakers', 'circuit', 'circuits', 'feeds', 'feed', 'feeding', 'serves', 'serving', 'does',
  'do', 'it', 'that', 'panel', 'position', 'and', 'or', 'my', 'our',
]);

const normalise = (s: string) =>
  s
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[’']/g, '');

/** "walk-in cooler" → ['walk', 'in', 'cooler'] minus filler; "walk-in" also as 'walkin'. */
function words(s: string): string[] {
  return normalise(s)
    .split(/[^a-z0-9]+/)
    .filter((w) => w.length > 0);
}

/** Panel tag and position asked for: "2LA-14", "2LA 14", "2la14", "LA #14", "what is on 2LA-14". */
function placeOf(query: string, panels: readonly SearchPanel[]): { panel: SearchPanel; position: number }[] {
  const q = normalise(query).replace(/[^a-z0-9]+/g, ' ').trim();
  const found: { panel: SearchPanel; position: number }[] = [];
  for (const panel of panels) {
    const tag = normalise(panel.tag).replace(/[^a-z0-9]+/g, '');
    if (!tag) continue;
    // the tag, then (after optional separators) a number, as whole words
    const pattern = new RegExp(`(?:^|\\s)${tag}\\s?(\\d{1,2})(?:\\s|$)`);
    const m = q.replace(/\s+/g, ' ').match(pattern) ?? q.replace(/\s+/g, '').match(new RegExp(`^${tag}(\\d{1,2})$`));
    if (m) found.push({ panel, position: Number(m[1]) });
  }
  return found;
}

/** Stems close enough for a directory ("coolers" ~ "cooler", "lights" ~ "lighting"). */
function sameWord(a: string, b: string): boolean {
  if (a === b) return true;
  const stem = (w: string) => w.replace(/(ing|es|s)$/, '');
  return a.length > 2 && b.length > 2 && stem(a) === stem(b);
}

/** How well a circuit matched one thing asked for: the user's own word beats its synonym. */
const OWN = 3;
const SYNONYM = 2;
/** a narrower term ("fridge" → a freezer) or a guessed typo */
const LOOSE = 1;

/** Typos are guessed only in words this long: shorter ones are too often another real word. */
const FUZZY_MIN_LENGTH = 5;
/** fuse.js score (0 exact … 1 anything) under which a word counts as a typo of another */
const FUZZY_THRESHOLD = 0.3;

type Phrase = readonly string[];

interface Group {
  terms: Phrase[];
  narrower: Phrase[];
}

/** The thesaurus with its terms split into words the way a directory's text is. */
const GROUPS: readonly Group[] = (() => {
  const split = TRADE_THESAURUS.map((g) => ({ key: g.key, terms: g.terms.map(words) }));
  const byKey = new Map(split.map((g) => [g.key, g.terms]));
  return TRADE_THESAURUS.map((g, i) => ({
    terms: split[i].terms,
    narrower: (g.narrower ?? []).flatMap((k) => byKey.get(k) ?? []),
  }));
})();
const LONGEST_TERM = Math.max(...GROUPS.flatMap((g) => g.terms.map((t) => t.length)));
const SINGLE_TERMS = [...new Set(GROUPS.flatMap((g) => g.terms.filter((t) => t.length === 1).map((t) => t[0])))];

const samePhrase = (a: Phrase, b: Phrase) => a.length === b.length && a.every((w, i) => sameWord(w, b[i]));

/** One thing asked for, with every phrase that answers it and how well. */
interface Need {
  alternatives: { phrase: Phrase; score: number }[];
}

function needFor(own: Phrase, group: Group | undefined, score = OWN): Need {
  const alternatives = [{ phrase: own, score }];
  if (group) {
    for (const t of group.terms) alternatives.push({ phrase: t, score: Math.min(score, SYNONYM) });
    if (score === OWN) for (const t of group.narrower) alternatives.push({ phrase: t, score: LOOSE });
  }
  return { alternatives };
}

/**
 * The query as needs: thesaurus phrases first (longest, so "a/c" and "water heater" stay whole),
 * then each meaningful word alone; filler words count only inside a phrase.
 */
function needsOf(query: string): Need[] {
  const q = words(query);
  const needs: Need[] = [];
  for (let i = 0; i < q.length; ) {
    let taken = 0;
    for (let n = Math.min(LONGEST_TERM, q.length - i); n > 0 && taken === 0; n--) {
      const slice = q.slice(i, i + n);
      const group = GROUPS.find((g) => g.terms.some((t) => samePhrase(t, slice)));
      if (group && !(n === 1 && FILLER.has(slice[0]))) {
        needs.push(needFor(slice, group));
        taken = n;
      }
    }
    if (taken === 0) {
      if (!FILLER.has(q[i])) needs.push(needFor([q[i]], undefined));
      taken = 1;
    }
    i += taken;
  }
  return needs;
}

/** Does the phrase occur in the words (consecutively), or a long word inside the joined text? */
function occurs(phrase: Phrase, have: readonly string[], joined: string): boolean {
  if (phrase.length === 1 && phrase[0].length > 3 && joined.includes(phrase[0])) return true;
  for (let i = 0; i + phrase.length <= have.length; i++) {
    if (phrase.every((w, k) => sameWord(w, have[i + k]))) return true;
  }
  return false;
}

/**
 * For a word the directory does not have, the words it may be a typo of (fuse.js over the
 * directory's own words and the thesaurus), as extra alternatives at the loose score; a typo of a
 * thesaurus term brings that term's synonyms along.
 */
function addTypos(needs: Need[], vocabulary: readonly string[]): void {
  const fuse = new Fuse([...new Set([...vocabulary, ...SINGLE_TERMS])], {
    includeScore: true,
    ignoreLocation: true,
    threshold: FUZZY_THRESHOLD,
  });
  const known = new Set(vocabulary);
  for (const need of needs) {
    const own = need.alternatives[0].phrase;
    if (own.length !== 1 || own[0].length < FUZZY_MIN_LENGTH || known.has(own[0])) continue;
    for (const hit of fuse.search(own[0])) {
      // a typo changes a letter or two; a much longer word only contains the query
      if (Math.abs(hit.item.length - own[0].length) > 2 || hit.item === own[0]) continue;
      const group = GROUPS.find((g) => g.terms.some((t) => samePhrase(t, [hit.item])));
      need.alternatives.push(...needFor([hit.item], group, LOOSE).alternatives);
    }
  }
}

/**
 * Circuits matching the query, best first: a place asked for (the breaker occupying that
 * position, multi-pole included) before word matches. Word matches need every meaningful word
 * or trade phrase of the query, each met by the word itself (a hyphenated word may match joined
 * or split), a synonym from the trade thesaurus, a narrower term, or a near spelling (fuse.js);
 * the user's own words rank first; ties go by panel tag and position.
 */
export function searchDirectory<C extends SearchCircuit>(
  query: string,
  panels: readonly SearchPanel[],
  circuits: readonly C[],
): DirectoryMatch<C>[] {
  const panelById = new Map(panels.map((p) => [p.id, p]));
  const out: DirectoryMatch<C>[] = [];
  const seen = new Set<string>();
  for (const { panel, position } of placeOf(query, panels)) {
    for (const circuit of circuits) {
      if (circuit.panelId !== panel.id) continue;
      if (!occupiedPositions(circuit.position, circuit.poles).includes(position)) continue;
      out.push({ circuit, panel, kind: 'place', score: Infinity });
      seen.add(circuit.id);
    }
  }
  const needs = needsOf(query);
  if (needs.length > 0) {
    const texts = circuits.map((circuit) => {
      const text = `${circuit.description} ${circuit.notes}`;
      return { circuit, have: words(text), joined: normalise(text).replace(/[^a-z0-9]+/g, '') };
    });
    addTypos(needs, texts.flatMap((t) => t.have));
    for (const { circuit, have, joined } of texts) {
      const panel = panelById.get(circuit.panelId);
      if (!panel || seen.has(circuit.id)) continue;
      let score = 0;
      for (const need of needs) {
        const best = Math.max(0, ...need.alternatives.filter((a) => occurs(a.phrase, have, joined)).map((a) => a.score));
        if (best === 0) {
          score = 0;
          break;
        }
        score += best;
      }
      if (score > 0) out.push({ circuit, panel, kind: 'words', score });
    }
  }
  return out.sort(
    (a, b) =>
      b.score - a.score ||
      a.panel.tag.localeCompare(b.panel.tag, undefined, { numeric: true }) ||
      a.circuit.position - b.circuit.position,
  );
}

/**
 * Search a building's circuit directory the way people ask: by place ("2LA-14", "LA 14", "la14")
 * or by what a breaker feeds ("which breaker feeds the walk-in cooler"). Pure: the owner's
 * screen runs it on the device's copy, offline.
 */
import { occupiedPositions } from './calc/layout';

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
  /** how many of the query's words the circuit matched (place matches rank first) */
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

/**
 * Circuits matching the query, best first: a place asked for (the breaker occupying that
 * position, multi-pole included) before word matches; word matches need every meaningful word of
 * the query (a hyphenated word may match joined or split); ties go by panel tag and position.
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
  const wanted = words(query).filter((w) => !FILLER.has(w));
  if (wanted.length > 0) {
    for (const circuit of circuits) {
      const panel = panelById.get(circuit.panelId);
      if (!panel || seen.has(circuit.id)) continue;
      const text = `${circuit.description} ${circuit.notes}`;
      const have = words(text);
      const joined = normalise(text).replace(/[^a-z0-9]+/g, '');
      const matched = wanted.filter((w) => have.some((h) => sameWord(w, h)) || (w.length > 3 && joined.includes(w)));
      if (matched.length === wanted.length) out.push({ circuit, panel, kind: 'words', score: matched.length });
    }
  }
  return out.sort(
    (a, b) =>
      b.score - a.score ||
      a.panel.tag.localeCompare(b.panel.tag, undefined, { numeric: true }) ||
      a.circuit.position - b.circuit.position,
  );
}

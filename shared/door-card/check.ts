/**
 * The accepted lines of a door card, checked and planned by the CSV import itself (shared/csv.ts):
 * the lines become CSV text with the import's own column words and go through
 * `parseScheduleCsv` + `planImport`, so a card meets exactly the checks a file meets — standard
 * ratings (NEC 240.6(A)), poles against the panel's system and spaces, overlaps inside the card
 * and with the circuits that stay — and is applied the same way (one batch through the outbox).
 */
import Papa from 'papaparse';
import { parseScheduleCsv, planImport, type ExistingCircuit, type ImportPlan, type ParseContext } from '../csv';
import type { CircuitFields } from '../schemas';
import type { DraftStatus } from './parse';

/** A line the user accepted, as edited in the review. */
export interface AcceptedLine {
  key: string;
  position: number;
  poles: number;
  ratingA: number | null;
  description: string;
  status: DraftStatus;
}

/** The only fields a card carries: a patch never touches the others (conductors, loads, bands…). */
export const CARD_FIELDS = ['position', 'poles', 'ratingA', 'description', 'status'] as const satisfies readonly (keyof CircuitFields)[];
const HEADERS = ['Position', 'Poles', 'Rating (A)', 'Description', 'Status'];

export interface CardPlan {
  plan: ImportPlan;
  /** the problems of each accepted line, by its key, without the CSV's "row N:" prefix */
  problemsByKey: Map<string, string[]>;
}

/** Accepted lines → the import's plan against the panel, and each line's problems. */
export function planDoorCard(lines: readonly AcceptedLine[], ctx: ParseContext, existing: readonly ExistingCircuit[]): CardPlan {
  const rows = lines.map((l) => [String(l.position), String(l.poles), l.ratingA === null ? '' : String(l.ratingA), l.description, l.status]);
  const text = Papa.unparse({ fields: HEADERS, data: rows }, { newline: '\r\n' });
  const parsed = lines.length === 0 ? { fileProblems: [], rows: [] } : parseScheduleCsv(text, ctx);
  const raw = planImport(parsed, existing, false);
  // a card says nothing about the columns it lacks: keep only the fields it carries
  const patches: ImportPlan['patches'] = [];
  let unchanged = raw.unchanged;
  for (const p of raw.patches) {
    const fields = pick(p.fields);
    if (Object.keys(fields).length === 0) unchanged += 1;
    else patches.push({ ...p, fields, before: pick(p.before) });
  }
  const plan: ImportPlan = { ...raw, patches, unchanged };
  // spreadsheet row n (header = 1) is accepted line n - 2
  const problemsByKey = new Map<string, string[]>();
  for (const r of plan.rows) {
    const key = lines[r.row - 2]?.key;
    if (key && r.problems.length > 0) problemsByKey.set(key, r.problems.map((p) => p.replace(/^row \d+: /, '')));
  }
  return { plan, problemsByKey };
}

function pick(fields: Partial<CircuitFields>): Partial<CircuitFields> {
  const out: Record<string, unknown> = {};
  for (const f of CARD_FIELDS) if (f in fields) out[f] = fields[f];
  return out as Partial<CircuitFields>;
}

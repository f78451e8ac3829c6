/**
 * A panel schedule as a CSV file, in and out (pure: no React, no network).
 *
 * Columns are our own plain words, one per circuit field of `circuitFields` (shared/schemas.ts)
 * except the ids, which mean nothing outside this device:
 * - "Feeds panel" holds the **tag** of the panel a feeder breaker feeds, looked up among the
 *   panels of the same building (blank = feeds no panel);
 * - "Trip band" holds the **label** of the organisation's time-current band (blank = none).
 *
 * Rows are numbered as a spreadsheet shows them: the header is row 1, the first circuit row 2 (a
 * description holding a newline stays one row).
 *
 * Import semantics (see {@link planImport}): the file describes circuits by their starting
 * position. A row whose position holds a circuit already is a patch of that circuit (only the
 * fields that differ); a row at a new position creates a circuit; circuits at positions the file
 * leaves out **stay**, unless the user asks to remove them. Overlaps are checked inside the file
 * and against the circuits that stay.
 */
import Papa from 'papaparse';
import { STANDARD_RATINGS_A } from './calc/conductors';
import { occupiedPositions } from './calc/layout';
import {
  BREAKER_TYPES,
  CIRCUIT_STATUSES,
  CONDUCTOR_SIZES,
  conductorSizeLabel,
  LOAD_KINDS,
  MATERIALS,
  SYSTEM_INFO,
  type PanelSystem,
} from './domain';
import { circuitCreateBody, type CircuitFields } from './schemas';

/** The fields a CSV row carries, in column order, with the header word of each. */
export const CSV_COLUMNS = [
  { field: 'position', header: 'Position' },
  { field: 'poles', header: 'Poles' },
  { field: 'ratingA', header: 'Rating (A)' },
  { field: 'breakerType', header: 'Breaker type' },
  { field: 'description', header: 'Description' },
  { field: 'loadKind', header: 'Load kind' },
  { field: 'loadVA', header: 'Load (VA)' },
  { field: 'continuous', header: 'Continuous' },
  { field: 'conductorSize', header: 'Conductor size' },
  { field: 'conductorMaterial', header: 'Conductor material' },
  { field: 'insulationTempC', header: 'Insulation (°C)' },
  { field: 'lengthFt', header: 'One-way length (ft)' },
  { field: 'status', header: 'Status' },
  { field: 'feedsPanelId', header: 'Feeds panel' },
  { field: 'handleLock', header: 'Handle lock' },
  { field: 'bandId', header: 'Trip band' },
  { field: 'notes', header: 'Notes' },
] as const satisfies readonly { field: keyof CircuitFields; header: string }[];

export type CsvField = (typeof CSV_COLUMNS)[number]['field'];
export const CSV_HEADERS: readonly string[] = CSV_COLUMNS.map((c) => c.header);
/** Columns a file must have; the others may be left out (they then keep their value / default). */
export const REQUIRED_HEADERS = ['Position', 'Poles', 'Rating (A)', 'Status'] as const;
const HEADER_OF = Object.fromEntries(CSV_COLUMNS.map((c) => [c.field, c.header])) as Record<CsvField, string>;

/** Names the file uses for the rows that ids point at. */
export interface CsvLookups {
  /** panels of the building: id → tag */
  panels: readonly { id: string; tag: string }[];
  /** the organisation's time-current bands: id → label */
  bands: readonly { id: string; label: string }[];
}

const yesNo = (v: boolean) => (v ? 'yes' : 'no');

/** One circuit as the strings of a CSV row, in {@link CSV_COLUMNS} order. */
export function circuitToRow(c: CircuitFields, lookups: CsvLookups): string[] {
  const cell = (field: CsvField): string => {
    switch (field) {
      case 'continuous':
      case 'handleLock':
        return yesNo(c[field]);
      case 'conductorSize':
        return c.conductorSize === null ? '' : conductorSizeLabel(c.conductorSize);
      case 'feedsPanelId':
        return c.feedsPanelId === null ? '' : (lookups.panels.find((p) => p.id === c.feedsPanelId)?.tag ?? '');
      case 'bandId':
        return c.bandId === null ? '' : (lookups.bands.find((b) => b.id === c.bandId)?.label ?? '');
      default: {
        const v = c[field];
        return v === null ? '' : String(v);
      }
    }
  };
  return CSV_COLUMNS.map((col) => cell(col.field));
}

/** The whole schedule as CSV text (CRLF line ends, as spreadsheets write them), by position. */
export function scheduleToCsv(circuits: readonly CircuitFields[], lookups: CsvLookups): string {
  const rows = [...circuits].sort((a, b) => a.position - b.position).map((c) => circuitToRow(c, lookups));
  return Papa.unparse({ fields: [...CSV_HEADERS], data: rows }, { newline: '\r\n', quotes: false });
}

/** "LA-schedule.csv" — the tag made safe for a file name. */
export function csvFileName(tag: string): string {
  const safe = tag.trim().replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '');
  return `${safe || 'panel'}-schedule.csv`;
}

// ---------- parsing ----------

export interface ParsedRow {
  /** the spreadsheet row number (header = 1) */
  row: number;
  /** the position the row names, when it could be read (shown beside the row's problems) */
  position: number | null;
  /** the circuit the row describes; null when a value could not be read */
  circuit: CircuitFields | null;
  /** what is wrong with this row, each a sentence starting "row N: …" */
  problems: string[];
}

export interface ParsedSchedule {
  /** problems with the file as a whole (headers, quoting); the file is refused when any */
  fileProblems: string[];
  rows: ParsedRow[];
}

export interface ParseContext extends CsvLookups {
  panel: { id: string; system: PanelSystem; spaces: number };
}

const norm = (s: string) => s.trim().toLowerCase();

function parseNumber(raw: string): number | null | 'bad' {
  const t = raw.trim().replace(/,/g, '');
  if (t === '') return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : 'bad';
}

function parseYesNo(raw: string): boolean | null | 'bad' {
  const t = norm(raw);
  if (t === '') return null;
  if (['yes', 'y', 'true', '1'].includes(t)) return true;
  if (['no', 'n', 'false', '0'].includes(t)) return false;
  return 'bad';
}

/** "12", "12 AWG", "250 kcmil", "1/0" → the size id; 'bad' when it is not a size we know. */
function parseSize(raw: string): string | null | 'bad' {
  const t = norm(raw).replace(/\s*(awg|kcmil|mcm)$/, '').replace(/^#/, '');
  if (t === '') return null;
  return (CONDUCTOR_SIZES as readonly string[]).includes(t) ? t : 'bad';
}

function pickWord<T extends string>(raw: string, words: readonly T[]): T | null | 'bad' {
  const t = norm(raw);
  if (t === '') return null;
  return words.find((w) => w.toLowerCase() === t) ?? 'bad';
}

/**
 * Reads CSV text into circuits, with every problem of each row named (nothing is written here).
 * A file whose headers are wrong or whose quoting is broken has `fileProblems`.
 */
export function parseScheduleCsv(text: string, ctx: ParseContext): ParsedSchedule {
  const fileProblems: string[] = [];
  const body = text.replace(/^\uFEFF/, '');
  if (body.trim() === '') return { fileProblems: ['The file is empty: export a panel to see the columns it needs.'], rows: [] };
  const parsed = Papa.parse<string[]>(body, { skipEmptyLines: 'greedy' });
  const records = parsed.data;
  // Papa's row index counts records from 0 (the header); a spreadsheet counts from 1
  for (const e of parsed.errors) {
    const where = e.row === undefined ? 'the file' : `row ${e.row + 1}`;
    if (e.type === 'Quotes') fileProblems.push(`${where}: a quoted value is not closed (a " is missing).`);
    else if (e.type === 'Delimiter') continue; // a one-column file: the header check says what is wrong
    else fileProblems.push(`${where}: ${e.message}.`);
  }
  const header = (records[0] ?? []).map((h) => h.trim());
  const columnOf = new Map<CsvField, number>();
  header.forEach((h, index) => {
    const col = CSV_COLUMNS.find((c) => norm(c.header) === norm(h));
    if (!col) {
      if (h !== '') fileProblems.push(`row 1: unknown column "${h}" (the columns are: ${CSV_HEADERS.join(', ')}).`);
      return;
    }
    if (columnOf.has(col.field)) fileProblems.push(`row 1: the column "${col.header}" appears twice.`);
    columnOf.set(col.field, index);
  });
  for (const required of REQUIRED_HEADERS) {
    if (!header.some((h) => norm(h) === norm(required))) fileProblems.push(`row 1: the column "${required}" is missing.`);
  }
  if (fileProblems.some((p) => p.startsWith('row 1:'))) return { fileProblems, rows: [] };

  const rows: ParsedRow[] = [];
  for (let i = 1; i < records.length; i += 1) {
    const cells = records[i];
    const rowNo = i + 1;
    if (cells.length !== header.length) {
      fileProblems.push(`row ${rowNo}: ${cells.length} values where the header has ${header.length} columns.`);
    }
    rows.push(readRow(cells, rowNo, columnOf, ctx));
  }
  if (rows.length === 0) fileProblems.push('The file has a header but no circuits.');
  return { fileProblems, rows };
}

function readRow(cells: readonly string[], rowNo: number, columnOf: Map<CsvField, number>, ctx: ParseContext): ParsedRow {
  const problems: string[] = [];
  const say = (message: string) => problems.push(`row ${rowNo}: ${message}`);
  const raw = (field: CsvField): string | undefined => {
    const index = columnOf.get(field);
    return index === undefined ? undefined : (cells[index] ?? '');
  };
  const values: Record<string, unknown> = {};
  for (const col of CSV_COLUMNS) {
    const r = raw(col.field);
    if (r === undefined) continue; // column left out: the create body's default
    const name = col.header.toLowerCase();
    switch (col.field) {
      case 'position':
      case 'poles':
      case 'ratingA':
      case 'loadVA':
      case 'insulationTempC':
      case 'lengthFt': {
        const n = parseNumber(r);
        if (n === 'bad') say(`${name} "${r.trim()}" is not a number.`);
        else values[col.field] = n;
        break;
      }
      case 'continuous':
      case 'handleLock': {
        const b = parseYesNo(r);
        if (b === 'bad') say(`${name} "${r.trim()}" should be yes or no.`);
        else values[col.field] = b ?? false;
        break;
      }
      case 'conductorSize': {
        const s = parseSize(r);
        if (s === 'bad') say(`unknown conductor size "${r.trim()}" (14 AWG to 500 kcmil, e.g. 12, 1/0 or 250 kcmil).`);
        else values.conductorSize = s;
        break;
      }
      case 'conductorMaterial': {
        const m = pickWord(r, MATERIALS);
        if (m === 'bad') say(`unknown conductor material "${r.trim()}" (Cu or Al).`);
        else values.conductorMaterial = m;
        break;
      }
      case 'breakerType': {
        const t = pickWord(r, BREAKER_TYPES);
        if (t === 'bad') say(`unknown breaker type "${r.trim()}" (one of ${BREAKER_TYPES.join(', ')}).`);
        else if (t === null) say('the breaker type is missing.');
        else values.breakerType = t;
        break;
      }
      case 'loadKind': {
        const k = pickWord(r, LOAD_KINDS);
        if (k === 'bad') say(`unknown load kind "${r.trim()}" (one of ${LOAD_KINDS.join(', ')}).`);
        else if (k !== null) values.loadKind = k;
        break;
      }
      case 'status': {
        const s = pickWord(r, CIRCUIT_STATUSES);
        if (s === 'bad') say(`unknown status "${r.trim()}" (in-use, spare or space).`);
        else if (s === null) say('the status is missing (in-use, spare or space).');
        else values.status = s;
        break;
      }
      case 'feedsPanelId': {
        const tag = r.trim();
        if (tag === '') values.feedsPanelId = null;
        else {
          const panel = ctx.panels.find((p) => norm(p.tag) === norm(tag));
          if (!panel) say(`feeds panel "${tag}", but no panel of this building has that tag.`);
          else if (panel.id === ctx.panel.id) say(`a breaker cannot feed its own panel (${tag}).`);
          else values.feedsPanelId = panel.id;
        }
        break;
      }
      case 'bandId': {
        const label = r.trim();
        if (label === '') values.bandId = null;
        else {
          const band = ctx.bands.find((b) => norm(b.label) === norm(label));
          if (!band) say(`unknown trip band "${label}": add it to the band library first.`);
          else values.bandId = band.id;
        }
        break;
      }
      case 'description':
      case 'notes':
        values[col.field] = r;
        break;
    }
  }
  if (values.position === null) say('the position is missing.');
  if (values.poles === null) say('the number of poles is missing.');

  const rating = values.ratingA;
  if (typeof rating === 'number' && !STANDARD_RATINGS_A.includes(rating)) {
    say(`rating ${rating} A is not a standard rating (NEC 240.6(A)).`);
  }
  const position = values.position;
  const poles = values.poles;
  if (typeof position === 'number' && typeof poles === 'number' && Number.isInteger(position) && position >= 1) {
    if (poles === 3 && SYSTEM_INFO[ctx.panel.system].phases === 1) {
      say(`a 3-pole breaker at ${position} needs a three-phase bus; this panel is single-phase.`);
    }
    if ([1, 2, 3].includes(poles)) {
      const taken = occupiedPositions(position, poles);
      const last = taken[taken.length - 1];
      if (last > ctx.panel.spaces) {
        say(
          poles === 1
            ? `position ${position} is past the panel's last space (${ctx.panel.spaces}).`
            : `a ${poles}-pole at ${position} needs positions ${taken.join(', ')}; the panel has ${ctx.panel.spaces} spaces.`,
        );
      }
    }
  }

  const at = typeof values.position === 'number' ? values.position : null;
  if (problems.length > 0) return { row: rowNo, position: at, circuit: null, problems };
  const result = circuitCreateBody.safeParse(values);
  if (!result.success) {
    const seen = new Set<string>();
    for (const issue of result.error.issues) {
      const field = String(issue.path[0] ?? '');
      if (seen.has(field)) continue;
      seen.add(field);
      const header = HEADER_OF[field as CsvField] ?? field;
      say(`${header.toLowerCase()}: ${issue.message}.`);
    }
    return { row: rowNo, position: at, circuit: null, problems };
  }
  const { id: _id, ...circuit } = result.data;
  return { row: rowNo, position: at, circuit, problems };
}

// ---------- applying ----------

export interface ExistingCircuit extends CircuitFields {
  id: string;
}

export interface ImportPlan {
  rows: ParsedRow[];
  fileProblems: string[];
  creates: { row: number; fields: CircuitFields }[];
  /** only the fields that differ; rows that change nothing are left out */
  patches: { row: number; circuitId: string; position: number; fields: Partial<CircuitFields>; before: Partial<CircuitFields> }[];
  /** circuits at positions the file leaves out, when the user asked to remove them */
  deletes: ExistingCircuit[];
  /** positions the file leaves out that stay as they are */
  kept: ExistingCircuit[];
  unchanged: number;
  /** true when nothing may be written: a file problem or a row problem */
  blocked: boolean;
}

const poleWord = (poles: number) => `${poles}-pole`;

/**
 * What applying a parsed file to a panel would do, and the overlaps that forbid it: inside the file
 * and against the circuits that stay (positions the file leaves out, unless removed).
 */
export function planImport(parsed: ParsedSchedule, existing: readonly ExistingCircuit[], removeMissing: boolean): ImportPlan {
  const rows = parsed.rows.map((r) => ({ ...r, problems: [...r.problems] }));
  const byStart = new Map(existing.map((c) => [c.position, c]));
  // a row with problems still names its position: that circuit is not "left out"
  const filePositions = new Set(rows.flatMap((r) => (r.position !== null ? [r.position] : [])));
  const missing = existing.filter((c) => !filePositions.has(c.position)).sort((a, b) => a.position - b.position);
  const kept = removeMissing ? [] : missing;

  // who holds each position so far: circuits that stay first, then the file in row order
  const holder = new Map<number, { start: number; poles: number; row: number | null }>();
  for (const c of kept) for (const p of occupiedPositions(c.position, c.poles)) holder.set(p, { start: c.position, poles: c.poles, row: null });
  for (const r of rows) {
    if (!r.circuit) continue;
    const { position, poles } = r.circuit;
    for (const p of occupiedPositions(position, poles)) {
      const other = holder.get(p);
      if (other) {
        const whose = other.row === null ? 'that stays in the panel' : `of row ${other.row}`;
        r.problems.push(
          p === position && other.start === position
            ? `row ${r.row}: position ${p} appears twice (also row ${other.row}).`
            : `row ${r.row}: position ${p} overlaps the ${poleWord(other.poles)} at ${other.start} ${whose}.`,
        );
        break;
      }
    }
    for (const p of occupiedPositions(position, poles)) if (!holder.has(p)) holder.set(p, { start: position, poles, row: r.row });
  }

  const creates: ImportPlan['creates'] = [];
  const patches: ImportPlan['patches'] = [];
  let unchanged = 0;
  for (const r of rows) {
    if (!r.circuit || r.problems.length > 0) continue;
    const current = byStart.get(r.circuit.position);
    if (!current) {
      creates.push({ row: r.row, fields: r.circuit });
      continue;
    }
    const fields = changedFields(current, r.circuit);
    if (Object.keys(fields).length === 0) unchanged += 1;
    else {
      const before = Object.fromEntries(Object.keys(fields).map((k) => [k, current[k as CsvField]])) as Partial<CircuitFields>;
      patches.push({ row: r.row, circuitId: current.id, position: current.position, fields, before });
    }
  }
  const blocked = parsed.fileProblems.length > 0 || rows.some((r) => r.problems.length > 0);
  return {
    rows,
    fileProblems: parsed.fileProblems,
    creates,
    patches,
    deletes: removeMissing ? missing : [],
    kept,
    unchanged,
    blocked,
  };
}

/** The fields of `next` that differ from `current`. */
export function changedFields(current: CircuitFields, next: CircuitFields): Partial<CircuitFields> {
  const out: Record<string, unknown> = {};
  for (const { field } of CSV_COLUMNS) {
    if (current[field] !== next[field]) out[field] = next[field];
  }
  return out as Partial<CircuitFields>;
}

/** "2 new, 3 changed, 1 removed, 38 unchanged" */
export function planSummary(plan: ImportPlan): string {
  return [
    `${plan.creates.length} new`,
    `${plan.patches.length} changed`,
    plan.deletes.length ? `${plan.deletes.length} removed` : null,
    `${plan.unchanged} unchanged`,
    plan.kept.length ? `${plan.kept.length} not in the file (kept)` : null,
  ]
    .filter(Boolean)
    .join(', ');
}

export { HEADER_OF as CSV_HEADER_OF };

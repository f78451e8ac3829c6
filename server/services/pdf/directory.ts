/**
 * The printed circuit directory for the panel door (NEC 408.4(A): every circuit identified by its
 * purpose, legibly, with spares and spaces marked). One page, Letter or A4, for panels up to 42
 * positions and beyond (the rows shrink to fit). The layout and wording are ours.
 */
import { IsNull, type DataSource } from 'typeorm';
import { occupiedPositions, panelLayout, phaseOf } from '../../../shared/calc';
import { SYSTEM_INFO } from '../../../shared/domain';
import { roleForBuilding, type Actor } from '../../auth/access';
import { Building, Circuit, Panel, User } from '../../entities';
import { NotFoundError } from '../../http/errors';
import { COPPER, FONT, INK, RULE, SOFT, dayOf, finish, line, newDocument, printable, type Paper } from './fonts';
import { drawQr } from './qr';
import { faultSourceText, panelFaultCheck } from '../../../shared/panel-checks';

const live = { deletedAt: IsNull() };

/** What one position of the door card says. */
export interface DirectoryRow {
  position: number;
  phase: string;
  /** "1P 20A", or '' where no breaker is recorded */
  breaker: string;
  /** the circuit's purpose, or the words for a spare / space / further pole */
  text: string;
  /** SPARE or SPACE: printed in bold so they stand out */
  mark: 'spare' | 'space' | null;
}

/** The rows of the directory, one per position, from the shared layout (odd left, even right). */
export function directoryRows(
  panel: Pick<Panel, 'system' | 'spaces' | 'tag'>,
  circuits: readonly Pick<Circuit, 'id' | 'position' | 'poles' | 'ratingA' | 'description' | 'status'>[],
): DirectoryRow[] {
  const layout = panelLayout(panel, circuits);
  const byId = new Map(circuits.map((c) => [c.id, c]));
  return layout.slots.map((slot) => {
    const circuit = slot.circuitId ? byId.get(slot.circuitId) : undefined;
    const phase = phaseOf(panel.system, slot.position);
    if (!circuit) return { position: slot.position, phase, breaker: '', text: 'SPACE — no breaker', mark: 'space' };
    const breaker = `${circuit.poles}P ${circuit.ratingA ? `${circuit.ratingA}A` : '—'}`;
    if (circuit.position !== slot.position) {
      const poles = occupiedPositions(circuit.position, circuit.poles);
      return {
        position: slot.position,
        phase,
        breaker: '',
        text: `— pole ${poles.indexOf(slot.position) + 1} of the breaker at ${circuit.position}`,
        mark: null,
      };
    }
    if (circuit.status === 'space') {
      return { position: slot.position, phase, breaker: '', text: spareOrSpace('SPACE', circuit.description), mark: 'space' };
    }
    if (circuit.status === 'spare') {
      return { position: slot.position, phase, breaker, text: spareOrSpace('SPARE', circuit.description), mark: 'spare' };
    }
    return { position: slot.position, phase, breaker, text: circuit.description || '(purpose not recorded)', mark: null };
  });
}

function spareOrSpace(word: 'SPARE' | 'SPACE', description: string): string {
  return description && description.trim().toUpperCase() !== word ? `${word} — ${description}` : word === 'SPARE' ? 'SPARE — breaker fitted, nothing connected' : 'SPACE — no breaker';
}

/** The panel as printed, or not found when the actor may not see its building. */
export async function directoryPdf(
  ds: DataSource,
  actor: Actor,
  panelId: string,
  options: { paper: Paper; origin: string; now?: Date },
): Promise<{ filename: string; pdf: Buffer }> {
  const em = ds.manager;
  const panel = await em.findOne(Panel, { where: { id: panelId, ...live } });
  const building = panel && (await em.findOne(Building, { where: { id: panel.buildingId, ...live } }));
  if (!panel || !building || !roleForBuilding(actor, building)) throw new NotFoundError('Panel');
  const circuits = await em.find(Circuit, { where: { panelId, ...live }, order: { position: 'ASC' } });
  const feeder = panel.fedFromPanelId
    ? await em.findOne(Panel, { where: { id: panel.fedFromPanelId, ...live } })
    : null;
  // who last changed the schedule: the latest write over the panel and its live circuits
  const latest = [panel, ...circuits].reduce((a, b) => (b.updatedAt > a.updatedAt ? b : a));
  const editor = latest.updatedBy ? await em.findOne(User, { where: { id: latest.updatedBy } }) : null;

  const rows = directoryRows(panel, circuits);
  const url = `${options.origin.replace(/\/+$/, '')}/panels/${panel.id}`;
  const now = options.now ?? new Date();
  const margin = 32;
  const doc = newDocument({ paper: options.paper, title: `Circuit directory — panel ${panel.tag}`, margin });
  const pageW = doc.page.width;
  const pageH = doc.page.height;
  const contentW = pageW - 2 * margin;

  // ---- header
  let y = margin;
  line(doc, 'CIRCUIT DIRECTORY', margin, y, contentW / 2, FONT.bold, 9, COPPER);
  line(doc, building.name, margin + contentW / 2, y, contentW / 2, FONT.text, 9, SOFT);
  doc.font(FONT.text).fontSize(9);
  y += 13;
  doc.rect(margin, y, 4, 40).fill(COPPER);
  line(doc, `Panel ${panel.tag}`, margin + 12, y - 2, contentW * 0.55, FONT.monoBold, 28);
  line(doc, panel.location || 'Location not recorded', margin + 12, y + 32, contentW * 0.55, FONT.text, 11, SOFT);
  const facts: [string, string][] = [
    ['System', SYSTEM_INFO[panel.system].label],
    ['Fed from', feeder ? `${feeder.tag}${panel.fedFromPosition ? ` position ${panel.fedFromPosition}` : ''}` : 'not recorded'],
    ['Main', panel.mainRatingA ? `${panel.mainRatingA} A main breaker` : 'main lugs only'],
    ['Bus', `${panel.busRatingA} A`],
    // recorded from the NEC 110.24 label, the utility or a study: the door is where 110.24 puts it
    ['Fault', panel.availableFaultKA ? `${panel.availableFaultKA} kA (${faultSourceText(panel) || 'source not recorded'})` : 'not recorded'],
  ];
  const factsX = margin + contentW * 0.58;
  const factsW = contentW * 0.42;
  facts.forEach(([label, value], i) => {
    const fy = y + i * 12;
    line(doc, label, factsX, fy, 52, FONT.bold, 9, SOFT);
    line(doc, value, factsX + 54, fy, factsW - 54, FONT.text, 9.5);
  });
  y += 12 * facts.length + 6;

  // ---- footer (drawn first in our arithmetic so the rows know their room)
  const qrSize = 78;
  const footerH = qrSize + 8;
  const footerY = pageH - margin - footerH;

  // ---- the positions: odd down the left, even down the right, one row per pair
  const colGap = 10;
  const colW = (contentW - colGap) / 2;
  const headH = 14;
  line(doc, 'Pos  Ph  Breaker', margin, y, colW, FONT.bold, 8, SOFT);
  line(doc, 'Pos  Ph  Breaker', margin + colW + colGap, y, colW, FONT.bold, 8, SOFT);
  y += headH;
  const rowCount = Math.ceil(rows.length / 2);
  const rowsH = footerY - 10 - y;
  const rowH = Math.min(24, rowsH / Math.max(rowCount, 1));
  const size = Math.max(6, Math.min(10, rowH * 0.46));
  for (let r = 0; r < rowCount; r += 1) {
    const ry = y + r * rowH;
    if (r % 2 === 0) doc.rect(margin, ry, contentW, rowH).fill('#F1EEE6');
    for (const side of [0, 1] as const) {
      const row = rows[r * 2 + side];
      if (!row) continue;
      const x = margin + side * (colW + colGap);
      const ty = ry + (rowH - size) / 2 - 1;
      line(doc, String(row.position).padStart(2, ' '), x + 2, ty, 20, FONT.monoBold, size);
      line(doc, row.phase, x + 24, ty, 12, FONT.mono, size, SOFT);
      line(doc, row.breaker, x + 38, ty, 46, FONT.mono, size);
      // a long purpose first gets a smaller size, then an ellipsis: never a second line
      const font = row.mark ? FONT.bold : FONT.text;
      doc.font(font).fontSize(size);
      const fits = doc.widthOfString(printable(row.text)) <= colW - 88;
      line(doc, row.text, x + 86, fits ? ty : ty + size * 0.08, colW - 88, font, fits ? size : size * 0.84);
    }
    doc.moveTo(margin, ry + rowH).lineTo(margin + contentW, ry + rowH).lineWidth(0.4).strokeColor(RULE).stroke();
  }
  // the spine between the columns, as on the panel
  doc.moveTo(margin + colW + colGap / 2, y).lineTo(margin + colW + colGap / 2, y + rowCount * rowH)
    .lineWidth(1).strokeColor(INK).stroke();

  // ---- footer
  doc.moveTo(margin, footerY).lineTo(margin + contentW, footerY).lineWidth(0.8).strokeColor(INK).stroke();
  drawQr(doc, url, margin, footerY + 6, qrSize);
  const tx = margin + qrSize + 10;
  const tw = contentW - qrSize - 10;
  line(doc, 'Scan for the live directory in Ampwright (sign-in needed).', tx, footerY + 10, tw, FONT.bold, 9);
  line(doc, url, tx, footerY + 23, tw, FONT.mono, 7.5, SOFT);
  const who = editor?.name ? `by ${editor.name}` : latest.updatedBy ? 'by a former user' : '(no user recorded)';
  line(doc, `Schedule last changed ${dayOf(latest.updatedAt)} ${who}. Printed ${dayOf(now)}.`, tx, footerY + 38, tw, FONT.text, 9);
  line(
    doc,
    'Reprint after any change: NEC 408.4(A) asks that each circuit be identified by its purpose, legibly, here at the panel.',
    tx, footerY + 52, tw, FONT.text, 7.5, SOFT,
  );
  line(doc, 'SPARE = breaker fitted, nothing connected. SPACE = no breaker in that position.', tx, footerY + 63, tw, FONT.text, 7.5, SOFT);
  line(doc, panelChecksLine(panel, circuits), tx, footerY + 74, tw, FONT.bold, 7.5, INK);

  const pdf = await finish(doc);
  return { filename: `directory-${slug(panel.tag)}-${options.paper}.pdf`, pdf };
}

/** What the fault-current check flags (NEC 110.9/110.10) and how many breakers were traced at the panel. */
function panelChecksLine(panel: Panel, circuits: readonly Circuit[]): string {
  const check = panelFaultCheck(panel, circuits);
  const breakers = circuits.filter((c) => c.status !== 'space');
  const verified = `Verified at the panel: ${breakers.filter((c) => c.verifiedOn).length} of ${breakers.length} breakers.`;
  if (!check.judged || check.findings.length === 0) return verified;
  const positions = check.findings.map((f) => (f.id ? `position ${breakers.find((c) => c.id === f.id)?.position}` : 'the panel'));
  return `Rated below the available fault current (NEC 110.9): ${positions.join(', ')}. ${verified}`;
}

export function slug(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'panel';
}


/**
 * The inspection report: what was done, each reading judged by shared/assess.ts (the same function
 * the screens and GET /api/inspections/:id use), the deficiencies it raised with their photos,
 * each panel's load from shared/calc (panelLoad), the sign-off and the safety caution. Flowing
 * pages, Letter.
 */
import type { Readable } from 'node:stream';
import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import { isJudged, type Assessment } from '../../../shared/assess';
import { PANEL_LOAD_FIGURES, SAFETY_CAUTION, panelLoad } from '../../../shared/calc';
import { SYSTEM_INFO } from '../../../shared/domain';
import {
  INSPECTION_KIND_LABELS,
  PRIORITY_BARS,
  PRIORITY_LABELS,
  STATUS_LABELS,
  THERMAL_COMPONENT_LABELS,
  VISUAL_CHECKS,
  type Priority,
} from '../../../shared/records';
import type { Actor } from '../../auth/access';
import type { Circuit, Panel, Photo, Reading } from '../../entities';
import { loadInspection } from '../inspection-record';
import type { PhotoStore } from '../photo-store';
import { COPPER, FONT, INK, PRIORITY_COLOURS, RULE, SOFT, dayOf, finish, newDocument, printable, type PrintedLine } from './fonts';
import { slug } from './directory';
import { drawBandPlot } from './band-plot';
import { bandPlotView, plotTestOf } from '../../../shared/band-plot-words';
import { formatTemp, type TemperatureUnit } from '../../../shared/units';
import { componentTempText, panelChecksLines, thermographyText, verifierNames } from './panel-checks';

const MARGIN = 48;
const THUMB_PT = 110;
/** the band plot's height in the report, pt */
const PLOT_PT = 220;

/** Room left on the page before the bottom margin. */
function roomLeft(doc: PDFKit.PDFDocument): number {
  return doc.page.height - doc.page.margins.bottom - doc.y;
}
function keepTogether(doc: PDFKit.PDFDocument, height: number): void {
  if (roomLeft(doc) < height) doc.addPage();
}

/** One block of text as printed: measured first (to keep a block on one page), then printed. */
/** What a heading takes: its space above, the 13 pt line and the rule under it. */
const SIGN_OFF_HEADING_PT = 44;

function linesHeight(doc: PDFKit.PDFDocument, lines: readonly PrintedLine[], width: number): number {
  return lines.reduce((sum, l) => sum + doc.font(l.font).fontSize(l.size).heightOfString(l.text, { width }), 0);
}
function printLines(doc: PDFKit.PDFDocument, lines: readonly PrintedLine[], width: number): void {
  for (const [i, l] of lines.entries()) {
    doc.font(l.font).fontSize(l.size).fillColor(l.colour);
    if (i === 0) doc.text(l.text, MARGIN, doc.y, { width });
    else doc.text(l.text, { width });
  }
}

/** The sign-off's lines: who signed and when, or that nobody has. */
function signOffLines(inspection: { signedAt: Date | null; signedByName: string | null }): PrintedLine[] {
  if (inspection.signedAt) {
    return [
      { font: FONT.bold, size: 11, colour: INK, text: inspection.signedByName || 'The inspector' },
      {
        font: FONT.text,
        size: 10,
        colour: INK,
        text: `signed this inspection on ${inspection.signedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC; its readings are frozen.`,
      },
    ];
  }
  return [
    { font: FONT.bold, size: 12, colour: PRIORITY_COLOURS[1], text: 'NOT SIGNED' },
    { font: FONT.text, size: 10, colour: INK, text: 'The inspector has not signed this inspection: its readings may still change.' },
  ];
}

function heading(doc: PDFKit.PDFDocument, text: string): void {
  keepTogether(doc, 60);
  doc.moveDown(0.8);
  doc.font(FONT.bold).fontSize(13).fillColor(COPPER).text(text, MARGIN);
  const y = doc.y + 2;
  doc.moveTo(MARGIN, y).lineTo(doc.page.width - MARGIN, y).lineWidth(0.6).strokeColor(RULE).stroke();
  doc.y = y + 6;
  doc.fillColor(INK);
}

/** "Label: value" on one flowing line. */
function fact(doc: PDFKit.PDFDocument, label: string, value: string): void {
  doc.font(FONT.bold).fontSize(10).fillColor(SOFT).text(`${label}  `, MARGIN, doc.y, { continued: true });
  doc.font(FONT.text).fillColor(INK).text(value);
}

async function bytesOf(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.from(chunk as Buffer));
  return Buffer.concat(chunks);
}

/** A thumbnail as PNG for pdfkit (which reads JPEG and PNG, not the stored WebP), or why not. */
async function thumbnail(store: PhotoStore, photo: Photo): Promise<{ png: Buffer } | { note: string }> {
  if (!photo.uploaded) return { note: 'not uploaded yet (still on the device that took it)' };
  const stored = await store.get(photo.id, 'thumb');
  if (!stored) {
    return {
      note: photo.contentType === 'image/heic'
        ? 'HEIC photo without a thumbnail: open it in the app'
        : 'no thumbnail stored: open it in the app',
    };
  }
  try {
    return { png: await sharp(await bytesOf(stored.body)).png().toBuffer() };
  } catch {
    return { note: 'thumbnail could not be read: open it in the app' };
  }
}

function readingTitle(r: Reading, circuit: Circuit | undefined, panel: Panel | undefined): string {
  const where = [panel ? `Panel ${panel.tag}` : null, circuit ? `position ${circuit.position}` : null]
    .filter(Boolean)
    .join(', ');
  const what =
    r.kind === 'thermal'
      ? `Thermal${r.component ? ` — ${THERMAL_COMPONENT_LABELS[r.component]}` : ''}${r.phase ? `, phase ${r.phase}` : ''}`
      : r.kind === 'torque'
        ? `Torque${r.fastener ? ` — ${r.fastener}` : ''}`
        : r.kind === 'trip'
          ? 'Trip test'
          : `Visual${r.check ? ` — ${VISUAL_CHECKS[r.check].label}` : ''}`;
  return `${what}${where ? ` (${where}${circuit?.description ? `: ${circuit.description}` : ''})` : ''}`;
}

function measured(r: Reading, unit: TemperatureUnit): string | null {
  switch (r.kind) {
    case 'thermal':
      return [
        r.temperatureC !== null ? `${formatTemp(r.temperatureC, unit, 'absolute')} measured` : null,
        r.referenceC !== null ? `${formatTemp(r.referenceC, unit, 'absolute')} reference (${r.referenceBasis === 'ambient' ? 'ambient air' : 'similar component'})` : null,
        r.loadA !== null ? `load ${r.loadA} A` : null,
        r.referenceLoadA !== null ? `reference load ${r.referenceLoadA} A` : null,
      ].filter(Boolean).join('; ') || null;
    case 'torque':
      return [
        r.specified !== null ? `specified ${r.specified} ${r.unit ?? ''}`.trim() : null,
        r.asFound === 'held' ? 'held at the specified torque' : r.asFoundValue !== null ? `turned at ${r.asFoundValue} ${r.unit ?? ''}`.trim() : null,
        r.asLeft !== null ? `left at ${r.asLeft} ${r.unit ?? ''}`.trim() : null,
      ].filter(Boolean).join('; ') || null;
    case 'trip':
      return [
        r.testCurrentA !== null ? `test current ${r.testCurrentA} A` : null,
        r.tripped === false ? 'did not trip' : r.tripTimeS !== null ? `tripped in ${r.tripTimeS} s` : null,
      ].filter(Boolean).join('; ') || null;
    default:
      return null;
  }
}

function verdictWords(a: Assessment): string {
  if (a.priority) return PRIORITY_LABELS[a.priority];
  return isJudged(a) ? 'No action' : 'Not judged';
}

/** Priority or verdict as a coloured tag followed by its word (never colour alone). */
function tagLine(doc: PDFKit.PDFDocument, word: string, colour: string, rest: string): void {
  const y = doc.y;
  doc.font(FONT.bold).fontSize(10);
  const w = doc.widthOfString(word) + 10;
  keepTogether(doc, 16);
  doc.roundedRect(MARGIN, doc.y, w, 14, 3).fill(colour);
  doc.fillColor('#FFFFFF').text(word, MARGIN + 5, doc.y + 2, { lineBreak: false });
  doc.fillColor(INK).font(FONT.text).fontSize(10).text(rest, MARGIN + w + 8, doc.y === y ? y + 2 : doc.y, {
    width: doc.page.width - 2 * MARGIN - w - 8,
  });
  doc.x = MARGIN;
  doc.moveDown(0.2);
}

/**
 * A deficiency's priority as the screens show it: four bars, as many filled as it is urgent
 * (PRIORITY_BARS), then its words — legible in black and white, with no colour to decode.
 */
function priorityLine(doc: PDFKit.PDFDocument, priority: Priority, rest: string): void {
  keepTogether(doc, 16);
  const y = doc.y;
  const heights = [4, 6.5, 9, 11.5];
  heights.forEach((h, i) => {
    const x = MARGIN + i * 4.5;
    doc.lineWidth(0.8).rect(x, y + 12 - h, 3, h);
    if (i < PRIORITY_BARS[priority]) doc.fillAndStroke(INK, INK);
    else doc.stroke(INK);
  });
  const word = PRIORITY_LABELS[priority];
  doc.font(FONT.bold).fontSize(10).fillColor(INK).text(word, MARGIN + 22, y + 1, { lineBreak: false });
  const w = 22 + doc.widthOfString(word) + 8;
  doc.font(FONT.text).fontSize(10).text(rest, MARGIN + w, y + 1, { width: doc.page.width - 2 * MARGIN - w });
  doc.x = MARGIN;
  doc.moveDown(0.2);
}

/** The caution (shared/calc SAFETY_CAUTION) in a box with a P2-amber edge and the word "Safety". */
function safetyBox(doc: PDFKit.PDFDocument, width: number): void {
  keepTogether(doc, 90);
  doc.moveDown(0.8);
  const top = doc.y;
  doc.font(FONT.bold).fontSize(9.5).fillColor(INK).text('Safety', MARGIN + 10, top + 6, { width: width - 20 });
  doc.font(FONT.text).fontSize(9.5).text(SAFETY_CAUTION, { width: width - 20 });
  const bottom = doc.y + 6;
  doc.rect(MARGIN, top, 3, bottom - top).fill(PRIORITY_COLOURS[2]);
  doc.x = MARGIN;
  doc.y = bottom;
}

/**
 * The report of one inspection as a PDF, for the route and for anything that sends it on (the
 * e-mail to the owner). Not found when the actor may not see the building.
 */
export async function inspectionReportPdf(
  ds: DataSource,
  store: PhotoStore,
  actor: Actor,
  inspectionId: string,
  /** the reader's temperature unit (stored values are °C) */
  { temperatureUnit = 'C' }: { temperatureUnit?: TemperatureUnit } = {},
): Promise<{ filename: string; pdf: Buffer }> {
  const unit = temperatureUnit;
  const record = await loadInspection(ds.manager, actor, inspectionId, unit);
  const { inspection, building, panels, panelById, circuitById, deficiencies, photos } = record;

  const kind = INSPECTION_KIND_LABELS[inspection.kind];
  const doc = newDocument({ paper: 'letter', title: `${kind} — ${building.name} — ${inspection.performedOn}`, margin: MARGIN });
  const width = doc.page.width - 2 * MARGIN;

  // ---- header
  doc.font(FONT.bold).fontSize(9).fillColor(COPPER).text('INSPECTION REPORT', MARGIN, MARGIN);
  doc.font(FONT.bold).fontSize(22).fillColor(INK).text(`${kind}, ${inspection.performedOn}`);
  doc.font(FONT.text).fontSize(12).fillColor(SOFT).text(building.name);
  doc.moveDown(0.5);
  fact(doc, 'Inspector', inspection.inspectorName || 'not recorded');
  fact(doc, 'Panels', panels.map((p) => `${p.tag}${p.location ? ` (${p.location})` : ''}`).join(', ') || 'none named');
  fact(doc, 'Ambient', formatTemp(inspection.ambientC, unit, 'absolute', 'not recorded'));
  fact(doc, 'Load at the time', inspection.loadPct !== null ? `${inspection.loadPct} % of normal` : 'not recorded');
  if (inspection.notes) fact(doc, 'Notes', inspection.notes);
  doc.moveDown(0.3);
  doc.font(FONT.bold).fontSize(11);
  if (inspection.signedAt) {
    doc.fillColor(INK).text(`Signed off by ${inspection.signedByName || 'the inspector'} on ${dayOf(inspection.signedAt)}.`);
  } else {
    doc.fillColor(PRIORITY_COLOURS[1]).text('NOT SIGNED — this inspection is still open and may change.');
  }

  safetyBox(doc, width);

  // ---- readings
  heading(doc, `Readings (${record.readings.length})`);
  if (record.readings.length === 0) doc.font(FONT.text).fontSize(10).fillColor(SOFT).text('No readings were recorded.');
  for (const { reading: r, circuit, assessment: a, band } of record.readings) {
    keepTogether(doc, 80);
    doc.font(FONT.bold).fontSize(10.5).fillColor(INK).text(readingTitle(r, circuit, panelById.get(r.panelId)), MARGIN, doc.y, { width });
    const m = measured(r, unit);
    if (m) doc.font(FONT.mono).fontSize(9).fillColor(SOFT).text(m, { width });
    const camera = thermographyText(r, unit);
    if (camera) doc.font(FONT.mono).fontSize(8.5).fillColor(SOFT).text(camera, { width });
    const component = componentTempText(r, circuit, panelById.get(r.panelId));
    if (component) doc.font(FONT.text).fontSize(9).fillColor(component.over ? PRIORITY_COLOURS[1] : INK).text(component.text, { width });
    tagLine(doc, verdictWords(a), a.priority ? PRIORITY_COLOURS[a.priority] : SOFT, a.summary);
    if (a.kind === 'thermal' && a.priority) doc.font(FONT.text).fontSize(9.5).fillColor(INK).text(`Action: ${a.action}`, { width });
    if (a.kind === 'thermal') for (const note of a.notes) doc.font(FONT.text).fontSize(9).fillColor(SOFT).text(note, { width });
    if (a.kind === 'torque') for (const w of a.verdict.warnings) doc.font(FONT.text).fontSize(9).fillColor(INK).text(w, { width });
    doc.font(FONT.text).fontSize(8.5).fillColor(SOFT).text(`Basis: ${a.basis}`, { width });
    if (r.notes) doc.font(FONT.text).fontSize(9).fillColor(INK).text(`Note: ${r.notes}`, { width });
    const plot = r.kind === 'trip' && band ? bandPlotView(band, [plotTestOf(r, a.kind === 'trip' ? a.result : null)].filter((t) => t !== null)) : null;
    if (plot) {
      keepTogether(doc, PLOT_PT + 70);
      drawBandPlot(doc, plot, { x: MARGIN, y: doc.y + 6, width: Math.min(width, 380), height: PLOT_PT });
    }
    doc.moveDown(0.6);
  }

  // ---- deficiencies
  heading(doc, `Deficiencies raised (${deficiencies.length})`);
  if (deficiencies.length === 0) doc.font(FONT.text).fontSize(10).fillColor(SOFT).text('None were raised in this inspection.');
  for (const d of deficiencies) {
    keepTogether(doc, 70);
    const panel = d.panelId ? panelById.get(d.panelId) : undefined;
    const circuit = d.circuitId ? circuitById.get(d.circuitId) : undefined;
    priorityLine(doc, d.priority, d.title);
    const where = [panel ? `Panel ${panel.tag}` : null, circuit ? `position ${circuit.position}` : null].filter(Boolean).join(', ');
    doc.font(FONT.text).fontSize(9.5).fillColor(SOFT)
      .text([`${STATUS_LABELS[d.status]}`, `due ${d.dueOn}`, where || null, d.raisedByName ? `raised by ${d.raisedByName}` : null].filter(Boolean).join(' · '), MARGIN, doc.y, { width });
    if (d.description) doc.font(FONT.text).fontSize(10).fillColor(INK).text(d.description, { width });
    if (d.priorityReason) doc.font(FONT.text).fontSize(9).fillColor(SOFT).text(`Why this priority: ${d.priorityReason}`, { width });
    if (d.status === 'deferred' && d.deferReason) {
      doc.font(FONT.text).fontSize(9).fillColor(INK).text(`Deferred: ${d.deferReason}${d.reviewOn ? ` (review ${d.reviewOn})` : ''}`, { width });
    }
    if (d.repairNote) doc.font(FONT.text).fontSize(9).fillColor(INK).text(`Repair: ${d.repairNote}`, { width });
    const own = photos.filter((p) => p.parentId === d.id);
    if (own.length) {
      doc.moveDown(0.3);
      let x = MARGIN;
      let rowTop = doc.y;
      const notes: string[] = [];
      for (const photo of own) {
        const t = await thumbnail(store, photo);
        if ('note' in t) {
          notes.push(`Photo ${dayOf(photo.takenAt)}${photo.caption ? ` (${photo.caption})` : ''}: ${t.note}.`);
          continue;
        }
        if (x + THUMB_PT > MARGIN + width) {
          x = MARGIN;
          rowTop += THUMB_PT + 6;
        }
        if (rowTop + THUMB_PT > doc.page.height - doc.page.margins.bottom) {
          doc.addPage();
          rowTop = doc.y;
          x = MARGIN;
        }
        doc.image(t.png, x, rowTop, { fit: [THUMB_PT, THUMB_PT] });
        x += THUMB_PT + 6;
      }
      if (x !== MARGIN) doc.y = rowTop + THUMB_PT + 4;
      doc.x = MARGIN;
      for (const note of notes) doc.font(FONT.text).fontSize(8.5).fillColor(SOFT).text(note, MARGIN, doc.y, { width });
    }
    doc.moveDown(0.6);
  }

  // ---- load per panel, then the sign-off: the last panel's load and the sign-off share a page,
  // so a signature never stands alone on the last page
  const signOff = signOffLines(inspection);
  heading(doc, 'Panel load and checks (from the schedule on record)');
  const names = await verifierNames(ds.manager, record.circuits);
  panels.forEach((panel, index) => {
    const circuits = record.circuits.filter((c) => c.panelId === panel.id);
    const load = panelLoad(panel, circuits);
    const phases = Object.entries(load.phases)
      .map(([phase, p]) => `${phase} ${p.amps.toFixed(1)} A`)
      .join(' · ');
    const lines: PrintedLine[] = [
      { font: FONT.bold, size: 10.5, colour: INK, text: `Panel ${panel.tag} — ${printable(SYSTEM_INFO[panel.system].label)}` },
      {
        font: FONT.mono,
        size: 9,
        colour: INK,
        text:
          `${PANEL_LOAD_FIGURES.connected.label} ${(load.totalVA / 1000).toFixed(1)} kVA · ${PANEL_LOAD_FIGURES.sizing.label} ` +
          `${(load.sizingVA / 1000).toFixed(1)} kVA · per phase ${phases}`,
      },
      {
        font: FONT.mono,
        size: 9,
        colour: INK,
        text: `Worst phase sizing current ${load.utilisationPct === null ? 'n/a' : `${load.utilisationPct.toFixed(0)} %`} of ${load.capacityA ?? '—'} A · imbalance ${load.imbalancePct.toFixed(0)} %`,
      },
      {
        font: FONT.text,
        size: 8.5,
        colour: SOFT,
        text:
          `${PANEL_LOAD_FIGURES.connected.label}: ${PANEL_LOAD_FIGURES.connected.rule}. ${PANEL_LOAD_FIGURES.sizing.label}: ` +
          `${PANEL_LOAD_FIGURES.sizing.rule}; not an NEC 220 demand load. Imbalance as NEMA MG 1 defines it. ` +
          'Only circuits with a recorded load count.',
      },
      ...panelChecksLines(panel, circuits, names),
    ];
    const last = index === panels.length - 1;
    keepTogether(doc, linesHeight(doc, lines, width) + (last ? SIGN_OFF_HEADING_PT + linesHeight(doc, signOff, width) : 0));
    printLines(doc, lines, width);
    doc.moveDown(0.5);
  });

  // ---- sign-off
  heading(doc, 'Sign-off');
  printLines(doc, signOff, width);

  // page numbers
  const range = doc.bufferedPageRange();
  for (let i = 0; i < range.count; i += 1) {
    doc.switchToPage(range.start + i);
    const bottomMargin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.font(FONT.text).fontSize(8).fillColor(SOFT)
      .text(`${building.name} · ${kind} ${inspection.performedOn} · page ${i + 1} of ${range.count}`, MARGIN, doc.page.height - 30, { width, align: 'center', lineBreak: false });
    doc.page.margins.bottom = bottomMargin;
  }

  const pdf = await finish(doc);
  return { filename: `inspection-${slug(building.name)}-${inspection.kind}-${inspection.performedOn}.pdf`, pdf };
}

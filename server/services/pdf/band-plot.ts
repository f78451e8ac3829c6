/**
 * The time-current band plot in the report, drawn with pdfkit's vector paths from the same
 * geometry the screen's SVG uses (shared/calc/trip-plot.ts through shared/band-plot-words.ts):
 * log–log axes, the thermal band shaded, the instantaneous band dashed, each trip test a shape
 * AND a word (filled circle passes, cross fails, open square not judged), and the caption in text.
 */
import type { BandPlotView } from '../../../shared/band-plot-words';
import { markShape, markWord } from '../../../shared/band-plot-words';
import { FONT, INK, PRIORITY_COLOURS, RULE, SOFT } from './fonts';

const PAD = { left: 40, right: 10, top: 8, bottom: 30 };
const BAND_FILL = '#F3E3D8';
const BAND_EDGE = '#B35C2E';
const FAINT = '#E4E0D8';

/** Values 2–9 of every decade in [from, to]: the faint lines of a log grid. */
function minor([from, to]: [number, number]): number[] {
  const out: number[] = [];
  for (let d = from; d < to * 0.9999; d *= 10) for (let k = 2; k <= 9; k += 1) out.push(d * k);
  return out;
}
const logAt = ([from, to]: [number, number], v: number) => (Math.log10(v) - Math.log10(from)) / (Math.log10(to) - Math.log10(from));

/**
 * Draws the plot in the box at (x, y) of the given size and its caption under it; leaves doc.y
 * below the caption.
 */
export function drawBandPlot(doc: PDFKit.PDFDocument, view: BandPlotView, box: { x: number; y: number; width: number; height: number }): void {
  const { plot, verdicts } = view;
  const left = box.x + PAD.left;
  const top = box.y + PAD.top;
  const w = box.width - PAD.left - PAD.right;
  const h = box.height - PAD.top - PAD.bottom;
  const px = (x: number) => left + x * w;
  const py = (y: number) => top + y * h;

  doc.save();
  doc.lineWidth(0.3).strokeColor(FAINT);
  for (const v of minor(plot.multiples)) doc.moveTo(px(logAt(plot.multiples, v)), top).lineTo(px(logAt(plot.multiples, v)), top + h).stroke();
  for (const v of minor(plot.seconds)) doc.moveTo(left, py(1 - logAt(plot.seconds, v))).lineTo(left + w, py(1 - logAt(plot.seconds, v))).stroke();
  doc.lineWidth(0.6).strokeColor(RULE);
  doc.font(FONT.mono).fontSize(7).fillColor(SOFT);
  for (const t of plot.xTicks) {
    doc.moveTo(px(t.at), top).lineTo(px(t.at), top + h).stroke();
    doc.text(`${t.label}×`, px(t.at) - 20, top + h + 3, { width: 40, align: 'center', lineBreak: false });
  }
  for (const t of plot.yTicks) {
    doc.moveTo(left, py(t.at)).lineTo(left + w, py(t.at)).stroke();
    doc.text(t.label, box.x, py(t.at) - 3, { width: PAD.left - 4, align: 'right', lineBreak: false });
  }
  doc.rect(left, top, w, h).lineWidth(0.8).strokeColor(RULE).stroke();

  const shape = (pts: { x: number; y: number }[]) => {
    doc.moveTo(px(pts[0].x), py(pts[0].y));
    for (const p of pts.slice(1)) doc.lineTo(px(p.x), py(p.y));
    doc.closePath();
  };
  shape(plot.thermal);
  doc.lineWidth(1).fillColor(BAND_FILL).strokeColor(BAND_EDGE).fillAndStroke();
  if (plot.instantaneous) {
    shape(plot.instantaneous);
    doc.dash(3, { space: 2 }).fillAndStroke(BAND_FILL, BAND_EDGE).undash();
  }

  plot.tests.forEach((t, i) => {
    const verdict = verdicts[i] ?? null;
    const kind = markShape(verdict);
    const x = px(t.x);
    const y = py(t.y);
    const colour = kind === 'cross' ? PRIORITY_COLOURS[1] : INK;
    if (kind === 'circle') doc.circle(x, y, 3.5).fill(INK);
    if (kind === 'cross') doc.moveTo(x - 4, y - 4).lineTo(x + 4, y + 4).moveTo(x - 4, y + 4).lineTo(x + 4, y - 4).lineWidth(1.8).stroke(colour);
    if (kind === 'square') doc.rect(x - 3.5, y - 3.5, 7, 7).lineWidth(1.2).stroke(colour);
    const word = markWord(verdict);
    doc.font(FONT.bold).fontSize(7.5).fillColor(colour);
    const ww = doc.widthOfString(word);
    const right = t.x > 0.6;
    doc.text(word, right ? x - 6 - ww : x + 6, y - 11, { lineBreak: false });
  });

  doc.font(FONT.text).fontSize(8).fillColor(INK);
  doc.text('Current, multiples of rating', left, top + h + 14, { width: w, align: 'center', lineBreak: false });
  doc.save();
  doc.rotate(-90, { origin: [box.x + 6, top + h / 2] });
  doc.text('Seconds to trip', box.x + 6 - h / 2, top + h / 2 - 4, { width: h, align: 'center', lineBreak: false });
  doc.restore();
  doc.restore();

  doc.font(FONT.text).fontSize(8).fillColor(SOFT).text(view.caption, box.x, box.y + box.height + 2, { width: box.width });
  doc.text('Filled circle: passed · cross: failed · open square: not judged. Shaded: the band between its minimum and maximum times; dashed: the instantaneous pickup band.', { width: box.width });
  doc.fillColor(INK);
}

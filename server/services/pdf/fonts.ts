/**
 * The shipped fonts (fonts/ at the repository root, SIL OFL) and the page helpers both printed
 * documents share. pdfkit embeds a subset of each TrueType font it uses, so the PDF's words can be
 * read back (pdftotext) and print the same everywhere.
 */
import fs from 'node:fs';
import path from 'node:path';
import PDFDocument from 'pdfkit';

const FONT_DIR = path.resolve(__dirname, '..', '..', '..', 'fonts');

/**
 * A font file's bytes with 16 zero bytes after them. The shipped IBM Plex Mono files end their
 * `glyf` table (the last data in the file) with four empty glyphs — space, no-break space, .null
 * and CR — and fontkit 2.0.4 (pdfkit's font reader) reads a 10-byte glyph header even for an empty
 * glyph, so measuring a space ran past the end of the file ("Offset is outside the bounds of the
 * DataView"). Tables are found by offset, so bytes after the last one change nothing else; the
 * zeros read as an empty box, which is what an empty glyph has.
 */
function fontBytes(file: string): Buffer {
  return Buffer.concat([fs.readFileSync(path.join(FONT_DIR, file)), Buffer.alloc(16)]);
}
let cache: Record<string, Buffer> | null = null;
function fonts(): Record<string, Buffer> {
  cache ??= {
    [FONT.text]: fontBytes('AtkinsonHyperlegible_400Regular.ttf'),
    [FONT.bold]: fontBytes('AtkinsonHyperlegible_700Bold.ttf'),
    [FONT.mono]: fontBytes('IBMPlexMono_400Regular.ttf'),
    [FONT.monoBold]: fontBytes('IBMPlexMono_600SemiBold.ttf'),
  };
  return cache;
}

/** Font names as registered on every document. */
export const FONT = {
  text: 'Atkinson',
  bold: 'Atkinson-Bold',
  mono: 'Plex',
  monoBold: 'Plex-SemiBold',
} as const;

/** DESIGN.md §6: ink on paper, copper accent, priority colours (always beside a word). */
export const INK = '#1D2733';
export const SOFT = '#4A5563';
export const RULE = '#B9B4A8';
export const COPPER = '#B35C2E';
export const PRIORITY_COLOURS: Record<1 | 2 | 3 | 4, string> = { 1: '#B8322A', 2: '#C77B1A', 3: '#2F6F95', 4: '#5E7D46' };

export type Paper = 'letter' | 'a4';
/** PDF points (1/72 in): Letter 8.5 × 11 in, A4 210 × 297 mm. */
export const PAPER_SIZES: Record<Paper, [number, number]> = { letter: [612, 792], a4: [595.28, 841.89] };

/** A new document with the fonts registered and the metadata set. */
export function newDocument(options: { paper: Paper; title: string; margin: number }): PDFKit.PDFDocument {
  const doc = new PDFDocument({
    size: PAPER_SIZES[options.paper],
    margin: options.margin,
    info: { Title: options.title, Creator: 'Ampwright', Producer: 'Ampwright (pdfkit)' },
    bufferPages: true,
  });
  for (const [name, bytes] of Object.entries(fonts())) doc.registerFont(name, bytes);
  doc.font(FONT.text).fillColor(INK);
  return doc;
}

/** The finished document's bytes. */
export function finish(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.end();
  });
}

/** The text shortened with an ellipsis until it fits `width` in the current font and size. */
export function fitText(doc: PDFKit.PDFDocument, text: string, width: number): string {
  if (doc.widthOfString(text) <= width) return text;
  let cut = text;
  while (cut.length > 1 && doc.widthOfString(`${cut}…`) > width) cut = cut.slice(0, -1);
  return `${cut.trimEnd()}…`;
}

/** One line at (x, y), never wrapped, shortened to fit. */
export function line(
  doc: PDFKit.PDFDocument,
  text: string,
  x: number,
  y: number,
  width: number,
  font: string,
  size: number,
  colour = INK,
): void {
  doc.font(font).fontSize(size).fillColor(colour);
  doc.text(fitText(doc, printable(text), width), x, y, { lineBreak: false, width });
}

/**
 * Words as the shipped fonts can print them: neither has φ, so "3φ 4W" prints as "3-phase 4W"
 * (a missing glyph would print as an empty box).
 */
export function printable(text: string): string {
  return text.replace(/(\d)φ/g, '$1-phase').replace(/φ/g, 'phase');
}

/** The calendar day of a date or an HLC stamp (which starts with an ISO timestamp), YYYY-MM-DD. */
export function dayOf(value: Date | string): string {
  return (typeof value === 'string' ? value : value.toISOString()).slice(0, 10);
}

/** One line of a block the report measures before it prints (to keep a block on one page). */
export interface PrintedLine {
  font: string;
  size: number;
  colour: string;
  text: string;
}

/**
 * The recogniser's page (tesseract.js `blocks` output: blocks → paragraphs → lines → words) as the
 * flat list of lines the parser reads. Typed structurally, so shared/ needs no OCR package.
 */
import type { Box, OcrLine } from './parse';

interface EngineWord {
  text: string;
  confidence: number;
  bbox: Box;
}
interface EngineLine extends EngineWord {
  words: readonly EngineWord[];
}
export interface EngineBlock {
  paragraphs: readonly { lines: readonly EngineLine[] }[];
}

/** How the engine turned the image before reading it (its `rotateRadians`), and the image's size. */
export interface PageTurn {
  radians: number;
  width: number;
  height: number;
}

/**
 * A box of the turned image, back on the photo as taken: the engine turns the image about its
 * centre keeping its size, so each corner is turned back by −radians (checked on a card turned
 * 2.5° in tests/unit/door-card-ocr.test.ts), and the box is the corners' extent, kept on the image.
 */
export function unturnBox(b: Box, turn: PageTurn | null): Box {
  if (!turn || turn.radians === 0) return { x0: b.x0, y0: b.y0, x1: b.x1, y1: b.y1 };
  const cx = turn.width / 2;
  const cy = turn.height / 2;
  const cos = Math.cos(-turn.radians);
  const sin = Math.sin(-turn.radians);
  const corners = [
    [b.x0, b.y0],
    [b.x1, b.y0],
    [b.x0, b.y1],
    [b.x1, b.y1],
  ].map(([x, y]) => [cx + (x - cx) * cos - (y - cy) * sin, cy + (x - cx) * sin + (y - cy) * cos]);
  const xs = corners.map((c) => c[0]);
  const ys = corners.map((c) => c[1]);
  return {
    x0: Math.max(0, Math.round(Math.min(...xs))),
    y0: Math.max(0, Math.round(Math.min(...ys))),
    x1: Math.min(turn.width, Math.round(Math.max(...xs))),
    y1: Math.min(turn.height, Math.round(Math.max(...ys))),
  };
}

/** Lines in reading order, each with its words; empty lines are dropped. Boxes are on the photo as taken. */
export function linesOfPage(blocks: readonly EngineBlock[] | null, turn: PageTurn | null = null): OcrLine[] {
  const box = (b: Box) => unturnBox(b, turn);
  const out: OcrLine[] = [];
  for (const block of blocks ?? []) {
    for (const paragraph of block.paragraphs) {
      for (const line of paragraph.lines) {
        const text = line.text.replace(/\s+/g, ' ').trim();
        if (text === '') continue;
        const words = line.words
          .filter((w) => w.text.trim() !== '')
          .map((w) => ({ text: w.text.trim(), confidence: w.confidence, bbox: box(w.bbox) }));
        out.push({ text, confidence: line.confidence, bbox: box(line.bbox), words });
      }
    }
  }
  return out;
}

/** What a read of a photo gives (lib/ocr.ts, lib/ocr.web.ts). */
import type { OcrLine } from '@/shared/door-card/parse';

export interface OcrProgress {
  /** what the reader is doing, in words */
  step: string;
  /** 0–1 within that step */
  share: number;
}

export interface OcrResult {
  lines: OcrLine[];
  /** the photo's size in pixels (the boxes of the lines are on it) */
  width: number;
  height: number;
  /** the image the lines' boxes are on (the photo, or its scaled-down copy) */
  imageUrl: string;
  /** how long the read took */
  ms: number;
}

/** The picked photo: its URI (shown in the review) and, on the web, the file itself. */
export interface CardImage {
  uri: string;
  file?: Blob;
}

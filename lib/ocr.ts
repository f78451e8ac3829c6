/**
 * Reading a photo's text on the device. The web build uses ocr.web.ts (tesseract.js in a worker);
 * the native apps have no reader wired yet.
 */
import type { CardImage, OcrProgress, OcrResult } from './ocr-types';

export type { CardImage, OcrProgress, OcrResult };

export async function recognizeCard(_photo: CardImage, _onProgress: (p: OcrProgress) => void): Promise<OcrResult> {
  throw new Error('Reading a door card works in the web app for now (open Ampwright in the phone’s browser).');
}

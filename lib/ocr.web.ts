/**
 * Reads a photo's text in the browser with tesseract.js, in its own worker thread (the page stays
 * responsive), with every file from our own origin (lib/ocr-assets.ts): worker, core and model.
 * The service worker keeps those files, so this works with no signal once the app was opened.
 */
import { createWorker } from 'tesseract.js';
import { linesOfPage, type EngineBlock } from '@/shared/door-card/ocr-lines';
import { coreFileFor, OCR_PATHS } from './ocr-assets';
import { coreFeature } from './ocr-feature';
import type { CardImage, OcrProgress, OcrResult } from './ocr-types';

const STEPS: Record<string, string> = {
  'loading tesseract core': 'Loading the reader',
  'initializing tesseract': 'Starting the reader',
  'loading language traineddata': 'Loading the English model',
  'initializing api': 'Starting the reader',
  'recognizing text': 'Reading the card',
};

function imageSize(url: string): Promise<{ width: number; height: number }> {
  return new Promise((resolve, reject) => {
    const img = new Image();
    img.onload = () => resolve({ width: img.naturalWidth, height: img.naturalHeight });
    img.onerror = () => reject(new Error('This file could not be opened as a picture.'));
    img.src = url;
  });
}

/**
 * Reads the picked photo. The file itself is handed to the reader (the picker gives a `File` on
 * the web): tesseract.js would otherwise fetch the `blob:` URL, which our connect-src refuses.
 */
export async function recognizeCard(photo: CardImage, onProgress: (p: OcrProgress) => void): Promise<OcrResult> {
  const imageUrl = photo.uri;
  const started = performance.now();
  const size = await imageSize(imageUrl);
  const origin = window.location.origin;
  const worker = await createWorker('eng', 1, {
    workerPath: origin + OCR_PATHS.worker,
    corePath: origin + coreFileFor(await coreFeature()),
    langPath: origin + OCR_PATHS.langDir,
    gzip: true,
    // the service worker keeps the model: a second copy in IndexedDB would only take room
    cacheMethod: 'none',
    // a blob: worker would need a looser Content-Security-Policy than our own file does
    workerBlobURL: false,
    logger: (m: { status: string; progress: number }) => onProgress({ step: STEPS[m.status] ?? m.status, share: m.progress }),
  });
  try {
    const { data } = await worker.recognize(photo.file ?? imageUrl, { rotateAuto: true }, { blocks: true });
    const lines = linesOfPage(data.blocks as unknown as EngineBlock[], { radians: data.rotateRadians ?? 0, ...size });
    return { lines, ...size, ms: performance.now() - started };
  } finally {
    await worker.terminate();
  }
}

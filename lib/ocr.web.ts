/**
 * Reads a photo's text in the browser with tesseract.js, in its own worker thread (the page stays
 * responsive), with every file from our own origin (lib/ocr-assets.ts): worker, core and model.
 * The service worker keeps those files, so this works with no signal once the app was opened.
 */
import { createWorker } from 'tesseract.js';
import { median3 } from '@/shared/door-card/denoise';
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

/**
 * A phone photo is often 4000 px wide: text that large only slows the reader. Past this long edge
 * the photo is scaled down [our choice: a typed card filling a 2400 px frame has letters well
 * above the ~20 px the model reads best].
 */
export const OCR_LONG_EDGE = 2400;

/**
 * The image the reader gets and the review crops: the photo turned upright (EXIF), scaled to
 * OCR_LONG_EDGE, in grey with its grain taken out (shared/door-card/denoise.ts), as a PNG.
 */
async function readableImage(photo: CardImage): Promise<{ image: Blob | string; url: string; width: number; height: number }> {
  if (!photo.file) {
    const size = await imageSize(photo.uri);
    return { image: photo.uri, url: photo.uri, ...size };
  }
  const bitmap = await createImageBitmap(photo.file, { imageOrientation: 'from-image' }).catch(() => {
    throw new Error('This file could not be opened as a picture (JPEG, PNG or WebP).');
  });
  try {
    const f = Math.min(1, OCR_LONG_EDGE / Math.max(bitmap.width, bitmap.height));
    const width = Math.round(bitmap.width * f);
    const height = Math.round(bitmap.height * f);
    const canvas = document.createElement('canvas');
    canvas.width = width;
    canvas.height = height;
    const context = canvas.getContext('2d', { willReadFrequently: true });
    if (!context) throw new Error('This browser cannot prepare the photo for reading.');
    context.fillStyle = '#FFFFFF';
    context.fillRect(0, 0, width, height);
    context.imageSmoothingQuality = 'high';
    context.drawImage(bitmap, 0, 0, width, height);
    const pixels = context.getImageData(0, 0, width, height);
    const rgba = pixels.data;
    const grey = new Uint8Array(width * height);
    for (let i = 0; i < grey.length; i += 1) grey[i] = Math.round(0.299 * rgba[4 * i] + 0.587 * rgba[4 * i + 1] + 0.114 * rgba[4 * i + 2]);
    const clean = median3(grey, width, height);
    for (let i = 0; i < clean.length; i += 1) {
      rgba[4 * i] = clean[i];
      rgba[4 * i + 1] = clean[i];
      rgba[4 * i + 2] = clean[i];
      rgba[4 * i + 3] = 255;
    }
    context.putImageData(pixels, 0, 0);
    const blob = await new Promise<Blob>((resolve, reject) =>
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The photo could not be prepared for reading.'))), 'image/png'),
    );
    return { image: blob, url: URL.createObjectURL(blob), width, height };
  } finally {
    bitmap.close();
  }
}

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
  const started = performance.now();
  const prepared = await readableImage(photo);
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
    const { data } = await worker.recognize(prepared.image, { rotateAuto: true }, { blocks: true });
    const size = { width: prepared.width, height: prepared.height };
    const lines = linesOfPage(data.blocks as unknown as EngineBlock[], { radians: data.rotateRadians ?? 0, ...size });
    return { lines, ...size, imageUrl: prepared.url, ms: performance.now() - started };
  } finally {
    await worker.terminate();
  }
}

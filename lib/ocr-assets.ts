/**
 * Where the text recogniser's files are served from: our own origin, copied into the web build by
 * `scripts/ocr-assets.ts` (from the npm packages tesseract.js, tesseract.js-core and
 * @tesseract.js-data/eng), kept by the service worker so a door card is read with no signal.
 * Nothing is fetched from anywhere else: the hook passes these paths as workerPath, corePath and
 * langPath. The versions are in the paths, so a new version is a new file for every cache; the copy
 * script refuses to build when they no longer match node_modules.
 *
 * No React Native imports here: the copy script (Node) reads this module too.
 */
export const OCR_VERSIONS = { tesseract: '7.0.0', core: '7.0.0', eng: '1.0.0' } as const;

/** The model: the "best_int" English LSTM model (≈ 2.9 MB gzipped), the one tesseract.js picks for LSTM-only reading. */
export const OCR_MODEL_SOURCE = '4.0.0_best_int/eng.traineddata.gz';

export const OCR_PATHS = {
  worker: `/ocr/tesseract.js-${OCR_VERSIONS.tesseract}/worker.min.js`,
  coreDir: `/ocr/tesseract.js-core-${OCR_VERSIONS.core}`,
  langDir: `/ocr/eng-${OCR_VERSIONS.eng}`,
} as const;

/** The core builds we ship: LSTM only, by what the browser's WebAssembly supports. */
export const OCR_CORE_FILES = {
  relaxedSimd: 'tesseract-core-relaxedsimd-lstm.wasm.js',
  simd: 'tesseract-core-simd-lstm.wasm.js',
  plain: 'tesseract-core-lstm.wasm.js',
} as const;

export type CoreFeature = keyof typeof OCR_CORE_FILES;

/** The core file for this browser, as the worker itself would choose it from a folder. */
export function coreFileFor(feature: CoreFeature): string {
  return `${OCR_PATHS.coreDir}/${OCR_CORE_FILES[feature]}`;
}

/** The three files a read needs on this browser (the service worker keeps these). */
export function ocrFilesFor(feature: CoreFeature): string[] {
  return [OCR_PATHS.worker, coreFileFor(feature), `${OCR_PATHS.langDir}/eng.traineddata.gz`];
}

/** Which core build this browser runs (the same tests the recogniser's worker makes). */
import { relaxedSimd, simd } from 'wasm-feature-detect';
import type { CoreFeature } from './ocr-assets';

export async function coreFeature(): Promise<CoreFeature> {
  if (await relaxedSimd()) return 'relaxedSimd';
  if (await simd()) return 'simd';
  return 'plain';
}

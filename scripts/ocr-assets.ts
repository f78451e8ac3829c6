/**
 * Copies the text recogniser's files from node_modules into the web build (`dist/ocr/…`), so the
 * app serves them from its own origin and the service worker keeps them (lib/ocr-assets.ts).
 * Usage: tsx scripts/ocr-assets.ts <web build dir>. Idempotent: a file already there with the
 * same size is left alone. Fails when an installed version differs from the one the app names.
 */
import { copyFile, mkdir, stat } from 'node:fs/promises';
import { createRequire } from 'node:module';
import path from 'node:path';
import { OCR_CORE_FILES, OCR_MODEL_SOURCE, OCR_PATHS, OCR_VERSIONS } from '../lib/ocr-assets';

const require = createRequire(__filename);

function packageDir(name: string, version: string): string {
  const manifest = require.resolve(`${name}/package.json`);
  const found = (require(manifest) as { version: string }).version;
  if (found !== version) {
    throw new Error(`${name} ${found} is installed but lib/ocr-assets.ts names ${version}: change OCR_VERSIONS with the package.`);
  }
  return path.dirname(manifest);
}

async function sameSize(a: string, b: string): Promise<boolean> {
  try {
    return (await stat(a)).size === (await stat(b)).size;
  } catch {
    return false;
  }
}

async function main() {
  const out = process.argv[2];
  if (!out) throw new Error('usage: tsx scripts/ocr-assets.ts <web build dir>');
  const tesseract = packageDir('tesseract.js', OCR_VERSIONS.tesseract);
  const core = packageDir('tesseract.js-core', OCR_VERSIONS.core);
  const eng = packageDir('@tesseract.js-data/eng', OCR_VERSIONS.eng);
  const copies: [string, string][] = [
    [path.join(tesseract, 'dist/worker.min.js'), OCR_PATHS.worker],
    ...Object.values(OCR_CORE_FILES).map((file): [string, string] => [path.join(core, file), `${OCR_PATHS.coreDir}/${file}`]),
    [path.join(eng, OCR_MODEL_SOURCE), `${OCR_PATHS.langDir}/eng.traineddata.gz`],
  ];
  for (const [from, urlPath] of copies) {
    const to = path.join(out, urlPath);
    if (await sameSize(from, to)) continue;
    await mkdir(path.dirname(to), { recursive: true });
    await copyFile(from, to);
  }
}

main().catch((e: unknown) => {
  process.stderr.write(`${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
});

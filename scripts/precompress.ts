/**
 * Writes a brotli (`.br`, quality 11) and a gzip (`.gz`, level 9) copy beside each compressible
 * file of the web build, which the server sends as they are (server/app.ts, express-static-gzip).
 * The 2 MB bundle is ~450 KB at brotli 11 against ~550 KB at the quality 4 the compression
 * middleware can afford per request: what a phone on a weak signal waits for on its first visit
 * (`npm run bench:sync` part (e)). Usage: tsx scripts/precompress.ts <web build dir>.
 *
 * Idempotent: a copy newer than its file is left alone, and a copy whose file is gone is removed
 * (a stale copy would be served in place of the new file). The text recogniser's files under
 * `ocr/` are left to the middleware: only the door-card reader loads them, once per device.
 */
import { readdir, readFile, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import zlib from 'node:zlib';

const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);

const COMPRESSIBLE = new Set(['.js', '.html', '.css', '.json', '.svg', '.ttf', '.otf', '.ico', '.txt', '.webmanifest']);
const SKIPPED_DIRS = new Set(['ocr']);
/** Below this a compressed copy saves less than its headers cost. */
const MIN_BYTES = 1024;
const COPIES = [
  {
    ext: '.br',
    make: (data: Buffer) =>
      brotli(data, {
        params: {
          [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY,
          [zlib.constants.BROTLI_PARAM_SIZE_HINT]: data.length,
        },
      }),
  },
  { ext: '.gz', make: (data: Buffer) => gzip(data, { level: zlib.constants.Z_BEST_COMPRESSION }) },
] as const;

async function mtimeOrNull(file: string): Promise<number | null> {
  try {
    return (await stat(file)).mtimeMs;
  } catch {
    return null;
  }
}

async function* files(dir: string, top: string): AsyncGenerator<string> {
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) {
      if (dir === top && SKIPPED_DIRS.has(entry.name)) continue;
      yield* files(full, top);
    } else if (entry.isFile()) {
      yield full;
    }
  }
}

/** Brings the compressed copies of `webDir` up to date; returns how many were written. */
export async function precompress(webDir: string): Promise<{ written: number; removed: number }> {
  let written = 0;
  let removed = 0;
  for await (const file of files(webDir, webDir)) {
    const copy = COPIES.find((c) => file.endsWith(c.ext));
    if (copy) {
      const source = file.slice(0, -copy.ext.length);
      if ((await mtimeOrNull(source)) === null) {
        await rm(file);
        removed++;
      }
      continue;
    }
    if (!COMPRESSIBLE.has(path.extname(file).toLowerCase())) continue;
    const { size, mtimeMs } = await stat(file);
    if (size < MIN_BYTES) continue;
    let data: Buffer | null = null;
    for (const { ext, make } of COPIES) {
      const target = file + ext;
      const done = await mtimeOrNull(target);
      if (done !== null && done >= mtimeMs) continue;
      data ??= await readFile(file);
      await writeFile(target, await make(data));
      written++;
    }
  }
  return { written, removed };
}

if (require.main === module) {
  const dir = process.argv[2];
  if (!dir) {
    process.stderr.write('usage: tsx scripts/precompress.ts <web build dir>\n');
    process.exit(2);
  }
  precompress(path.resolve(dir)).then(
    ({ written, removed }) => {
      if (written + removed > 0) process.stdout.write(`precompressed: ${written} written, ${removed} stale removed\n`);
    },
    (error: unknown) => {
      process.stderr.write(`${String(error)}\n`);
      process.exit(1);
    },
  );
}

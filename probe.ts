import path from 'node:path';
import sharp from 'sharp';
import { createWorker } from 'tesseract.js';
import { readFileSync } from 'node:fs';
import { linesOfPage, type EngineBlock } from './shared/door-card/ocr-lines';
async function main() {
  const worker = await createWorker('eng', 1, { langPath: path.resolve('node_modules/@tesseract.js-data/eng/4.0.0_best_int'), gzip: true, cacheMethod: 'none' });
  const png = readFileSync('/tmp/w15-card-rotated.png');
  const meta = await sharp(png).metadata();
  const r = await worker.recognize(png, { rotateAuto: true }, { blocks: true });
  const a = r.data.rotateRadians ?? 0;
  const lines = linesOfPage(r.data.blocks as unknown as EngineBlock[]);
  const l = lines.find((x) => x.text.startsWith('31'))!;
  console.log(meta.width, meta.height, a, l.bbox);
  const cx = meta.width! / 2, cy = meta.height! / 2;
  for (const sign of [1, -1]) {
    const th = sign * a;
    const pts = [[l.bbox.x0, l.bbox.y0], [l.bbox.x1, l.bbox.y0], [l.bbox.x0, l.bbox.y1], [l.bbox.x1, l.bbox.y1]].map(([x, y]) => [cx + (x - cx) * Math.cos(th) - (y - cy) * Math.sin(th), cy + (x - cx) * Math.sin(th) + (y - cy) * Math.cos(th)]);
    const x0 = Math.max(0, Math.min(...pts.map((p) => p[0]))), y0 = Math.max(0, Math.min(...pts.map((p) => p[1])));
    const x1 = Math.min(meta.width!, Math.max(...pts.map((p) => p[0]))), y1 = Math.min(meta.height!, Math.max(...pts.map((p) => p[1])));
    await sharp(png).extract({ left: Math.round(x0), top: Math.round(y0), width: Math.round(x1 - x0), height: Math.round(y1 - y0) }).toFile(`/tmp/w15-crop${sign}.png`);
  }
  await worker.terminate();
}
main();

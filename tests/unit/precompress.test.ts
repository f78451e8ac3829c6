/**
 * scripts/precompress.ts: the build's brotli and gzip copies decode to the file, are written only
 * when the file changed, and go when the file goes (a stale copy would be served in its place).
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { after, describe, it } from 'node:test';
import zlib from 'node:zlib';
import { precompress } from '../../scripts/precompress';

describe('precompress', () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ampwright-precompress-'));
  after(() => fs.rmSync(dir, { recursive: true, force: true }));
  const bundle = path.join(dir, '_expo', 'static', 'js', 'web', 'entry-0123456789abcdef0123456789abcdef.js');
  // real code, as a bundle is: the shared computations' sources
  const sharedDir = path.resolve(__dirname, '..', '..', 'shared');
  const text = fs
    .readdirSync(sharedDir)
    .filter((f) => f.endsWith('.ts'))
    .sort()
    .map((f) => fs.readFileSync(path.join(sharedDir, f), 'utf8'))
    .join('\n');

  it('writes brotli and gzip copies that decode to the file, smaller than on-the-fly brotli 4', async () => {
    fs.mkdirSync(path.dirname(bundle), { recursive: true });
    fs.writeFileSync(bundle, text);
    fs.writeFileSync(path.join(dir, 'tiny.js'), 'x');
    fs.mkdirSync(path.join(dir, 'ocr'));
    fs.writeFileSync(path.join(dir, 'ocr', 'worker.min.js'), text);
    assert.deepEqual(await precompress(dir), { written: 2, removed: 0 });
    const br = fs.readFileSync(`${bundle}.br`);
    assert.equal(zlib.brotliDecompressSync(br).toString(), text);
    assert.equal(zlib.gunzipSync(fs.readFileSync(`${bundle}.gz`)).toString(), text);
    const quality4 = zlib.brotliCompressSync(text, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 4 } });
    assert.ok(br.length < quality4.length, `${br.length} B at quality 11 against ${quality4.length} B at 4`);
    assert.ok(!fs.existsSync(path.join(dir, 'tiny.js.br')), 'a file under 1 KB is sent as it is');
    assert.ok(!fs.existsSync(path.join(dir, 'ocr', 'worker.min.js.br')), "the recogniser's files are left to the middleware");
  });

  it('leaves up-to-date copies alone and rewrites them when the file changes', async () => {
    assert.deepEqual(await precompress(dir), { written: 0, removed: 0 });
    const changed = `${text}\nexport const extra = 1;`;
    fs.writeFileSync(bundle, changed);
    const later = new Date(Date.now() + 5000);
    fs.utimesSync(bundle, later, later);
    assert.deepEqual(await precompress(dir), { written: 2, removed: 0 });
    assert.equal(zlib.brotliDecompressSync(fs.readFileSync(`${bundle}.br`)).toString(), changed);
  });

  it('removes the copies of a file that is gone', async () => {
    fs.rmSync(bundle);
    assert.deepEqual(await precompress(dir), { written: 0, removed: 2 });
    assert.ok(!fs.existsSync(`${bundle}.br`) && !fs.existsSync(`${bundle}.gz`));
  });
});

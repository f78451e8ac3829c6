/**
 * The report's pictures and units (issue 13 items 11 and 12): a trip-test reading with a band prints
 * the band's log–log plot with the test point (vector paths, read back as text with `pdftotext`
 * and as pixels with `pdftoppm`), and temperatures print in the reader's unit (°F = °C × 9/5 + 32;
 * a rise × 9/5 only — NIST SP 811 [V]). The demo's band is invented (labelled so), not a maker's curve.
 */
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import sharp from 'sharp';
import type request from 'supertest';
import { DEMO_RECORD } from '../../scripts/demo-data';
import { demoIds, startApp, type TestContext } from './context';

let ctx: TestContext;
let admin: request.Agent;
let tripTestId: string;
let surveyId: string;
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'ampwright-report-plot-'));

before(async () => {
  ctx = await startApp();
  const ids = await demoIds(ctx.ds);
  admin = await ctx.signIn('admin');
  // the demo's own inspections, found by their notes: other API tests add inspections of these kinds
  const demo = async (key: string) =>
    (
      await ctx.ds.query(`SELECT id FROM inspection WHERE building_id = $1 AND notes = $2 AND deleted_at IS NULL LIMIT 1`, [
        ids.clinicId,
        DEMO_RECORD.inspections.find((i) => i.key === key)!.notes,
      ])
    )[0].id as string;
  tripTestId = await demo('trip-test');
  surveyId = await demo('survey');
});
after(async () => {
  await ctx.close();
  fs.rmSync(tmp, { recursive: true, force: true });
});

async function pdfFile(url: string, name: string): Promise<string> {
  const res = await admin
    .get(url)
    .buffer(true)
    .parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
  assert.equal(res.status, 200, String(res.body));
  const file = path.join(tmp, `${name}.pdf`);
  fs.writeFileSync(file, res.body as Buffer);
  return file;
}
const textOf = (file: string) => execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');

describe('the band plot in the report', () => {
  it('prints the trip test on its band: axes, the test point with its verdict in words, the caption', async () => {
    const file = await pdfFile(`/api/inspections/${tripTestId}/report.pdf`, 'trip');
    const text = textOf(file);
    assert.ok(text.includes('Seconds to trip'), 'y axis title');
    assert.ok(text.includes('Current, multiples of rating'), 'x axis title');
    // 60 A on the 20 A autoclave breaker = 300 %, 14 s: inside the invented band's 5–60 s at 3×
    assert.ok(text.includes('PASS: 60 A (300 %), 14 s'), 'the test point and its verdict in the caption');
    assert.ok(text.includes('Time-current band Demo 20 A thermal-magnetic (invented), 20 A'), 'which band');
    assert.ok(text.includes('Instantaneous pickup 10× ±25 %'), 'the instantaneous band named');
  });
  it('draws the band as vector shapes: the shaded band is on the page in pixels', async () => {
    const file = await pdfFile(`/api/inspections/${tripTestId}/report.pdf`, 'trip-pixels');
    execFileSync('pdftoppm', ['-r', '50', '-f', '1', '-l', '1', '-png', file, path.join(tmp, 'page')]);
    const png = fs.readdirSync(tmp).find((f) => f.startsWith('page') && f.endsWith('.png'));
    assert.ok(png, 'page rendered');
    const { data, info } = await sharp(path.join(tmp, png)).raw().toBuffer({ resolveWithObject: true });
    let band = 0;
    // the band's fill #F3E3D8 (copper-soft), give or take anti-aliasing
    for (let i = 0; i < data.length; i += info.channels) {
      if (Math.abs(data[i] - 0xf3) < 6 && Math.abs(data[i + 1] - 0xe3) < 6 && Math.abs(data[i + 2] - 0xd8) < 6) band += 1;
    }
    assert.ok(band > 200, `shaded band pixels: ${band}`);
  });
  it('a thermal survey has no band plot', async () => {
    const text = textOf(await pdfFile(`/api/inspections/${surveyId}/report.pdf`, 'survey'));
    assert.ok(!text.includes('Seconds to trip'));
  });
});

describe('temperatures in the reader’s unit', () => {
  it('°C by default: ambient 23 °C, the lug 58 °C, ΔT 22 °C', async () => {
    const text = textOf(await pdfFile(`/api/inspections/${surveyId}/report.pdf`, 'survey-c'));
    assert.ok(text.includes('23 °C'), 'ambient');
    assert.ok(text.includes('58 °C measured'));
    assert.ok(text.includes('ΔT 22 °C over a similar component'));
  });
  it('°F on request: ambient 73.4 °F, the lug 136.4 °F, and the rise 39.6 °F (× 9/5, no + 32)', async () => {
    const text = textOf(await pdfFile(`/api/inspections/${surveyId}/report.pdf?temperature=F`, 'survey-f'));
    assert.ok(text.includes('73.4 °F'), 'ambient 23 °C');
    assert.ok(text.includes('136.4 °F measured'), '58 °C');
    assert.ok(text.includes('ΔT 39.6 °F over a similar component'), 'rise 22 °C');
    assert.ok(!text.includes('71.6 °F over'), 'not the rise converted as a temperature (22 °C → 71.6 °F)');
    // the verdict does not depend on the unit: 22 °C over a similar component is P1 (MTS Table 100.18)
    assert.ok(text.includes('P1 now'));
  });
  it('another unit is refused, naming the field', async () => {
    const res = await admin.get(`/api/inspections/${surveyId}/report.pdf?temperature=K`);
    assert.equal(res.status, 400);
    assert.ok(res.body.error.fields.temperature);
  });
});

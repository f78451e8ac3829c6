/**
 * Printed documents, read back the way a person would: the circuit directory (NEC 408.4(A) door
 * card) and the inspection report. Words come out with `pdftotext`, pages are counted with
 * `pdfinfo`, images listed with `pdfimages` (Debian poppler-utils, installed by scripts/test.sh
 * ensure_pdf_tools), and the QR code is decoded from the page rasterised by `pdftoppm` with jsQR —
 * a real decode of the printed pixels, not a comparison with a re-encoding.
 */
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import bcrypt from 'bcryptjs';
import jsQR from 'jsqr';
import sharp from 'sharp';
import request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { DEMO_RECORD } from '../../scripts/demo-data';
import { createApp, type App } from '../../server/app';
import { readConfig } from '../../server/config';
import { Photo } from '../../server/entities';
import { sha256Hex } from '../../server/services/photos';
import { SAFETY_CAUTION } from '../../shared/calc';
import { demoIds, makeForeignOrganisation, startApp, type TestContext } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let foreign: Awaited<ReturnType<typeof makeForeignOrganisation>>;
let admin: request.Agent;
let owner: request.Agent;
let stranger: request.Agent;
let surveyId: string;
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'ampwright-documents-'));
const madePhotos: string[] = [];

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  foreign = await makeForeignOrganisation(ctx.ds);
  [admin, owner] = await Promise.all([ctx.signIn('admin'), ctx.signIn('owner')]);
  const email = `printer-${Date.now()}@elsewhere.test`;
  const userId = uuidv7();
  await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Ida Elsewhere', $3)`, [
    userId,
    email,
    await bcrypt.hash('elsewhere-password', 4),
  ]);
  await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'admin')`, [
    uuidv7(),
    userId,
    foreign.organisationId,
  ]);
  stranger = request.agent(ctx.app);
  await stranger.post('/api/auth/sign-in').send({ email, password: 'elsewhere-password' }).expect(200);
  const [survey] = await ctx.ds.query(
    // the demo's latest survey (a year-old one holds the same lug's earlier reading)
    `SELECT id FROM inspection WHERE building_id = $1 AND kind = 'thermal-survey' AND deleted_at IS NULL ORDER BY performed_on DESC LIMIT 1`,
    [ids.clinicId],
  );
  surveyId = survey.id;
});
after(async () => {
  if (madePhotos.length) await ctx.ds.query(`DELETE FROM photo WHERE id = ANY($1::uuid[])`, [madePhotos]);
  await ctx.close();
  fs.rmSync(tmp, { recursive: true, force: true });
});

// ---------- helpers ----------

/** GET a PDF as bytes (supertest leaves binary bodies empty otherwise). */
function getPdf(agent: request.Agent | ReturnType<typeof request>, url: string) {
  return (agent as request.Agent)
    .get(url)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
}

let files = 0;
function save(pdf: Buffer): string {
  files += 1;
  const file = path.join(tmp, `doc-${files}.pdf`);
  fs.writeFileSync(file, pdf);
  return file;
}
const pdfText = (file: string, layout = false) =>
  execFileSync('pdftotext', [...(layout ? ['-layout'] : []), file, '-'], { encoding: 'utf8' });
const pageCount = (file: string) => Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))?.[1]);
const imageCount = (file: string) =>
  execFileSync('pdfimages', ['-list', file], { encoding: 'utf8' }).trim().split('\n').length - 2;

/** Rasterise page 1 at 150 dpi and decode the QR code on it. */
async function decodeQr(file: string): Promise<string | null> {
  const stem = path.join(tmp, `page-${files}`);
  execFileSync('pdftoppm', ['-r', '150', '-png', '-f', '1', '-l', '1', '-singlefile', file, stem]);
  const { data, info } = await sharp(`${stem}.png`).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  return jsQR(new Uint8ClampedArray(data.buffer, data.byteOffset, data.length), info.width, info.height)?.data ?? null;
}

/** A valid PDF answer: the type, the magic bytes, and poppler reads it. */
function assertPdf(res: request.Response): string {
  assert.equal(res.status, 200, String(res.body));
  assert.match(res.headers['content-type'], /^application\/pdf/);
  const pdf = res.body as Buffer;
  assert.equal(pdf.subarray(0, 5).toString('latin1'), '%PDF-');
  const file = save(pdf);
  assert.ok(pageCount(file) >= 1, 'pdfinfo parses it');
  return file;
}

/** One-line runs of words as pdftotext gives them, with whitespace collapsed. */
const squash = (text: string) => text.replace(/\s+/g, ' ');

// ---------- the circuit directory ----------

describe('GET /api/panels/:id/directory.pdf (NEC 408.4(A) directory)', () => {
  it('prints clinic panel LA on one page, Letter and A4, with every position and description', async () => {
    const circuits: { position: number; poles: number; description: string; status: string; rating_a: number | null }[] =
      await ctx.ds.query(
        `SELECT position, poles, description, status, rating_a FROM circuit WHERE panel_id = $1 AND deleted_at IS NULL`,
        [ids.clinicLAId],
      );
    const [panel] = await ctx.ds.query(`SELECT tag, spaces, location FROM panel WHERE id = $1`, [ids.clinicLAId]);
    assert.equal(panel.spaces, 42, 'the demo clinic panel LA is a 42-space panel');
    for (const paper of ['letter', 'a4'] as const) {
      const file = assertPdf(await getPdf(admin, `/api/panels/${ids.clinicLAId}/directory.pdf?paper=${paper}`));
      assert.equal(pageCount(file), 1, `${paper}: one page`);
      const [w, h] = /Page size:\s+([\d.]+) x ([\d.]+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))!.slice(1).map(Number);
      if (paper === 'letter') assert.deepEqual([Math.round(w), Math.round(h)], [612, 792]);
      else assert.deepEqual([Math.round(w), Math.round(h)], [595, 842]);
      const text = squash(pdfText(file));
      assert.ok(text.includes(`Panel ${panel.tag}`), 'the tag');
      if (panel.location) assert.ok(text.includes(panel.location), 'the location');
      assert.ok(text.includes('208Y/120 V 3-phase 4W'), 'the system label (SYSTEM_INFO, φ spelt out: the fonts lack it)');
      // issue 13 items 7 and 13: the label's fault current at the door, and what is rated below it
      assert.ok(text.includes('14 kA (label, 2025-03-01)'), 'the available fault current and its source');
      assert.ok(text.includes('Rated below the available fault current (NEC 110.9): position 33.'), 'the breaker flagged');
      assert.match(text, /Verified at the panel: \d+ of \d+ breakers\./);
      const layout = pdfText(file, true);
      for (let p = 1; p <= 42; p += 1) assert.match(layout, new RegExp(`(^|\\s)${p}\\s+[ABC]\\s`, 'm'), `position ${p} with its phase`);
      for (const c of circuits.filter((x) => x.status === 'in-use' && x.description)) {
        // long purposes are shortened with an ellipsis to keep one line: the first words must show
        const start = c.description.slice(0, 18);
        assert.ok(text.includes(start), `description of ${c.position}: ${c.description}`);
        if (c.rating_a) assert.ok(text.includes(`${c.poles}P ${c.rating_a}A`), `breaker of ${c.position}`);
      }
      assert.ok(text.includes('SPARE') || text.includes('SPACE'), 'spares and spaces in words');
      assert.ok(text.includes('Schedule last changed'), 'the date and who changed it');
      assert.ok(text.includes('NEC 408.4(A)'));
    }
  });

  it('marks spares and spaces in words, one row per unused position', async () => {
    const res = await getPdf(admin, `/api/panels/${ids.clinicLAId}/directory.pdf`);
    const layout = pdfText(assertPdf(res), true);
    const used = new Set<number>();
    const circuits: { position: number; poles: number; status: string }[] = await ctx.ds.query(
      `SELECT position, poles, status FROM circuit WHERE panel_id = $1 AND deleted_at IS NULL`,
      [ids.clinicLAId],
    );
    for (const c of circuits) for (let i = 0; i < c.poles; i += 1) used.add(c.position + 2 * i);
    const empty = 42 - used.size;
    const spaces = (layout.match(/SPACE/g) ?? []).length;
    const spares = (layout.match(/SPARE —/g) ?? []).length;
    assert.equal(spares, circuits.filter((c) => c.status === 'spare').length, 'each spare in words');
    assert.equal(spaces, empty + circuits.filter((c) => c.status === 'space').length + 1 /* the key in the footer */, 'each space in words');
  });

  it('carries a QR code that decodes to the panel\u2019s live directory (origin of the request)', async () => {
    const file = assertPdf(await getPdf(admin, `/api/panels/${ids.clinicLAId}/directory.pdf?paper=a4`));
    const url = await decodeQr(file);
    assert.ok(url, 'a QR code is found on the rasterised page');
    assert.match(url, new RegExp(`^http://127\\.0\\.0\\.1:\\d+/panels/${ids.clinicLAId}$`));
  });

  it('uses PUBLIC_URL for the QR code when it is set', async () => {
    const config = { ...readConfig(), PUBLIC_URL: 'https://ampwright.example.net' };
    const app: App = createApp({ dataSource: ctx.ds, config });
    try {
      const agent = request.agent(app);
      await agent.post('/api/auth/sign-in').send({ email: 'admin@ampwright.test', password: 'ampwright-demo' }).expect(200);
      const file = assertPdf(await getPdf(agent, `/api/panels/${ids.clinicLAId}/directory.pdf`));
      assert.equal(await decodeQr(file), `https://ampwright.example.net/panels/${ids.clinicLAId}`);
    } finally {
      await app.closeResources();
    }
  });

  it('refuses a bad paper size, answers 401 signed out and 404 where the building is not theirs', async () => {
    const bad = await admin.get(`/api/panels/${ids.clinicLAId}/directory.pdf?paper=legal`);
    assert.equal(bad.status, 400);
    assert.ok(bad.body.error.fields.paper);
    assert.equal((await request(ctx.app).get(`/api/panels/${ids.clinicLAId}/directory.pdf`)).status, 401);
    assert.equal((await admin.get(`/api/panels/${foreign.panelId}/directory.pdf`)).status, 404, 'another organisation\u2019s panel');
    assert.equal((await stranger.get(`/api/panels/${ids.clinicLAId}/directory.pdf`)).status, 404, 'a user of another organisation');
    assert.equal((await admin.get(`/api/panels/${uuidv7()}/directory.pdf`)).status, 404);
    assert.equal((await admin.get(`/api/panels/not-an-id/directory.pdf`)).status, 404);
    assertPdf(await getPdf(owner, `/api/panels/${ids.clinicLAId}/directory.pdf`));
    assert.equal((await owner.get(`/api/panels/${ids.loftsPanelId}/directory.pdf`)).status, 404, 'owner, building not granted');
  });
});

// ---------- the inspection report ----------

describe('GET /api/inspections/:id/report.pdf', () => {
  it('reports the signed thermal survey: verdict and basis, deficiencies, load, sign-off, caution', async () => {
    const file = assertPdf(await getPdf(admin, `/api/inspections/${surveyId}/report.pdf`));
    const text = squash(pdfText(file));
    const survey = DEMO_RECORD.inspections.find((i) => i.key === 'survey')!;
    assert.ok(text.includes('Thermal survey'));
    assert.ok(text.includes(`${survey.ambientC} °C`), 'ambient');
    assert.ok(text.includes(`${survey.loadPct} % of normal`), 'load');
    // the hot lug: ΔT 22 °C over a similar component, corrected to the reference load → P1
    // (ANSI/NETA MTS Table 100.18 via shared/assess.ts)
    assert.ok(text.includes('P1 now'), 'the verdict in words');
    assert.ok(text.includes('ANSI/NETA MTS Table 100.18'), 'the basis');
    for (const d of DEMO_RECORD.deficiencies.filter((x) => x.inspectionKey === 'survey')) {
      assert.ok(text.includes(d.title), `deficiency ${d.title}`);
    }
    assert.ok(text.includes('Scheduled'), 'status in words');
    assert.ok(text.includes('Signed off by Marisol Fenwright'), 'sign-off name');
    assert.ok(!text.includes('NOT SIGNED'));
    assert.ok(text.includes('Panel load'));
    assert.ok(text.includes('210.20(A)') && text.includes('215.3'), 'the load basis');
    // each load figure named for what it is, with its rule (issue 13 item 6): the sizing figure
    // adds 125 % of continuous loads, so it is not called "demand"
    assert.match(text, /Connected load \d/);
    assert.match(text, /Sizing load \d/);
    assert.ok(text.includes('125 % of continuous + non-continuous'), 'the sizing rule');
    assert.doesNotMatch(text, /· demand \d|phase demand/);
    assert.ok(text.includes(squash(SAFETY_CAUTION)), 'the safety caution, whole');
    // issue 13 items 7, 9, 11, 13: the demo's LA records a 14 kA label and a 10 kA breaker at 33
    // (NEC 110.9), clamp readings (neutral by phasor sum), and the hot lug's own temperature
    // against its 75 °C terminations (110.14(C))
    assert.ok(text.includes('Available fault current 14 kA (label, 2025-03-01): 1 rated below it (NEC 110.9, 110.10).'), 'the fault check');
    assert.ok(text.includes('Position 33 (20 A) interrupts 10 kA; 14 kA is available (NEC 110.9).'), 'the breaker flagged');
    assert.match(text, /Verified at the panel: \d+ of \d+ breakers\./);
    assert.ok(text.includes('Measured 2026-11-18: A 41.2 A · B 38 A · C 29.5 A · N 12.4 A · neutral from the phases 10.5 A'), 'clamp readings and neutral');
    assert.ok(text.includes('non-linear loads'), 'the neutral caution');
    assert.ok(text.includes('Component temperature:'), 'the component against its rating');
  });

  it('keeps the sign-off with the last section: its page also carries the last panel\u2019s load', async () => {
    const [torque] = await ctx.ds.query(`SELECT id FROM inspection WHERE building_id = $1 AND kind = 'torque-audit'`, [ids.clinicId]);
    for (const id of [surveyId, torque.id as string]) {
      const pages = pdfText(assertPdf(await getPdf(admin, `/api/inspections/${id}/report.pdf`))).split('\f');
      const signOff = pages.find((p) => /^Sign-off$/m.test(p));
      assert.ok(signOff, 'a sign-off heading');
      // what else is on that page, less the heading, the sign-off's own lines and the page footer
      const rest = signOff
        .split('\n')
        .map((l) => l.trim())
        .filter((l) => l && l !== 'Sign-off' && !/page \d+ of \d+$/.test(l))
        .filter((l) => !/^(Marisol Fenwright|signed this inspection|NOT SIGNED|The inspector has not signed|inspection: its readings|UTC; its readings)/.test(l));
      assert.ok(rest.some((l) => /^Panel \S+ — /.test(l)), `the sign-off page has the last panel's load too:\n${signOff}`);
    }
  });

  it('says NOT SIGNED for an open inspection', async () => {
    const [torque] = await ctx.ds.query(`SELECT id FROM inspection WHERE building_id = $1 AND kind = 'torque-audit'`, [ids.clinicId]);
    const text = squash(pdfText(assertPdf(await getPdf(admin, `/api/inspections/${torque.id}/report.pdf`))));
    assert.ok(text.includes('NOT SIGNED'));
    assert.ok(text.includes('UL 486A-486B'), 'torque basis from the fallback table');
  });

  it('prints deficiency photos as thumbnails and names those it cannot show', async () => {
    const [hot] = await ctx.ds.query(`SELECT id FROM deficiency WHERE inspection_id = $1 AND priority = 1`, [surveyId]);
    const jpeg = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 200, g: 90, b: 40 } } })
      .jpeg()
      .toBuffer();
    const photoRow = async (bytes: Buffer, contentType: 'image/jpeg' | 'image/heic', caption: string) => {
      const id = uuidv7();
      madePhotos.push(id);
      await ctx.ds.getRepository(Photo).insert({
        id, buildingId: ids.clinicId, parentKind: 'deficiency', parentId: hot.id, purpose: 'finding',
        sha256: sha256Hex(bytes), bytes: bytes.length, contentType, width: null, height: null,
        takenAt: new Date('2026-11-12T10:00:00Z'), caption, uploaded: false,
        updatedAt: '2026-11-12T10:00:00.000Z-0000-test', updatedBy: null, deletedAt: null, version: '1', fieldMeta: {},
      });
      return id;
    };
    const shown = await photoRow(jpeg, 'image/jpeg', 'lug close-up');
    await photoRow(Buffer.from('pending'), 'image/jpeg', 'second angle');
    const inspector = await ctx.signIn('inspector');
    await inspector
      .put(`/api/photos/${shown}`)
      .set('x-content-sha256', sha256Hex(jpeg))
      .attach('photo', jpeg, { filename: 'lug.jpg', contentType: 'image/jpeg' })
      .expect(200);
    const file = assertPdf(await getPdf(admin, `/api/inspections/${surveyId}/report.pdf`));
    assert.equal(imageCount(file), 1, 'the uploaded photo as a thumbnail');
    const text = squash(pdfText(file));
    assert.ok(text.includes('second angle'), 'the photo not shown is named');
    assert.ok(text.includes('not uploaded yet'));
  });

  it('is for those who may see the building: owner granted 200, not granted or elsewhere 404', async () => {
    assertPdf(await getPdf(owner, `/api/inspections/${surveyId}/report.pdf`));
    assert.equal((await stranger.get(`/api/inspections/${surveyId}/report.pdf`)).status, 404);
    assert.equal((await admin.get(`/api/inspections/${uuidv7()}/report.pdf`)).status, 404);
    const [ownerUser] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'owner@ampwright.test'`);
    const grants = await ctx.ds.query(`DELETE FROM owner_grant WHERE user_id = $1 AND building_id = $2 RETURNING id`, [
      ownerUser.id,
      ids.clinicId,
    ]);
    try {
      assert.equal((await owner.get(`/api/inspections/${surveyId}/report.pdf`)).status, 404, 'owner once the grant is gone');
      assert.equal((await owner.get(`/api/panels/${ids.clinicLAId}/directory.pdf`)).status, 404);
    } finally {
      for (const g of grants[0] ?? []) {
        await ctx.ds.query(`INSERT INTO owner_grant (id, user_id, building_id) VALUES ($1, $2, $3)`, [g.id, ownerUser.id, ids.clinicId]);
      }
    }
  });
});

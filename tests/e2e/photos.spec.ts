/**
 * Photos on the device (SYNC.md, "Photos"): a photo picked offline is resized, kept in IndexedDB,
 * shown "on this device" across an offline reload, uploaded with progress when the signal
 * returns, and then shown from the server (also offline, from the browser's cache). A refusal
 * stops the retries and says why. The photo strip is hosted by the deficiency screen.
 */
import { expect, request as playwrightRequest, test, type Browser, type Page } from '@playwright/test';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { uuidv7 } from 'uuidv7';
import { query } from './db';
import { ARTIFACTS, DEMO_PASSWORD, expectStatus, signIn, waitOfflineReady } from './helpers';

const BASE_URL = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:8090';
const dir = mkdtempSync(join(tmpdir(), 'ampwright-photos-'));

/** A 3000 × 2000 camera-like JPEG (noise, so it does not compress to nothing). */
async function bigJpeg(name: string): Promise<string> {
  const file = join(dir, name);
  const bytes = await sharp({ create: { width: 3000, height: 2000, channels: 3, background: '#806040', noise: { type: 'gaussian', mean: 120, sigma: 40 } } })
    .jpeg({ quality: 92 })
    .toBuffer();
  writeFileSync(file, bytes);
  return file;
}

/** A deficiency to hang photos on, raised through the sync API as the inspector (not through the database). */
async function raiseDeficiency(title: string): Promise<string> {
  const [building] = await query<{ id: string }>(`SELECT id FROM building WHERE name = 'Brackenfold Family Clinic' AND deleted_at IS NULL`);
  const api = await playwrightRequest.newContext({ baseURL: BASE_URL });
  const signedIn = await api.post('/api/auth/sign-in', { data: { email: 'inspector@ampwright.test', password: DEMO_PASSWORD } });
  expect(signedIn.ok()).toBe(true);
  const id = uuidv7();
  const pushed = await api.post('/api/sync/push', {
    data: {
      deviceId: 'e2e-photos',
      schemaVersion: 1,
      mutations: [
        {
          id: uuidv7(),
          hlc: `${new Date().toISOString()}-0000-e2e-photos`,
          name: 'deficiency.create',
          buildingId: building.id,
          entityId: id,
          baseVersion: 0,
          fields: { title, priority: 3, description: 'Cover screw missing, photos to follow' },
        },
      ],
    },
  });
  const body = await pushed.json();
  expect(body.results?.[0]?.status, JSON.stringify(body)).toBe('applied');
  await api.dispose();
  return id;
}

async function device(browser: Browser, role: 'inspector' | 'admin', width = 390, height = 844) {
  const context = await browser.newContext({ viewport: { width, height } });
  const page = await context.newPage();
  await signIn(page, role);
  return { context, page };
}

/** Pick files through the strip's "Add photo" (expo-image-picker's file input on the web). */
async function pickPhotos(page: Page, files: string[]) {
  const strip = page.getByTestId('photo-strip').first();
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), strip.getByTestId('add-photo').click()]);
  await chooser.setFiles(files);
}

/** Photo records kept in this browser's IndexedDB store. */
function keptOnDevice(page: Page): Promise<number> {
  return page.evaluate(
    () =>
      new Promise<number>((resolve, reject) => {
        const open = indexedDB.open('ampwright-photos');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          if (!db.objectStoreNames.contains('blobs')) return resolve(0);
          const count = db.transaction('blobs').objectStore('blobs').count();
          count.onsuccess = () => resolve(count.result);
          count.onerror = () => reject(count.error);
        };
      }),
  );
}

/** The background image RN Web's <Image> draws inside a thumbnail. */
function thumbSource(page: Page, index = 0): Promise<string> {
  return page
    .getByTestId('photo-thumb')
    .nth(index)
    .evaluate((el) => {
      for (const node of Array.from(el.querySelectorAll<HTMLElement>('*'))) {
        const bg = getComputedStyle(node).backgroundImage;
        if (bg && bg !== 'none') return bg;
      }
      return '';
    });
}

test('a photo picked offline is kept on the device through a reload, uploads when the signal returns, and still shows offline', async ({ browser }) => {
  test.setTimeout(360_000);
  const run = Date.now() % 100000;
  const deficiencyId = await raiseDeficiency(`Photo test ${run}`);
  const jpeg = await bigJpeg(`panel-${run}.jpg`);

  const { context, page } = await device(browser, 'inspector');
  await page.goto(`/deficiencies/${deficiencyId}`);
  const strip = page.getByTestId('photo-strip').first();
  await expect(strip).toBeVisible();
  await expect(strip.getByTestId('photo-empty')).toBeVisible();
  await waitOfflineReady(page);

  await context.setOffline(true);
  await expectStatus(page, 'offline');
  await pickPhotos(page, [jpeg]);
  const thumb = strip.getByTestId('photo-thumb');
  await expect(thumb).toHaveCount(1);
  await expect(thumb.getByTestId('photo-status')).toContainText('on this device');
  await expect(thumb).toContainText('waiting for signal');
  expect(await thumbSource(page)).toContain('blob:');
  expect(await keptOnDevice(page)).toBe(1);
  await page.screenshot({ path: `${ARTIFACTS}/photo-offline-phone.png` });

  // offline reload: the bytes come back from IndexedDB, the row from the persisted replica
  await page.reload();
  await expect(strip.getByTestId('photo-thumb')).toHaveCount(1);
  await expect(strip.getByTestId('photo-status')).toContainText('on this device');
  expect(await thumbSource(page)).toContain('blob:');

  // full size from the device
  await strip.getByTestId('photo-thumb').getByTestId('photo-open').click();
  await expect(page.getByTestId('photo-viewer')).toBeVisible();
  await expect(page.getByTestId('photo-viewer')).toContainText('2000 × 1333 px');
  await page.getByTestId('photo-close').click();

  // the Sync tab warns about it
  await page.getByTestId('sync-status').filter({ visible: true }).first().click();
  await expect(page.getByTestId('photos-waiting-count')).toContainText('1 photo waiting on this device');
  await expect(page.getByTestId('photos-waiting')).toContainText('Finding photo · Brackenfold Family Clinic');
  await page.screenshot({ path: `${ARTIFACTS}/photo-sync-tab-phone.png`, fullPage: true });
  await page.goBack();
  await expect(strip.getByTestId('photo-thumb')).toHaveCount(1);

  // the signal returns; hold the upload a moment so its progress can be seen
  let release: () => void = () => undefined;
  const held = new Promise<void>((resolve) => (release = resolve));
  await page.route('**/api/photos/*', async (route) => {
    if (route.request().method() === 'PUT') await held;
    await route.continue();
  });
  await context.setOffline(false);
  await expect(strip.getByTestId('photo-progress')).toBeVisible({ timeout: 30_000 });
  await expect(strip.getByTestId('photo-status')).toContainText('uploading');
  await page.screenshot({ path: `${ARTIFACTS}/photo-uploading-phone.png` });
  release();
  await expect(strip.getByTestId('photo-status')).toContainText('synced', { timeout: 60_000 });
  await page.unroute('**/api/photos/*');

  const [row] = await query<{ id: string; uploaded: boolean; width: number; height: number; content_type: string; bytes: string }>(
    `SELECT id, uploaded, width, height, content_type, bytes FROM photo WHERE parent_id = $1`,
    [deficiencyId],
  );
  expect(row).toMatchObject({ uploaded: true, width: 2000, height: 1333, content_type: 'image/jpeg' });
  expect(Number(row.bytes)).toBeLessThan(3 * 1024 * 1024);

  // the pulled row says uploaded and the server's thumbnail is kept: the bytes leave the device
  await expect.poll(() => keptOnDevice(page), { timeout: 30_000 }).toBe(0);
  await expect.poll(() => thumbSource(page), { timeout: 60_000 }).toContain(`/api/photos/${row.id}/thumb`);

  // and the thumbnail still shows offline after a reload (the browser's cache)
  await context.setOffline(true);
  await page.reload();
  await expect(strip.getByTestId('photo-thumb')).toHaveCount(1);
  await expect(strip.getByTestId('photo-status')).toContainText('synced');
  await expect(strip.getByTestId('photo-thumb')).not.toContainText('needs the signal');
  expect(await thumbSource(page)).toContain(`/api/photos/${row.id}/thumb`);
  await page.screenshot({ path: `${ARTIFACTS}/photo-synced-offline-phone.png` });
  await context.close();

  // another device sees it from the server, and opens the full size
  const other = await device(browser, 'admin', 1280, 800);
  await other.page.goto(`/deficiencies/${deficiencyId}`);
  const otherThumb = other.page.getByTestId('photo-strip').first().getByTestId('photo-thumb');
  await expect(otherThumb).toHaveCount(1);
  await expect(otherThumb.getByTestId('photo-status')).toContainText('synced');
  await expect.poll(() => thumbSource(other.page), { timeout: 60_000 }).toContain(`/api/photos/${row.id}/thumb`);
  await otherThumb.getByTestId('photo-open').click();
  await expect(other.page.getByTestId('photo-full')).toBeVisible();
  await other.page.screenshot({ path: `${ARTIFACTS}/photo-viewer-wide.png` });
  await other.context.close();
});

test('several photos picked at once are each kept and sent; a refused upload stops, says why, and survives a reload', async ({ browser }) => {
  test.setTimeout(300_000);
  const run = Date.now() % 100000;
  const deficiencyId = await raiseDeficiency(`Photo refusal ${run}`);
  const [a, b] = await Promise.all([bigJpeg(`a-${run}.jpg`), bigJpeg(`b-${run}.jpg`)]);
  const { context, page } = await device(browser, 'inspector');
  await page.goto(`/deficiencies/${deficiencyId}`);
  const strip = page.getByTestId('photo-strip').first();
  await expect(strip.getByTestId('photo-empty')).toBeVisible();

  // the server refuses every upload in this test as too large
  let puts = 0;
  await page.route('**/api/photos/*', async (route) => {
    if (route.request().method() !== 'PUT') return route.continue();
    puts++;
    await route.fulfill({
      status: 413,
      contentType: 'application/json',
      body: JSON.stringify({ error: { code: 'too_large', message: 'A photo may be at most 12 MB' } }),
    });
  });
  await pickPhotos(page, [a, b]);
  await expect(strip.getByTestId('photo-thumb')).toHaveCount(2);
  await expect(strip.getByTestId('photo-status').nth(0)).toContainText('refused: A photo may be at most 12 MB', { timeout: 30_000 });
  await expect(strip.getByTestId('photo-status').nth(1)).toContainText('refused: A photo may be at most 12 MB', { timeout: 30_000 });
  await page.screenshot({ path: `${ARTIFACTS}/photo-refused-phone.png` });
  expect(puts).toBe(2);

  // a refusal is kept: no new attempts, not even after a reload
  await page.reload();
  await expect(strip.getByTestId('photo-status').nth(0)).toContainText('refused');
  await page.waitForTimeout(3000);
  expect(puts).toBe(2);
  const rows = await query<{ uploaded: boolean }>(`SELECT uploaded FROM photo WHERE parent_id = $1`, [deficiencyId]);
  expect(rows).toEqual([{ uploaded: false }, { uploaded: false }]);

  // removing one asks first, then it is gone from the device and the server
  page.once('dialog', (dialog) => void dialog.accept());
  await strip.getByTestId('photo-thumb').first().getByTestId('photo-open').click();
  await page.getByTestId('photo-remove').click();
  await expect(strip.getByTestId('photo-thumb')).toHaveCount(1);
  await expect.poll(() => keptOnDevice(page)).toBe(1);
  await expect
    .poll(async () => (await query(`SELECT 1 FROM photo WHERE parent_id = $1 AND deleted_at IS NULL`, [deficiencyId])).length, { timeout: 30_000 })
    .toBe(1);
  await context.close();
});

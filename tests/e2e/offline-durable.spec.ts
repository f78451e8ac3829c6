/**
 * The device's copy is never lost by the app (issue: offline that survives the field). Phones
 * reload a page on their own when memory is short, so these reload far more often than a person
 * would, with no signal, with an API that answers 503, and with a stored copy that was damaged.
 */
import { expect, test, type Page, type Route } from '@playwright/test';
import { query } from './db';
import { editDescription, expectStatus, openPanel, signIn, waitOfflineReady } from './helpers';

const RELOADS = 20;

/** The circuits' descriptions the server holds for a panel, by position. */
async function serverDescriptions(panelTag: string, positions: number[]) {
  const rows = await query<{ position: number; description: string }>(
    `SELECT c.position, c.description FROM circuit c JOIN panel p ON p.id = c.panel_id
      WHERE p.tag = $1 AND c.position = ANY($2) AND c.deleted_at IS NULL ORDER BY c.position`,
    [panelTag, positions],
  );
  return Object.fromEntries(rows.map((r) => [r.position, r.description]));
}

async function deviceMutations(page: Page) {
  const device = await page.evaluate(() => document.documentElement.dataset.deviceId);
  const rows = await query<{ n: string }>(`SELECT count(*) AS n FROM processed_mutation WHERE device_id = $1`, [device]);
  return Number(rows[0].n);
}

/** How many building entries of the device's copy are stored (and parse as JSON). */
async function storedBuildingEntries(page: Page) {
  return page.evaluate(async () => {
    const db: IDBDatabase = await new Promise((resolve, reject) => {
      const req = indexedDB.open('ampwright');
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error);
    });
    const values: unknown[] = await new Promise((resolve) => {
      const req = db.transaction('kv').objectStore('kv').getAll(IDBKeyRange.bound('ampwright:', 'ampwright:\uffff'));
      req.onsuccess = () => resolve(req.result);
    });
    db.close();
    return values.filter((v) => {
      try {
        return typeof v === 'string' && typeof JSON.parse(v).building?.id === 'string';
      } catch {
        return false;
      }
    }).length;
  });
}

test(`offline edits and the schedule survive ${RELOADS} offline reloads, then arrive once`, async ({ browser }) => {
  test.setTimeout(600_000);
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await signIn(page, 'electrician');
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  await waitOfflineReady(page);

  await context.setOffline(true);
  await expectStatus(page, 'offline');
  const run = Date.now() % 100000;
  await editDescription(page, 3, `LA 3 durable ${run}`);
  await editDescription(page, 5, `LA 5 durable ${run}`);
  await expectStatus(page, 'on this device (2)');

  for (let i = 1; i <= RELOADS; i++) {
    await page.reload();
    // the schedule itself, not "could not load": the copy is still on the device
    await expect(page.getByTestId('position-1'), `schedule after offline reload ${i}`).toBeVisible();
    await expect(page.getByTestId('position-3'), `edit after offline reload ${i}`).toContainText(`LA 3 durable ${run}`);
    await expect(page.getByTestId('position-5')).toContainText(`LA 5 durable ${run}`);
    await expectStatus(page, 'on this device (2)');
  }

  await context.setOffline(false);
  await expectStatus(page, 'synced', 60_000);
  expect(await serverDescriptions('LA', [3, 5])).toEqual({ 3: `LA 3 durable ${run}`, 5: `LA 5 durable ${run}` });
  expect(await deviceMutations(page)).toBe(2);
  await context.close();
});

test('a damaged stored copy is said so, re-pulled, and the queued change kept', async ({ browser }) => {
  test.setTimeout(300_000);
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await signIn(page, 'electrician');
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  await waitOfflineReady(page);
  const panelUrl = page.url();

  await context.setOffline(true);
  await expectStatus(page, 'offline');
  const run = Date.now() % 100000;
  await editDescription(page, 7, `LA 7 kept ${run}`);
  await expectStatus(page, 'on this device (1)');

  // damage every stored building copy: half-written JSON in one, a wrong shape in the next
  const damaged = await page.evaluate(async () => {
    const db: IDBDatabase = await new Promise((resolve, reject) => {
      const req = indexedDB.open('ampwright');
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error);
    });
    const keys: string[] = await new Promise((resolve) => {
      const req = db.transaction('kv').objectStore('kv').getAllKeys();
      req.onsuccess = () => resolve(req.result as string[]);
    });
    const copies = keys.filter((k) => k.includes(':building:'));
    await new Promise<void>((resolve) => {
      const tx = db.transaction('kv', 'readwrite');
      copies.forEach((k, i) => tx.objectStore('kv').put(i % 2 === 0 ? '{"building": {"id": 4' : '{"building": 42, "panels": []}', k));
      tx.oncomplete = () => resolve();
    });
    db.close();
    return copies.length;
  });
  expect(damaged).toBeGreaterThan(0);

  await page.reload();
  // offline: the app opens, says what happened, and the queued change is still counted
  await expect(page.getByTestId('storage-problem').filter({ visible: true }).first()).toContainText('could not be read');
  await expectStatus(page, 'on this device (1)');

  await context.setOffline(false);
  await expectStatus(page, 'synced', 60_000);
  // the pull brought the buildings back: the notice goes, the copy is written again, and the
  // schedule opens again from it
  await expect(page.getByTestId('storage-problem').filter({ visible: true })).toHaveCount(0, { timeout: 60_000 });
  await expect.poll(() => storedBuildingEntries(page), { timeout: 30_000 }).toBeGreaterThan(0);
  await page.goto(panelUrl);
  await expect(page.getByTestId('position-7')).toContainText(`LA 7 kept ${run}`, { timeout: 30_000 });
  expect(await serverDescriptions('LA', [7])).toEqual({ 7: `LA 7 kept ${run}` });
  await context.close();
});

test('an API answering 503 keeps the copy and the queued change through reloads', async ({ browser }) => {
  test.setTimeout(300_000);
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await signIn(page, 'electrician');
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  await waitOfflineReady(page);

  // online, but every API call except the health probe answers 503
  const unavailable = (route: Route) =>
    route.fulfill({ status: 503, headers: { 'Retry-After': '5' }, contentType: 'application/json', body: '{"error":{"code":"unavailable","message":"down"}}' });
  await context.route(/\/api\/(?!health)/, unavailable);
  const run = Date.now() % 100000;
  await editDescription(page, 9, `LA 9 during 503 ${run}`);
  for (let i = 1; i <= 3; i++) {
    await page.reload();
    await expect(page.getByTestId('position-1'), `schedule after reload ${i} with a failing API`).toBeVisible();
    await expect(page.getByTestId('position-9')).toContainText(`LA 9 during 503 ${run}`);
  }
  await context.unroute(/\/api\/(?!health)/, unavailable);
  await expectStatus(page, 'synced', 90_000);
  expect(await serverDescriptions('LA', [9])).toEqual({ 9: `LA 9 during 503 ${run}` });
  await context.close();
});

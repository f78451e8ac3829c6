/**
 * The offline promises of SYNC.md, each as a browser test: nothing typed is lost on reload, on a
 * dropped reply, to another device's edit, to a wrong clock or to an unreachable API.
 */
import { expect, test, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { query } from './db';
import { editDescription, expectQueueEmpty, expectStatus, openCircuitForm, openPanel, signIn, waitOfflineReady } from './helpers';

async function device(browser: Browser, role: 'electrician' | 'admin' = 'electrician') {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await signIn(page, role);
  return { context, page };
}

async function circuitText(panelTag: string, position: number) {
  const [row] = await query<{ id: string; description: string; notes: string }>(
    `SELECT c.id, c.description, c.notes FROM circuit c JOIN panel p ON p.id = c.panel_id
      WHERE p.tag = $1 AND c.position = $2 AND c.deleted_at IS NULL`,
    [panelTag, position],
  );
  return row;
}

test('twenty edits offline across two panels survive two offline reloads and arrive once, in order', async ({ browser }) => {
  test.setTimeout(360_000);
  const { context, page } = await device(browser);
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  await waitOfflineReady(page);
  const laUrl = page.url();

  await context.setOffline(true);
  await expectStatus(page, 'offline');
  const run = Date.now() % 100000;
  const laPositions = [1, 2, 3, 4, 5, 6, 7, 8, 9, 11];
  for (const position of laPositions) {
    await editDescription(page, position, `LA ${position} offline ${run}`);
  }
  // position 1 twice: the later edit must be the one that stands
  await editDescription(page, 1, `LA 1 second edit ${run}`);
  await expectStatus(page, 'on this device (11)');
  await page.reload();
  await expect(page.getByTestId('position-5')).toContainText(`LA 5 offline ${run}`);
  await page.goBack();
  await page.getByTestId('panel-LB').click();
  for (let position = 1; position <= 9; position++) {
    await editDescription(page, position, `LB ${position} offline ${run}`);
  }
  await page.reload();
  await expect(page.getByTestId('position-9')).toContainText(`LB 9 offline ${run}`);
  await page.goto(laUrl);
  await expect(page.getByTestId('position-1')).toContainText(`LA 1 second edit ${run}`);
  await expectStatus(page, 'on this device (20)');

  await context.setOffline(false);
  await expectStatus(page, 'synced', 60_000);

  // a second device sees every edit
  const second = await device(browser, 'admin');
  await openPanel(second.page, 'Brackenfold Family Clinic', 'LA');
  await expect(second.page.getByTestId('position-1')).toContainText(`LA 1 second edit ${run}`);
  await expect(second.page.getByTestId('position-11')).toContainText(`LA 11 offline ${run}`);
  await second.page.goBack();
  await second.page.getByTestId('panel-LB').click();
  await expect(second.page.getByTestId('position-9')).toContainText(`LB 9 offline ${run}`);

  // once each, in the order they were made
  const device1 = await page.evaluate(() => document.documentElement.dataset.deviceId);
  const rows = await query<{ mutation_id: string }>(
    `SELECT mutation_id FROM processed_mutation WHERE device_id = $1 ORDER BY created_at, mutation_id`,
    [device1],
  );
  expect(rows).toHaveLength(20);
  const ids = rows.map((r) => r.mutation_id);
  expect(ids).toEqual([...ids].sort()); // UUIDv7 ids sort in the order they were made
  await context.close();
  await second.context.close();
});

test('a push whose reply is lost is answered "duplicate" after a reload, and applied once', async ({ browser }) => {
  const { context, page } = await device(browser);
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  let caught = false;
  let dropped = 0;
  await page.route('**/api/sync/push', async (route) => {
    if (caught) return route.continue();
    caught = true;
    await route.fetch(); // the server applies it…
    await route.abort('connectionreset'); // …and the answer never arrives
    // counted only once the answer is dropped: a reload before that would cancel the request
    // under the handler (on a busy machine the fetch takes a while)
    dropped++;
  });
  const text = `Reply lost ${Date.now() % 100000}`;
  await editDescription(page, 14, text);
  await expect.poll(() => dropped).toBe(1);
  await page.unroute('**/api/sync/push');
  const duplicate = page.waitForResponse(async (r) => r.url().endsWith('/api/sync/push') && (await r.text()).includes('"duplicate"'));
  await page.reload();
  await duplicate;
  await expectQueueEmpty(page);
  const row = await circuitText('LA', 14);
  expect(row.description).toBe(text);
  const [{ n }] = await query<{ n: number }>(
    `SELECT count(*)::int AS n FROM processed_mutation WHERE result::text LIKE '%applied%' AND mutation_id IN
       (SELECT mutation_id FROM processed_mutation ORDER BY created_at DESC LIMIT 1)`,
  );
  expect(n).toBe(1);
  await context.close();
});

async function offlineEdit(page: Page, position: number, fields: { description?: string; notes?: string }) {
  await openCircuitForm(page, position);
  if (fields.description !== undefined) await page.getByTestId('field-description').fill(fields.description);
  if (fields.notes !== undefined) await page.getByLabel('Notes', { exact: true }).fill(fields.notes);
  await page.getByTestId('save-circuit').click();
}

test('two devices edit one circuit offline: other fields both survive, the later write wins, the loser needs review on both', async ({ browser }) => {
  test.setTimeout(300_000);
  const a = await device(browser);
  const b = await device(browser, 'admin');
  for (const d of [a, b]) {
    await openPanel(d.page, 'Copperwick Lofts', 'HP');
    await waitOfflineReady(d.page);
    await d.context.setOffline(true);
  }
  const run = Date.now() % 100000;
  // different fields of position 3: both survive
  await offlineEdit(a.page, 3, { description: `Washers (A) ${run}` });
  await offlineEdit(b.page, 3, { notes: `Checked by B ${run}` });
  // the same field of position 5: B writes later, so B wins
  await offlineEdit(a.page, 5, { description: `Washer W-3 (A) ${run}` });
  await offlineEdit(b.page, 5, { description: `Washer W-3 (B) ${run}` });

  await a.context.setOffline(false);
  await expectStatus(a.page, 'synced', 30_000);
  await b.context.setOffline(false);
  await expectStatus(b.page, 'needs review (1)', 30_000);

  const three = await circuitText('HP', 3);
  expect(three.description).toBe(`Washers (A) ${run}`);
  expect(three.notes).toBe(`Checked by B ${run}`);
  expect((await circuitText('HP', 5)).description).toBe(`Washer W-3 (B) ${run}`);

  // A learns of it on its next pull
  await a.page.getByTestId('sync-status').filter({ visible: true }).first().click();
  await a.page.getByTestId('sync-now').click();
  for (const d of [a, b]) {
    if (d === b) await d.page.getByTestId('sync-status').filter({ visible: true }).first().click();
    const review = d.page.getByTestId('needs-review');
    await expect(review).toContainText(`Washer W-3 (A) ${run}`);
    await expect(review).toContainText(`Washer W-3 (B) ${run}`);
  }
  // A restores theirs: a new write that now wins everywhere
  await a.page.getByTestId('restore-mine').click();
  await expect.poll(async () => (await circuitText('HP', 5)).description, { timeout: 60_000 }).toBe(`Washer W-3 (A) ${run}`);
  await expect(a.page.getByTestId('needs-review')).toContainText('No conflicts');
  await a.context.close();
  await b.context.close();
});

test('a device whose clock runs hours ahead is re-stamped: a later edit elsewhere still wins', async ({ browser }) => {
  test.setTimeout(240_000);
  const skewedContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
  // this device's clock reads three hours ahead; its timers run normally
  await skewedContext.addInitScript(() => {
    const RealDate = Date;
    const offset = 3 * 3600_000;
    class SkewedDate extends RealDate {
      constructor(...args: unknown[]) {
        if (args.length === 0) super(RealDate.now() + offset);
        else super(...(args as [number]));
      }
      static now() {
        return RealDate.now() + offset;
      }
    }
    (window as unknown as { Date: DateConstructor }).Date = SkewedDate as DateConstructor;
  });
  const skewed = await skewedContext.newPage();
  await signIn(skewed, 'electrician');
  await openPanel(skewed, 'Copperwick Lofts', 'HP');
  const run = Date.now() % 100000;
  await editDescription(skewed, 7, `From the fast clock ${run}`);
  await expectQueueEmpty(skewed);
  expect((await circuitText('HP', 7)).description).toBe(`From the fast clock ${run}`);

  const honest = await device(browser, 'admin');
  await openPanel(honest.page, 'Copperwick Lofts', 'HP');
  await editDescription(honest.page, 7, `From the right clock ${run}`);
  await expectQueueEmpty(honest.page);
  expect((await circuitText('HP', 7)).description).toBe(`From the right clock ${run}`);
  await skewedContext.close();
  await honest.context.close();
});

test('delete against edit: the tombstone stands, the edit is kept for review, restore brings it back', async ({ browser }) => {
  test.setTimeout(240_000);
  const a = await device(browser);
  const b = await device(browser, 'admin');
  for (const d of [a, b]) {
    await openPanel(d.page, 'Copperwick Lofts', 'HP');
    await waitOfflineReady(d.page);
  }
  await b.context.setOffline(true);
  const run = Date.now() % 100000;
  // A deletes position 15 online
  a.page.once('dialog', (dialog) => dialog.accept());
  await openCircuitForm(a.page, 17);
  await a.page.getByRole('button', { name: 'Delete circuit…' }).click();
  await expect(a.page.getByTestId('position-17')).toContainText('Not recorded');
  await expectQueueEmpty(a.page);
  // B, offline, edited it meanwhile
  await editDescription(b.page, 17, `Edited while deleted ${run}`);
  await b.context.setOffline(false);
  await expectStatus(b.page, 'needs review (1)', 30_000);
  await expect(b.page.getByTestId('position-17')).toContainText('Not recorded');
  expect(await circuitText('HP', 17)).toBeUndefined();
  await b.page.getByTestId('sync-status').filter({ visible: true }).first().click();
  await expect(b.page.getByTestId('needs-review')).toContainText(`Edited while deleted ${run}`);
  await b.page.getByTestId('restore-mine').click();
  await expect.poll(async () => (await circuitText('HP', 17))?.description, { timeout: 60_000 }).toBe(`Edited while deleted ${run}`);
  await a.context.close();
  await b.context.close();
});

test('"online" but the API unreachable: the change stays queued, then goes when the API answers', async ({ browser }) => {
  const { context, page } = await device(browser);
  await openPanel(page, 'Wrenfold Cottage', 'LC-1');
  await page.route('**/api/**', (route) => route.abort('connectionrefused'));
  const text = `Queued while unreachable ${Date.now() % 100000}`;
  await editDescription(page, 7, text);
  await expectStatus(page, 'on this device (1)');
  await page.waitForTimeout(6000); // several probes and retries
  await expectStatus(page, 'on this device (1)');
  expect((await circuitText('LC-1', 7)).description).not.toBe(text);
  await page.unroute('**/api/**');
  await expectQueueEmpty(page);
  expect((await circuitText('LC-1', 7)).description).toBe(text);
  await context.close();
});

test('when the device is out of storage the user is warned and the queue survives a reload', async ({ browser }) => {
  const context: BrowserContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
  // IndexedDB refuses any write of the building copy (its entries per building and panel); the
  // small entry with the queue still fits
  await context.addInitScript(() => {
    const put = IDBObjectStore.prototype.put;
    IDBObjectStore.prototype.put = function (value: unknown, key?: IDBValidKey) {
      if ((window as unknown as { __quota?: boolean }).__quota && String(key).includes(':copy:')) {
        throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
      }
      return put.call(this, value, key);
    };
  });
  const page = await context.newPage();
  await signIn(page, 'electrician');
  await openPanel(page, 'Wrenfold Cottage', 'LC-1');
  await page.route('**/api/sync/push', (route) => route.abort('connectionrefused'));
  await page.evaluate(() => ((window as unknown as { __quota: boolean }).__quota = true));
  const text = `Kept despite full storage ${Date.now() % 100000}`;
  await editDescription(page, 5, text);
  await page.getByTestId('sync-status').filter({ visible: true }).first().click();
  await expect(page.getByTestId('storage-problem').filter({ visible: true }).first()).toContainText('out of storage');
  await expect(page.getByTestId('outbox')).toContainText(/on this device \(1\)/i);
  await page.reload();
  await expect(page.getByTestId('outbox')).toContainText(/on this device \(1\)/i);
  await page.unroute('**/api/sync/push');
  await page.getByTestId('sync-now').click();
  await expect(page.getByTestId('outbox')).toContainText(/on this device \(0\)/i, { timeout: 30_000 });
  expect((await circuitText('LC-1', 5)).description).toBe(text);
  await context.close();
});

test('one tab syncs at a time: a second tab of the same browser is sent to the first', async ({ browser }) => {
  const { context, page } = await device(browser);
  const second = await context.newPage();
  await second.goto('/');
  await expect(second.getByText('Open in another tab', { exact: true })).toBeVisible();
  await expect(page.getByText('Brackenfold Family Clinic')).toBeVisible();
  // when the first tab closes, the second takes over by itself
  await page.close();
  await expect(second.getByText('Brackenfold Family Clinic')).toBeVisible();
  await context.close();
});

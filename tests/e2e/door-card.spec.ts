/**
 * A typed door card read offline in Chromium: the card is generated (tests/unit/door-card-image.ts,
 * the shipped font through sharp), the reader's worker, core and model come from the service
 * worker's cache (every request to another origin is refused), the draft is reviewed and applied
 * as one batch through the outbox, the schedule shows the positions, and the server gets them.
 */
import { expect, test } from '@playwright/test';
import sharp from 'sharp';
import { CARD_CIRCUITS, renderCard } from '../unit/door-card-image';
import { query } from './db';
import { ARTIFACTS, expectQueueEmpty, expectStatus, openPanelActions, signIn, waitOfflineReady } from './helpers';

const CLINIC = 'Brackenfold Family Clinic';

test('a typed card of a 42-space panel is read offline into a draft, reviewed and applied', async ({ browser }) => {
  test.setTimeout(300_000);
  const context = await browser.newContext();
  const page = await context.newPage();
  const foreign: string[] = [];
  // nothing may come from elsewhere: the reader's files are ours
  await context.route(/^https?:\/\/(?!127\.0\.0\.1[:/]|localhost[:/])/, (route) => {
    foreign.push(route.request().url());
    return route.abort();
  });
  const tag = `DC${Date.now().toString(36).slice(-5)}`.toUpperCase();
  await signIn(page, 'admin');
  const [building] = await query<{ id: string }>('SELECT id FROM building WHERE name = $1', [CLINIC]);
  const created = await page.request.post(`/api/buildings/${building.id}/panels`, {
    data: { tag, system: '208Y/120V-3ph-4w', busRatingA: 225, spaces: 42, location: 'Corridor 1' },
  });
  expect(created.status(), await created.text()).toBe(201);
  await page.reload();
  await waitOfflineReady(page);
  await page.getByRole('button', { name: `Building ${CLINIC}` }).click();
  await page.getByTestId(`panel-${tag}`).click();
  await openPanelActions(page);
  await expect(page.getByTestId('door-card-open')).toBeVisible();

  await context.setOffline(true);
  await expectStatus(page, 'offline');
  await page.getByTestId('door-card-open').click();
  // as a phone camera gives it: a 4000 px JPEG with margin around the card (the reader scales it down)
  const photo = await sharp(await renderCard('clean'))
    .resize({ width: 3600 })
    .extend({ top: 300, bottom: 300, left: 200, right: 200, background: '#ffffff' })
    .jpeg({ quality: 88 })
    .toBuffer();
  const chooser = page.waitForEvent('filechooser');
  await page.getByTestId('door-card-pick').click();
  await (await chooser).setFiles({ name: 'door-card.jpg', mimeType: 'image/jpeg', buffer: photo });
  await expect(page.getByTestId('door-card-progress')).toBeVisible();
  await expect(page.getByTestId('door-card-summary')).toBeVisible({ timeout: 90_000 });
  await page.screenshot({ path: `${ARTIFACTS}/door-card-draft.png`, fullPage: true });
  process.stdout.write(`# door card in Chromium, offline: ${await page.getByTestId('door-card-summary').innerText()}\n`);

  // the draft: every circuit of the card, each with its confidence and its crop of the photo
  const draft = page.getByTestId('door-card-draft');
  for (const want of CARD_CIRCUITS) {
    await expect(draft.getByTestId(/^door-card-line-[\d:]+-position$/).filter({ hasText: new RegExp(`^\\s*${want.position}$`) })).toHaveCount(1);
  }
  const line19 = draft.getByTestId(/^door-card-line-[\d:]+$/).filter({ has: page.getByTestId(/-position$/).filter({ hasText: /^19$/ }) });
  await expect(line19).toContainText('3P 40 A · Rooftop unit 1');
  await expect(line19).toContainText(/\d+ %/);
  await expect(line19.getByRole('img', { name: /Photo of the card where position 19 was read/ })).toHaveCount(1);

  // a marked line waits for a decision; accept every one left (a clean card should have few or none)
  const waiting = draft.getByTestId(/^door-card-line-[\d:]+-accept$/).filter({ hasText: /^Accept$/ });
  const marked = await waiting.count();
  expect(marked, 'lines marked for a look on a clean typed card').toBeLessThanOrEqual(4);
  // nothing is written while a marked line waits for the user's word
  if (marked > 0) await expect(page.getByTestId('door-card-apply-reason')).toContainText(`${marked} marked line`);
  while ((await waiting.count()) > 0) await waiting.first().click();
  // skip the lobby line and edit the water cooler's: the review decides what is written
  const line1 = draft.getByTestId(/^door-card-line-[\d:]+$/).filter({ has: page.getByTestId(/-position$/).filter({ hasText: /^\s*1$/ }) });
  await line1.getByTestId(/-skip$/).click();
  const line32 = draft.getByTestId(/^door-card-line-[\d:]+$/).filter({ has: page.getByTestId(/-position$/).filter({ hasText: /^32$/ }) });
  await line32.getByTestId(/-edit$/).click();
  await page.getByTestId('door-card-edit-description').fill('Water cooler, corridor 1');
  await page.getByTestId('door-card-edit-save').click();

  // the CSV import's checks: a spare breaker needs its rating, so the card's bare "SPARE" lines stop the apply
  const lineAt = (position: number) =>
    draft.getByTestId(/^door-card-line-[\d:]+$/).filter({ has: page.getByTestId(/-position$/).filter({ hasText: new RegExp(`^\\s*${position}$`) }) });
  await expect(lineAt(36)).toContainText('a breaker needs its trip rating');
  await expect(page.getByTestId('door-card-apply-reason')).toContainText('Nothing is written while an accepted line has a problem');
  const apply = page.getByTestId('door-card-apply');
  await expect(apply).toBeDisabled();
  await lineAt(36).getByTestId(/-edit$/).click();
  await page.getByTestId('door-card-edit-rating').fill('20');
  await page.getByTestId('door-card-edit-save').click();
  await lineAt(39).getByTestId(/-skip$/).click();
  const written = CARD_CIRCUITS.length - 2;
  await expect(apply).toHaveText(`Apply ${written} changes`);
  await apply.click();
  await expect(page.getByTestId('door-card-applied')).toContainText(`${written} new`);
  await page.getByTestId('door-card-back').click();
  await expect(page.getByTestId('position-2')).toContainText('Corridor receptacles');
  await expect(page.getByTestId('position-19')).toContainText('Rooftop unit 1');
  await expect(page.getByTestId('position-32')).toContainText('Water cooler, corridor 1');
  await page.screenshot({ path: `${ARTIFACTS}/door-card-applied.png`, fullPage: true });

  await context.setOffline(false);
  await expectQueueEmpty(page, 60_000);
  const stored = await query<{ position: number; poles: number; rating_a: number | null; description: string; status: string }>(
    `SELECT c.position, c.poles, c.rating_a, c.description, c.status FROM circuit c JOIN panel p ON p.id = c.panel_id
      WHERE p.tag = $1 AND c.deleted_at IS NULL ORDER BY c.position`,
    [tag],
  );
  const expected = CARD_CIRCUITS.filter((c) => c.position !== 1 && c.position !== 39).map((c) => ({
    position: c.position,
    poles: c.poles,
    rating_a: c.position === 36 ? 20 : c.ratingA,
    description: c.position === 32 ? 'Water cooler, corridor 1' : c.description,
    status: c.status,
  }));
  expect(stored.map((r) => ({ ...r, rating_a: r.rating_a === null ? null : Number(r.rating_a) }))).toEqual(expected);
  expect(foreign).toEqual([]);
  await context.close();
});

/**
 * A panel's arc-flash label, added offline like any change: it shows at once, survives a reload
 * while still queued, reaches the server when the signal returns, and an owner then reads it
 * (without the form). The study is from 2019, so its review (five years on, NFPA 70E 130.5(G))
 * is overdue and the card says so.
 */
import { expect, test, type Browser } from '@playwright/test';
import { query } from './db';
import { expectStatus, openPanel, signIn, waitOfflineReady } from './helpers';

async function device(browser: Browser, role: 'electrician' | 'owner') {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await signIn(page, role);
  return { context, page };
}

test('an arc-flash label added offline survives a reload, syncs, and the owner reads it', async ({ browser }) => {
  test.setTimeout(120_000);
  const { context, page } = await device(browser, 'electrician');
  await openPanel(page, 'Brackenfold Family Clinic', 'LB');
  await waitOfflineReady(page);
  const by = `Study ${Date.now() % 100000}`;

  await context.setOffline(true);
  await expectStatus(page, 'offline');
  await page.getByTestId('arc-flash-edit').click();
  await page.getByTestId('arc-flash-study-date').fill('2019-03-01');
  await page.getByTestId('arc-flash-study-by').fill(by);
  await page.getByTestId('arc-flash-energy').fill('0.8');
  await page.getByTestId('arc-flash-boundary').fill('-5');
  await page.getByTestId('arc-flash-voltage').fill('208');
  await page.getByTestId('arc-flash-save').click();
  // field by field: the boundary must be more than 0, and the form stays open
  await expect(page.getByTestId('arc-flash-form')).toContainText('must be more than 0');
  await page.getByTestId('arc-flash-boundary').fill('19');
  await page.getByTestId('arc-flash-save').click();
  await expect(page.getByTestId('arc-flash-summary')).toHaveText('Arc-flash label: study 2019-03-01, review due 2024-03-01');
  await expect(page.getByTestId('arc-flash-overdue')).toBeVisible();
  await expectStatus(page, 'on this device (1)');

  await page.reload();
  await expect(page.getByTestId('arc-flash-summary')).toHaveText('Arc-flash label: study 2019-03-01, review due 2024-03-01');
  await expect(page.getByTestId('arc-flash-card')).toContainText(by);

  await context.setOffline(false);
  await expectStatus(page, 'synced', 60_000);
  const rows = await query<{ study_date: string; boundary_in: number; incident_energy_cal_cm2: number }>(
    `SELECT study_date, boundary_in, incident_energy_cal_cm2 FROM arc_flash_label WHERE study_by = $1`,
    [by],
  );
  expect(rows).toEqual([{ study_date: '2019-03-01', boundary_in: 19, incident_energy_cal_cm2: 0.8 }]);

  const owner = await device(browser, 'owner');
  await openPanel(owner.page, 'Brackenfold Family Clinic', 'LB');
  await expect(owner.page.getByTestId('arc-flash-summary')).toHaveText('Arc-flash label: study 2019-03-01, review due 2024-03-01');
  await expect(owner.page.getByTestId('arc-flash-edit')).toHaveCount(0);
  await context.close();
  await owner.context.close();
});

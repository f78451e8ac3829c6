/**
 * Printing: "Print directory" on the panel screen (Letter or A4) and "Report (PDF)" on the
 * inspection screen open the server's PDF in a new tab; offline they say a connection is needed.
 */
import { expect, test } from '@playwright/test';
import { query } from './db';
import { ARTIFACTS, openPanel, openPanelActions, signIn } from './helpers';

test.use({ viewport: { width: 390, height: 844 } });

test('the panel screen prints the directory on the chosen paper, and says so when offline', async ({ page, context }) => {
  await signIn(page, 'owner');
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  await openPanelActions(page);
  await page.getByTestId('print-paper-a4').click();
  await expect(page.getByTestId('print-paper-a4')).toHaveAttribute('aria-checked', 'true');
  await page.screenshot({ path: `${ARTIFACTS}/print-directory-phone.png` });
  const popup = page.waitForEvent('popup');
  await page.getByTestId('print-directory').click();
  const tab = await popup;
  const url = new URL(tab.url());
  expect(url.pathname).toMatch(/^\/api\/panels\/[0-9a-f-]{36}\/directory\.pdf$/);
  expect(url.searchParams.get('paper')).toBe('a4');
  // the new tab is signed in as the page is: the server answers it with the PDF
  const res = await page.request.get(tab.url());
  expect(res.status()).toBe(200);
  expect(res.headers()['content-type']).toContain('application/pdf');
  expect((await res.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-');
  await tab.close();

  await context.setOffline(true);
  await expect(page.getByTestId('print-note')).toContainText('Offline');
  let opened = false;
  page.on('popup', () => (opened = true));
  await page.getByTestId('print-directory').click();
  await expect(page.getByTestId('print-note')).toContainText('Printing needs a connection');
  await page.screenshot({ path: `${ARTIFACTS}/print-directory-offline-phone.png` });
  expect(opened).toBe(false);
  await context.setOffline(false);
});

test('the inspection screen opens the report PDF', async ({ page }) => {
  const [survey] = await query<{ id: string }>(
    `SELECT i.id FROM inspection i JOIN building b ON b.id = i.building_id
      WHERE b.name LIKE '%Clinic%' AND i.kind = 'thermal-survey' AND i.deleted_at IS NULL ORDER BY i.id LIMIT 1`,
  );
  await page.setViewportSize({ width: 1280, height: 800 });
  await signIn(page, 'inspector');
  await page.goto(`/inspections/${survey.id}`);
  await expect(page.getByTestId('report-pdf')).toBeVisible();
  await page.screenshot({ path: `${ARTIFACTS}/print-report-wide.png` });
  const popup = page.waitForEvent('popup');
  await page.getByTestId('report-pdf').click();
  const tab = await popup;
  expect(new URL(tab.url()).pathname).toBe(`/api/inspections/${survey.id}/report.pdf`);
  const res = await page.request.get(tab.url());
  expect(res.status()).toBe(200);
  expect(res.headers()['content-type']).toContain('application/pdf');
});

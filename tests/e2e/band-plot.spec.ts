/**
 * Pictures and units (issue 13 items 11 and 12), on a 390 px phone: the demo's trip test of LA 28
 * (60 A on a 20 A breaker, tripped in 14 s) on its invented demo band as a log–log plot with the
 * test point — a shape AND a word, and a caption naming the verdict; then °F chosen on the Me tab
 * shows the hot lug's rise of 22 °C as 39.6 °F (a rise is × 9/5, no + 32 — NIST SP 811), and the
 * circuit's record charts that lug's rise across the two surveys, flagged in words as deviating
 * (NFPA 70B 2023 condition 2; our 3 °C threshold [CP]).
 */
import { expect, test } from '@playwright/test';
import { query } from './db';
import { ARTIFACTS, openPanel, signIn } from './helpers';

test('the trip-test reading shows its band with the test point and its verdict in words', async ({ page }) => {
  const [trip] = await query<{ id: string; inspection_id: string }>(
    `SELECT r.id, r.inspection_id FROM reading r JOIN inspection i ON i.id = r.inspection_id
      WHERE i.kind = 'trip-test' AND r.kind = 'trip' AND r.band_id IS NOT NULL AND r.deleted_at IS NULL LIMIT 1`,
  );
  expect(trip, 'the demo has a trip test judged on a band').toBeTruthy();
  await signIn(page, 'electrician');
  await page.goto(`/inspections/${trip.inspection_id}/reading?readingId=${trip.id}`);

  const plot = page.getByTestId('trip-reading-plot');
  await expect(plot).toBeVisible();
  await expect(plot).toContainText('DEMO 20 A THERMAL-MAGNETIC (INVENTED)');
  const svg = plot.getByTestId('band-plot').locator('svg');
  await expect(svg).toBeVisible();
  // the passing test is a filled circle with the word beside it, not a colour alone
  await expect(svg.locator('circle')).toHaveCount(1);
  await expect(svg).toContainText('PASS');
  await expect(svg).toContainText('Seconds to trip');
  await expect(svg).toContainText('Current, multiples of rating');
  await expect(plot.getByTestId('band-plot-caption')).toContainText('PASS: 60 A (300 %), 14 s');
  // the same words for a screen reader
  await expect(plot.getByRole('img', { name: /^Time-current band Demo 20 A/ })).toHaveAttribute('aria-label', /PASS: 60 A \(300 %\), 14 s/);
  // readable on the phone: the picture fits the screen
  const box = await svg.boundingBox();
  expect(box && box.width).toBeGreaterThan(250);
  expect(box && box.x + box.width).toBeLessThanOrEqual(390);
  await plot.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${ARTIFACTS}/band-plot-phone.png` });

  // the band library draws the same band on request
  await page.goto('/bands');
  const row = page.getByTestId('band-row').filter({ hasText: 'Demo 20 A' });
  await row.getByTestId('band-show-plot').click();
  await expect(row.getByTestId('band-plot').locator('svg')).toBeVisible();
  await expect(row.getByTestId('band-plot-caption')).toContainText('No test points');
});

test('°F on the Me tab: the hot lug’s 22 °C rise reads 39.6 °F, and its record charts the rise across surveys', async ({ page }) => {
  await signIn(page, 'inspector');
  await page.getByRole('tab', { name: /Me/ }).click();
  await page.getByRole('radio', { name: 'Temperatures in: °F' }).click();
  // the chosen chip is marked with a dot, in words as well as colour
  await expect(page.getByRole('radio', { name: 'Temperatures in: °F' })).toContainText('● °F');

  await page.getByRole('tab', { name: /Buildings/ }).click();
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  await page.getByTestId('position-28').click();
  const record = page.getByTestId('circuit-record');
  // 58 °C against 36 °C: ΔT 22 °C = 39.6 °F (× 9/5); as a temperature it would wrongly be 71.6 °F
  await expect(record).toContainText('ΔT 39.6 °F over a similar component');
  await expect(record).not.toContainText('71.6 °F');
  const trend = record.getByTestId('thermal-trend');
  await expect(trend).toContainText('Lug · phase B');
  // last year 3 °C (5.4 °F), now 22 °C (39.6 °F): deviates from the earlier survey
  await expect(trend.getByTestId('thermal-trend-verdict')).toContainText('Deviates from earlier surveys: NFPA 70B condition 2');
  await expect(trend.getByTestId('thermal-trend-verdict')).toContainText('ΔT 5.4 °F →');
  await expect(trend.locator('svg circle')).toHaveCount(2);
  await trend.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${ARTIFACTS}/thermal-trend-phone.png` });

  // and back to °C
  await page.getByRole('tab', { name: /Me/ }).click();
  await page.getByRole('radio', { name: 'Temperatures in: °C' }).click();
  await page.getByRole('tab', { name: /Buildings/ }).click();
  await expect(page.getByTestId('circuit-record')).toContainText('ΔT 22 °C over a similar component');
});

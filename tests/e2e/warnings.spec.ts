import { expect, test } from '@playwright/test';
import { ARTIFACTS, openPanel, signIn } from './helpers';

test('a conductor too small for its breaker is flagged in words, and the flag clears after the fix', async ({ page }) => {
  await signIn(page, 'electrician');
  await openPanel(page, 'Brackenfold Family Clinic', 'LB');
  // the demo's break-room microwave: a 20 A breaker on 14 AWG copper (NEC 240.4(D) allows 15 A)
  const row = page.getByTestId('position-13');
  await expect(row.getByTestId('circuit-warning')).toContainText('NEC 240.4(D) allows at most a 15 A breaker on 14 AWG copper');
  await expect(page.getByTestId('panel-problems')).toContainText('Break room microwave');
  await page.screenshot({ path: `${ARTIFACTS}/warning-phone.png` });

  await row.click();
  // the record opens with the warning, and the form checks it again
  await expect(page.getByTestId('circuit-warnings')).toContainText('240.4(D)');
  await page.getByTestId('edit-circuit').click();
  await expect(page.getByTestId('circuit-warnings')).toContainText('240.4(D)');
  await page.getByLabel('Conductor size').selectOption('12');
  // the form re-checks as the electrician types
  await expect(page.getByTestId('circuit-warnings')).toHaveCount(0);
  await page.getByTestId('save-circuit').click();

  await expect(page.getByTestId('position-13')).toContainText('12 AWG Cu');
  await expect(page.getByTestId('position-13').getByTestId('circuit-warning')).toHaveCount(0);
  await expect(page.getByTestId('panel-problems')).not.toContainText('Break room microwave');
});

test('the schedule header shows phase loading, with the numbers behind a tap', async ({ page }) => {
  await signIn(page, 'inspector');
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  const load = page.getByTestId('panel-load');
  await expect(load.getByLabel(/^Phase A: \d+ amperes$/)).toBeVisible();
  await expect(load.getByLabel(/^Phase C: \d+ amperes$/)).toBeVisible();
  await expect(load).toContainText('Imbalance');
  await expect(page.getByTestId('panel-load-details')).toHaveCount(0);
  await load.click();
  await expect(page.getByTestId('panel-load-details')).toContainText('Phase B:');
  // the demo puts a person's name and a long run with a large voltage drop on this panel
  const problems = page.getByTestId('panel-problems');
  await expect(problems).toContainText(/⚠ \d+ warnings?/);
  await expect(problems).toContainText("Dana's office");
  await expect(problems).toContainText('Monument sign');
  await problems.getByRole('link', { name: /^31\b.*Monument sign/ }).click();
  await expect(page.getByTestId('circuit-warnings')).toContainText('%');
});

test('the older load centre, its termination rating not recorded, flags the range at 60 °C (NEC 110.14(C)(1)(a)); the panel header names its load figures', async ({ page }) => {
  await signIn(page, 'electrician');
  await openPanel(page, 'Wrenfold Cottage', 'LC-1');
  // the demo's range: a 50 A breaker on 8 AWG copper, good for 40 A in the 60 °C column
  const row = page.getByTestId('position-1');
  await expect(row.getByTestId('circuit-warning')).toContainText('40 A at 60 °C');
  await expect(page.getByTestId('panel-problems')).toContainText('Range');
  const load = page.getByTestId('panel-load');
  await expect(load.getByTestId('load-connected')).toContainText('Connected load');
  await expect(load.getByTestId('load-sizing')).toContainText('Sizing load');
  await expect(load).not.toContainText('Demand');
});

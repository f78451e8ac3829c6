import { expect, test } from '@playwright/test';
import { ARTIFACTS, openPanel, openPanelActions, signIn } from './helpers';

/** Today as the app writes it (the device's calendar day, shared/deficiency.ts todayISO). */
const today = () => {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
};

test('the demo flags the one breaker rated below the label’s fault current (NEC 110.9)', async ({ page }) => {
  await signIn(page, 'inspector');
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');
  const card = page.getByTestId('fault-check');
  await expect(page.getByTestId('fault-check-headline')).toHaveText('Available fault current 14 kA (label, 2025-03-01) — 1 breaker rated below it');
  await expect(card).toContainText('Position 33 (20 A) interrupts 10 kA; 14 kA is available (NEC 110.9).');
  // clamp readings beside the calculated load, the neutral by phasor sum with its caution
  await expect(page.getByTestId('measured-A')).toContainText('41.2 A measured');
  await expect(page.getByTestId('neutral-calculated')).toContainText('A (phasor sum)');
  await expect(page.getByTestId('measured-load')).toContainText('non-linear loads');
  // "Can this panel take a 30 A 2-pole at 208 V?" from a year of measured peak (220.87)
  const spare = page.getByTestId('spare-capacity');
  await spare.getByTestId('spare-amount').fill('30');
  await spare.getByRole('radio', { name: 'Poles: 2P' }).click();
  await spare.getByTestId('spare-volts').fill('208');
  await spare.getByTestId('spare-ask').click();
  await expect(spare.getByTestId('spare-answer')).toContainText(/^(Yes|No) — /);
  await expect(spare.getByTestId('spare-answer')).toContainText('NEC 220.87');
  await page.screenshot({ path: `${ARTIFACTS}/panel-checks-phone.png`, fullPage: true });
});

test('a panel’s fault current set above a breaker’s interrupting rating flags it on the panel and the circuit; verified at the panel shows who and when', async ({ page }) => {
  await signIn(page, 'electrician');
  await openPanel(page, 'Wrenfold Cottage', 'LC-1');
  await expect(page.getByTestId('fault-check')).toContainText('No available fault current is recorded');

  // the breaker at 1 is marked 10 kA
  await page.getByTestId('position-1').click();
  await expect(page.getByTestId('breaker-verified')).toHaveText('Not verified at the panel');
  await page.getByTestId('edit-circuit').click();
  await page.getByTestId('field-interrupting').fill('10');
  await page.getByTestId('field-breaker-make').fill('Corve');
  await page.getByTestId('field-catalogue').fill('CQ250');
  await page.getByTestId('save-circuit').click();
  await expect(page.getByTestId('position-1')).toBeVisible();

  // the label at the panel says 22 kA
  await openPanelActions(page);
  await page.getByTestId('edit-panel').click();
  await page.getByTestId('field-fault-ka').fill('22');
  await page.getByTestId('field-fault-on').fill('2025-03-01');
  await page.getByRole('radio', { name: 'Taken from: Label on the equipment' }).click();
  await page.getByTestId('save-panel').click();

  // the load centre itself is marked 10 kA, so it is flagged too (110.10)
  await expect(page.getByTestId('fault-check-headline')).toHaveText(
    'Available fault current 22 kA (label, 2025-03-01) — 1 breaker rated below it, the panel rated below it',
  );
  await expect(page.getByTestId('fault-check')).toContainText('Position 1 (50 A) interrupts 10 kA; 22 kA is available (NEC 110.9).');
  await expect(page.getByTestId('fault-check')).toContainText('The panel is rated 10 kA short-circuit; 22 kA is available (NEC 110.10).');

  await page.getByTestId('position-1').click();
  await expect(page.getByTestId('breaker-identity')).toContainText('Corve CQ250');
  await expect(page.getByTestId('breaker-interrupting')).toContainText('Interrupting rating 10 kA — ⚠ below the available fault current');
  await page.getByTestId('verify-breaker').click();
  await expect(page.getByTestId('breaker-verified')).toHaveText(`Verified on ${today()} by Idris Hallowmere`);
  await page.screenshot({ path: `${ARTIFACTS}/breaker-verified-phone.png`, fullPage: true });
});

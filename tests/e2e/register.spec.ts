import { expect, test } from '@playwright/test';
import { ARTIFACTS, openCircuitForm, openPanel, openPanelActions, signIn } from './helpers';

test.describe('sign-in', () => {
  test('names the empty fields, then says plainly when the password is wrong', async ({ page }) => {
    await page.goto('/');
    await page.getByTestId('sign-in-submit').click();
    await expect(page.getByText('✕ enter an e-mail address')).toBeVisible();
    await expect(page.getByText('✕ enter your password')).toBeVisible();
    await page.getByTestId('sign-in-email').fill('electrician@ampwright.test');
    await page.getByTestId('sign-in-password').fill('not-the-password');
    await page.getByTestId('sign-in-submit').click();
    await expect(page.getByTestId('sign-in-error')).toHaveText('That e-mail and password do not match');
  });
});

test.describe('electrician', () => {
  test('edits a circuit description and finds it after a reload', async ({ page }) => {
    await signIn(page, 'electrician');
    await openPanel(page, 'Brackenfold Family Clinic', 'LA');
    await openCircuitForm(page, 19);
    const description = page.getByTestId('field-description');
    await expect(description).toHaveValue('Reception desk receptacles');
    const changed = `Reception desk receptacles, north wall ${Date.now() % 100000}`;
    await description.fill(changed);
    await page.getByTestId('save-circuit').click();
    await expect(page.getByTestId('position-19')).toContainText(changed);
    await page.reload();
    await expect(page.getByTestId('position-19')).toContainText(changed);
  });

  test('a bad rating and a 2-pole over a neighbour are named by the form', async ({ page }) => {
    await signIn(page, 'electrician');
    await openPanel(page, 'Brackenfold Family Clinic', 'LA');
    await openCircuitForm(page, 3);
    await page.getByTestId('field-rating').fill('twenty');
    await page.getByTestId('save-circuit').click();
    await expect(page.getByText('✕ must be a number of amperes')).toBeVisible();
    await page.getByTestId('field-rating').fill('20');
    await page.getByRole('radio', { name: 'Poles: 2P' }).click();
    await page.getByTestId('save-circuit').click();
    await expect(page.getByText(/✕ position 5 is taken/)).toBeVisible();
  });

  test('schedule screenshots, phone and wide', async ({ page }) => {
    await signIn(page, 'electrician');
    await openPanel(page, 'Copperwick Lofts', 'HP');
    await page.screenshot({ path: `${ARTIFACTS}/schedule-phone.png`, fullPage: true });
    await expect(page.getByTestId('schedule-phone')).toBeVisible();
    await page.setViewportSize({ width: 1280, height: 800 });
    await expect(page.getByTestId('schedule-wide')).toBeVisible();
    // on a wide screen the odd and even columns stand side by side
    const one = await page.getByTestId('position-1').boundingBox();
    const two = await page.getByTestId('position-2').boundingBox();
    expect(two!.x).toBeGreaterThan(one!.x + 300);
    expect(Math.abs(two!.y - one!.y)).toBeLessThan(4);
    await page.screenshot({ path: `${ARTIFACTS}/schedule-wide.png`, fullPage: true });
  });

  test('a multi-pole breaker spans its rows on a wide screen', async ({ page }) => {
    await page.setViewportSize({ width: 1280, height: 800 });
    await signIn(page, 'electrician');
    await openPanel(page, 'Brackenfold Family Clinic', 'LA');
    await expect(page.getByTestId('schedule-wide')).toBeVisible();
    // LA position 10 is a 2-pole breaker (10 and 12): one cell twice the height of a 1-pole one
    const twoPole = await page.getByTestId('position-10').boundingBox();
    const onePole = await page.getByTestId('position-2').boundingBox();
    expect(twoPole!.height).toBeGreaterThan(onePole!.height * 1.8);
    await expect(page.getByTestId('position-12')).toHaveCount(0);
  });
});

test.describe('read-only roles', () => {
  test('the owner sees only the granted building and no edit control', async ({ page }) => {
    await signIn(page, 'owner');
    await expect(page.getByRole('button', { name: 'Building Copperwick Lofts' })).toHaveCount(0);
    await openPanel(page, 'Brackenfold Family Clinic', 'LA');
    await expect(page.getByTestId('read-only-note')).toBeVisible();
    await openPanelActions(page);
    await expect(page.getByTestId('print-directory')).toBeVisible();
    await expect(page.getByTestId('edit-panel')).toHaveCount(0);
    await page.getByTestId('position-1').click();
    await expect(page.getByTestId('circuit-head')).toBeVisible();
    await expect(page.getByTestId('circuit-breaker')).toBeVisible();
    await expect(page.getByTestId('edit-circuit')).toHaveCount(0);
    await expect(page.getByTestId('save-circuit')).toHaveCount(0);
    await expect(page.getByTestId('field-description')).toHaveCount(0);
    await page.screenshot({ path: `${ARTIFACTS}/owner-circuit-phone.png` });
  });

  test('the inspector reads the schedule without edit controls', async ({ page }) => {
    await signIn(page, 'inspector');
    await openPanel(page, 'Copperwick Lofts', 'DP-1');
    await expect(page.getByTestId('read-only-note')).toBeVisible();
    await openPanelActions(page);
    await expect(page.getByTestId('edit-panel')).toHaveCount(0);
  });
});

test('signing out returns to the sign-in screen', async ({ page }) => {
  await signIn(page, 'admin');
  await page.getByRole('tab', { name: /Me/ }).click();
  await page.getByTestId('sign-out').click();
  await expect(page.getByTestId('sign-in-email')).toBeVisible();
  await page.reload();
  await expect(page.getByTestId('sign-in-email')).toBeVisible();
});

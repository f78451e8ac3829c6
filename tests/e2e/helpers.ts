import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'ampwright-demo';
export const ARTIFACTS = 'tests/artifacts';

export async function signIn(page: Page, role: 'admin' | 'electrician' | 'inspector' | 'owner') {
  await page.goto('/');
  await page.getByTestId('sign-in-email').fill(`${role}@ampwright.test`);
  await page.getByTestId('sign-in-password').fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await expect(page.getByText('Brackenfold Family Clinic')).toBeVisible();
}

export async function openPanel(page: Page, building: string, tag: string) {
  await page.getByRole('button', { name: `Building ${building}` }).click();
  await page.getByTestId(`panel-${tag}`).click();
  await expect(page.getByTestId('position-1')).toBeVisible();
}

/** Wait until the service worker keeps the app's files, so a reload with no signal still opens it. */
export async function waitOfflineReady(page: Page) {
  await expect(page.locator('html[data-offline-ready="true"]')).toHaveCount(1, { timeout: 60_000 });
}

/** The panel screen's actions sit behind one "Panel actions" button: open it (once). */
export async function openPanelActions(page: Page) {
  const toggle = page.getByTestId('panel-actions');
  if ((await toggle.getAttribute('aria-expanded')) !== 'true') await toggle.click();
  await expect(page.getByTestId('panel-actions-menu')).toBeVisible();
}

/** Open a circuit from the schedule and its form ("Edit circuit" on its record). */
export async function openCircuitForm(page: Page, position: number) {
  await page.getByTestId(`position-${position}`).click();
  await page.getByTestId('edit-circuit').click();
}

/** Open a circuit from the schedule, change its description, save, and be back on the schedule. */
export async function editDescription(page: Page, position: number, description: string) {
  await openCircuitForm(page, position);
  await page.getByTestId('field-description').fill(description);
  await page.getByTestId('save-circuit').click();
  await expect(page.getByTestId(`position-${position}`)).toContainText(description);
}

export async function expectStatus(page: Page, text: string | RegExp, timeout = 20_000) {
  await expect(page.getByTestId('sync-status').filter({ visible: true }).first()).toContainText(text, { timeout });
}

/** Nothing left on the device: every queued change got its answer (conflicts may remain). */
export async function expectQueueEmpty(page: Page, timeout = 30_000) {
  await expect(page.getByTestId('sync-status').filter({ visible: true }).first()).toHaveText(/^(✓ synced|! needs review \(\d+\))$/, { timeout });
}

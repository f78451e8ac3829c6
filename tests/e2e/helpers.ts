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

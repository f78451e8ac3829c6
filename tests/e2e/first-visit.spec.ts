/**
 * A newcomer's first visit: a cold load of the sign-in page (no session, nothing on the device)
 * logs no error in the browser's console — asking who is signed in is not a failed request.
 */
import { expect, test } from '@playwright/test';

test('a cold load of the sign-in page logs no console error', async ({ page }) => {
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(m.text());
  });
  page.on('pageerror', (e) => problems.push(e.message));
  const me = page.waitForResponse((r) => new URL(r.url()).pathname === '/api/me');
  await page.goto('/');
  await expect(page.getByTestId('sign-in-email')).toBeVisible();
  expect((await me).status()).toBe(200);
  // let late requests (fonts, the service worker) settle before judging
  await page.waitForLoadState('networkidle');
  expect(problems).toEqual([]);
});

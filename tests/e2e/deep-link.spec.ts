/**
 * A screen opened straight from a URL — the QR code on a printed door directory, or a reload — is
 * never a dead end: it has a way back and, on a phone, the tab bar.
 */
import { expect, test } from '@playwright/test';
import { query } from './db';
import { signIn } from './helpers';

async function panelId(tag: string) {
  const [row] = await query<{ id: string }>(
    `SELECT p.id FROM panel p JOIN building b ON b.id = p.building_id WHERE b.name = 'Brackenfold Family Clinic' AND p.tag = $1`,
    [tag],
  );
  return row.id;
}

test('a panel opened from its QR address has a way back and the tab bar', async ({ page }) => {
  await signIn(page, 'electrician');
  await page.goto(`/panels/${await panelId('LA')}`);
  await expect(page.getByTestId('position-1')).toBeVisible();
  await expect(page.getByRole('tab', { name: /Findings/ })).toBeVisible();
  const back = page.getByTestId('header-back').filter({ visible: true }).first();
  await expect(back).toBeVisible();
  await back.click();
  await expect(page.getByRole('button', { name: 'Building Brackenfold Family Clinic' })).toBeVisible();
});

test('a circuit reloaded on its own address keeps the way back and the tab bar', async ({ page }) => {
  await signIn(page, 'electrician');
  await page.goto(`/panels/${await panelId('LA')}`);
  await page.getByTestId('position-3').click();
  await expect(page.getByTestId('circuit-record')).toBeVisible();
  await page.reload();
  await expect(page.getByTestId('circuit-record')).toBeVisible();
  await page.getByTestId('edit-circuit').click();
  await expect(page.getByTestId('field-description')).toBeVisible();
  await expect(page.getByRole('tab', { name: /Sync/ })).toBeVisible();
  await expect(page.getByTestId('header-back').filter({ visible: true }).first()).toBeVisible();
});

test('a deficiency opened from its address can go back to the app', async ({ page }) => {
  await signIn(page, 'inspector');
  const [row] = await query<{ id: string }>(`SELECT id FROM deficiency WHERE deleted_at IS NULL ORDER BY id LIMIT 1`);
  await page.goto(`/deficiencies/${row.id}`);
  await expect(page.getByTestId('deficiency-title')).toBeVisible();
  const back = page.getByTestId('header-back').filter({ visible: true }).first();
  await expect(back).toBeVisible();
  await back.click();
  await expect(page.getByRole('tab', { name: /Buildings/ })).toBeVisible();
});

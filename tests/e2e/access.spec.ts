/**
 * Users and access in the browser: an admin invites an electrician, the invitation e-mail lands in
 * the fake inbox (MailDev, MAIL_INBOX_URL from scripts/test.sh), the invitee sets a password and is
 * signed in, and the link then says it has been used; an admin grants and revokes an owner's
 * building and the owner's device drops it at the next pull (the sync `revoked` list).
 */
import { expect, test, type Page } from '@playwright/test';
import { ARTIFACTS, signIn } from './helpers';

const INBOX = process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:54342';

async function invitationLink(to: string): Promise<string> {
  for (let i = 0; i < 100; i++) {
    const mails = (await (await fetch(`${INBOX}/email`)).json()) as { to: { address: string }[]; text: string }[];
    const mail = mails.reverse().find((m) => m.to.some((t) => t.address === to));
    const token = mail?.text.match(/\/invitation\/([A-Za-z0-9_-]+)/)?.[1];
    if (token) return `/invitation/${token}`;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no invitation e-mail to ${to} in ${INBOX}`);
}

/** The owner's device pulls now (as it would on its own every few seconds while open). */
async function syncNow(page: Page) {
  await page.getByRole('tab', { name: /Sync/ }).click();
  await page.getByTestId('sync-now').click();
  await expect(page.getByTestId('sync-now')).toBeEnabled({ timeout: 60_000 });
  await page.getByRole('tab', { name: /Buildings/ }).click();
}

async function openUsers(page: Page) {
  await page.getByRole('tab', { name: /Me/ }).click();
  await page.getByTestId('users-and-access').click();
  await expect(page.getByText('Invite someone')).toBeVisible();
}

test('an admin invites an electrician; the link from the e-mail sets a password, signs in, and then works no more', async ({ browser }) => {
  const email = `new-${Date.now()}@example.test`;
  const admin = await browser.newContext();
  const adminPage = await admin.newPage();
  adminPage.on('dialog', (d) => void d.accept());
  await signIn(adminPage, 'admin');
  await openUsers(adminPage);
  await adminPage.getByTestId('invite-email').fill('not an address');
  await adminPage.getByTestId('invite-submit').click();
  await expect(adminPage.getByText('enter an e-mail address')).toBeVisible();
  await adminPage.getByTestId('invite-email').fill(email);
  await adminPage.getByRole('radio', { name: 'Role: Electrician' }).first().click();
  await adminPage.getByTestId('invite-submit').click();
  await expect(adminPage.getByTestId('invite-result')).toContainText(`Invitation sent to ${email}`);
  await expect(adminPage.getByTestId('pending-invitations')).toContainText(email);
  await adminPage.screenshot({ path: `${ARTIFACTS}/access-invite.png`, fullPage: true });

  const link = await invitationLink(email);
  const invitee = await browser.newContext();
  const page = await invitee.newPage();
  await page.goto(link);
  await expect(page.getByTestId('accept-invitation')).toContainText('Join Tallowmere Electrical Services');
  await page.getByTestId('invite-name').fill('Ada Brennan');
  await page.getByTestId('invite-password').fill('short');
  await page.getByTestId('accept-submit').click();
  await expect(page.getByText('use at least 10 characters')).toBeVisible();
  await page.screenshot({ path: `${ARTIFACTS}/access-accept.png`, fullPage: true });
  await page.getByTestId('invite-password').fill('a-long-enough-password');
  await page.getByTestId('accept-submit').click();
  await expect(page.getByText('Brackenfold Family Clinic')).toBeVisible({ timeout: 60_000 });

  // the same link a second time, on another device
  const other = await browser.newContext();
  const again = await other.newPage();
  await again.goto(link);
  await expect(again.getByTestId('link-problem')).toContainText('This link has been used');
  await again.screenshot({ path: `${ARTIFACTS}/access-used.png`, fullPage: true });

  // and the admin sees the new person
  await adminPage.reload();
  await expect(adminPage.getByTestId(`person-${email.replace(/[^a-z0-9]/gi, '-')}`)).toContainText('Ada Brennan');
  await Promise.all([admin.close(), invitee.close(), other.close()]);
});

test("an admin grants and then revokes an owner's building; the owner's device drops it at the next pull", async ({ browser }) => {
  const owner = await browser.newContext();
  const ownerPage = await owner.newPage();
  await signIn(ownerPage, 'owner');
  await expect(ownerPage.getByRole('button', { name: 'Building Copperwick Lofts' })).toHaveCount(0);

  const admin = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const adminPage = await admin.newPage();
  adminPage.on('dialog', (d) => void d.accept());
  await signIn(adminPage, 'admin');
  await openUsers(adminPage);
  const card = adminPage.getByTestId('person-owner-ampwright-test');
  await card.getByRole('checkbox', { name: 'Copperwick Lofts: not granted' }).click();
  await expect(card.getByRole('checkbox', { name: 'Copperwick Lofts: granted' })).toBeVisible();

  await syncNow(ownerPage);
  await expect(ownerPage.getByRole('button', { name: 'Building Copperwick Lofts' })).toBeVisible({ timeout: 60_000 });

  await card.getByRole('checkbox', { name: 'Copperwick Lofts: granted' }).click();
  await expect(card.getByRole('checkbox', { name: 'Copperwick Lofts: not granted' })).toBeVisible();
  await adminPage.screenshot({ path: `${ARTIFACTS}/access-people-wide.png`, fullPage: true });

  // the next pull answers the building in `revoked`; the device drops its copy
  await syncNow(ownerPage);
  await expect(ownerPage.getByRole('button', { name: 'Building Copperwick Lofts' })).toHaveCount(0, { timeout: 60_000 });
  await ownerPage.screenshot({ path: `${ARTIFACTS}/access-owner-after-revoke.png`, fullPage: true });
  await expect(ownerPage.getByRole('button', { name: 'Building Brackenfold Family Clinic' })).toBeVisible();
  await Promise.all([admin.close(), owner.close()]);
});

test('forgot password: the same answer for any address', async ({ page }) => {
  await page.goto('/');
  await page.getByTestId('forgot-password-link').click();
  await page.getByTestId('forgot-email').fill('nobody@example.test');
  await page.getByTestId('forgot-submit').click();
  await expect(page.getByTestId('forgot-result')).toContainText('If an account uses that address');
  await page.screenshot({ path: `${ARTIFACTS}/access-forgot.png`, fullPage: true });
});

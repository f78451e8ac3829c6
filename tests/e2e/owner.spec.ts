/**
 * The building owner's view: only the buildings granted, a search across the building's
 * directory that finds the right breaker (by what it feeds, and by panel and position), also with
 * no signal, and the open deficiencies by priority.
 */
import { expect, test } from '@playwright/test';
import { ARTIFACTS, expectStatus, signIn, waitOfflineReady } from './helpers';

test('the owner searches the directory and finds the right breaker, also offline', async ({ page, context }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, 'owner');
  // only the granted building
  await expect(page.getByRole('button', { name: /^Building / })).toHaveCount(1);
  await page.getByRole('button', { name: 'Building Brackenfold Family Clinic' }).click();
  await waitOfflineReady(page);
  await context.setOffline(true);
  await expectStatus(page, 'offline');

  const search = page.getByTestId('directory-search');
  // by what it feeds: the demo clinic's vaccine refrigerator is on LA 22
  await search.getByTestId('directory-query').fill('which breaker feeds the vaccine refrigerator');
  const results = search.getByTestId('directory-result');
  await expect(results).toHaveCount(1);
  await expect(results.first()).toContainText('LA · 22');
  await expect(results.first()).toContainText('Vaccine refrigerator, nurse station');
  await page.screenshot({ path: `${ARTIFACTS}/owner-search-phone.png`, fullPage: true });

  // by the word people say, and with a typo: among the clinic's refrigerators (other tests may
  // have added a "fridge" of their own, which ranks first for its exact word)
  for (const words of ['fridge', 'refrigerater']) {
    await search.getByTestId('directory-query').fill(words);
    await expect(results.filter({ hasText: 'Vaccine refrigerator, nurse station' })).toHaveCount(1);
    // and another of the clinic's refrigerators beside it (how many fit depends on what earlier
    // tests added: the list shows the best few)
    await expect(results.filter({ hasText: /Lab specimen refrigerator|Break room refrigerator/ }).first()).toBeVisible();
  }

  // by panel and position
  await search.getByTestId('directory-query').fill('what is on LA-28');
  await expect(results).toHaveCount(1);
  await expect(results.first()).toContainText('Autoclave, soiled utility 121');

  // nothing found says so
  await search.getByTestId('directory-query').fill('hot tub');
  await expect(search.getByTestId('directory-no-match')).toBeVisible();

  // a result opens that circuit, read-only for the owner
  await search.getByTestId('directory-query').fill('vaccine');
  await results.first().click();
  await expect(page).toHaveURL(/\/circuits\//);
  await expect(page.getByRole('heading', { name: 'LA · 22' })).toBeVisible();
  await expect(page.getByText('Vaccine refrigerator, nurse station').filter({ visible: true }).first()).toBeVisible();
  await expect(page.getByTestId('save-circuit')).toHaveCount(0);
});

/**
 * Inspections on screen: an inspector's thermal survey of the clinic's panel LA from start to
 * sign-off, with what each reading means shown as it is typed, and what reached the server.
 */
import { expect, test, type Page } from '@playwright/test';
import { query } from './db';
import { ARTIFACTS, expectQueueEmpty, expectStatus, openPanel, openPanelActions, signIn, waitOfflineReady } from './helpers';

/** The browser's confirm dialogs (lib/confirm.web.ts) are answered yes; their text is kept. */
function acceptDialogs(page: Page): string[] {
  const seen: string[] = [];
  page.on('dialog', (dialog) => {
    seen.push(dialog.message());
    void dialog.accept();
  });
  return seen;
}

test('an inspector surveys panel LA: a hot lug is P1 now, a loose lug is loose, and the sign-off freezes it', async ({ page }) => {
  test.setTimeout(300_000);
  const dialogs = acceptDialogs(page);
  const pushed: { name: string; fields: Record<string, unknown> }[] = [];
  page.on('request', (request) => {
    if (request.url().endsWith('/api/sync/push')) pushed.push(...(request.postDataJSON()?.mutations ?? []));
  });
  await signIn(page, 'inspector');
  await openPanel(page, 'Brackenfold Family Clinic', 'LA');

  // ---- a new thermal survey, opened from the panel (so LA is already chosen)
  await openPanelActions(page);
  await page.getByTestId('inspect-panel').click();
  await expect(page.getByTestId('cover-panel-LA')).toHaveAttribute('aria-checked', 'true');
  await page.getByTestId('field-ambient').fill('40');
  await page.getByTestId('field-load-pct').fill('30');
  // NFPA 70B: at least 40 % of normal load for a thermal survey
  await expect(page.getByTestId('light-load-warning')).toContainText('30 % of normal, under the 40 %');
  await page.getByTestId('save-inspection').click();
  await expect(page.getByTestId('inspection-header')).toContainText('Thermal survey');
  await expect(page.getByTestId('light-load-warning')).toBeVisible();
  const inspectionId = new URL(page.url()).pathname.split('/')[2];

  // ---- a thermal reading on the lug of LA 13, phase B: 85 °C against 40 °C ambient air
  await page.getByTestId('add-thermal-LA').click();
  await expect(page.getByTestId('kind-caution')).toContainText('NFPA 70E');
  await page.getByRole('radio', { name: 'Phase: B' }).click();
  await page.getByTestId('field-circuit').click();
  await page.getByTestId('field-circuit-13').click();
  await page.getByTestId('field-temperature').fill('85');
  await page.getByRole('radio', { name: 'Reference is: Ambient air' }).click();
  // the inspection's ambient fills the reference
  await expect(page.getByTestId('field-reference')).toHaveValue('40');
  // ΔT 45 °C over ambient: ANSI/NETA MTS Table 100.18, > 40 °C over ambient is priority 1
  const live = page.getByTestId('live-assessment');
  await expect(live.getByTestId('priority-chip-1')).toHaveText('P1 now');
  await expect(live).toContainText('ΔT 45 °C over ambient air');
  await expect(live.getByTestId('assessment-basis')).toContainText('ANSI/NETA MTS Table 100.18');
  await page.screenshot({ path: `${ARTIFACTS}/inspection-thermal-phone.png`, fullPage: true });
  await page.getByTestId('save-reading').click();
  await expect(page.getByTestId('reading-saved')).toBeVisible();
  await expect(page.getByTestId('reading-photos')).toBeVisible();
  await page.getByTestId('raise-reading-deficiency').click();
  await expect(page.getByTestId('raised-deficiency')).toContainText('Hot lug, LA 13 phase B');
  // the link opens the deficiency itself
  await page.getByTestId('raised-deficiency').click();
  await expect(page).toHaveURL(/\/deficiencies\/[0-9a-f-]{36}$/);
  await page.goBack();
  await page.getByTestId('reading-done').click();

  const panel = page.getByTestId('inspection-panel-LA');
  await expect(panel.getByTestId('reading-thermal')).toContainText('P1 now');
  await expect(panel.getByTestId('reading-thermal')).toContainText('85 °C vs 40 °C ambient');

  // ---- one checklist item ticked: a visual reading and a deficiency at the check's priority
  await panel.getByTestId('checklist-toggle-LA').click();
  await panel.getByTestId('check-open-knockouts').click();
  const raised = page.getByTestId('inspection-deficiencies');
  await expect(raised.getByTestId('inspection-deficiency')).toHaveCount(2);
  await expect(raised).toContainText('Missing knockout closures or filler plates');
  await expect(raised).toContainText('Hot lug, LA 13 phase B');
  // a tick taken back: the visual reading goes after a confirm, the deficiency it raised stays
  await panel.getByTestId('check-cover-screws').click();
  await expect(raised.getByTestId('inspection-deficiency')).toHaveCount(3);
  await panel.getByTestId('check-cover-screws').click();
  await expect(panel.getByTestId('check-cover-screws')).toHaveAttribute('aria-checked', 'false');
  expect(dialogs.at(-1)).toContain('The deficiency it raised stays');
  await expect(raised.getByTestId('inspection-deficiency')).toHaveCount(3);

  // an edit sends only the field that changed
  await panel.getByTestId('reading-thermal').click();
  await expect(page.getByTestId('save-reading')).toHaveText('Saved');
  await page.getByTestId('field-temperature').fill('86');
  await page.getByTestId('save-reading').click();
  await expect(page.getByTestId('save-reading')).toHaveText('Saved');
  await page.getByTestId('reading-done').click();
  await expect(panel.getByTestId('reading-thermal')).toContainText('86 °C vs 40 °C ambient');

  // ---- a torque check from the fallback table: 12 AWG, small slotted screw → 20 lbf-in (UL 486A-B, NEC Annex I)
  await panel.getByTestId('more-kinds-LA').click();
  await panel.getByTestId('add-torque-LA').click();
  await page.getByTestId('field-circuit').click();
  await page.getByTestId('field-circuit-13').click();
  await page.getByRole('radio', { name: 'Specified value comes from: Fallback table (UL 486A-B)' }).click();
  // one compact select, not a wall of chips (the circuit form's picker); the circuit's size is filled in
  await expect(page.getByTestId('field-conductor-size')).toHaveValue('12');
  await page.getByTestId('field-conductor-size').selectOption('10');
  await page.getByTestId('field-conductor-size').selectOption('12');
  await page.getByRole('radio', { name: 'Screw kind: Small slotted' }).click();
  await expect(page.getByTestId('field-specified')).toHaveValue('20');
  await expect(page.getByTestId('torque-fallback')).toContainText('NEC 110.14(D)');
  await page.getByRole('radio', { name: 'As found: Turned' }).click();
  await page.getByTestId('field-as-found').fill('12');
  await page.getByTestId('field-as-left').fill('20');
  await expect(page.getByTestId('live-assessment')).toContainText('As found loose');
  await expect(page.getByTestId('live-assessment').getByTestId('assessment-basis')).toContainText('UL 486A-486B');
  await page.getByTestId('save-reading').click();
  await expect(page.getByTestId('reading-saved')).toBeVisible();
  await page.getByTestId('reading-done').click();
  await expect(panel.getByTestId('reading-torque')).toContainText('As found loose');

  // ---- the sign-off, after its confirm, freezes the inspection
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.screenshot({ path: `${ARTIFACTS}/inspection-wide.png`, fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.getByTestId('sign-inspection').click();
  await expect(page.getByTestId('signed-line')).toContainText(/Signed by .+ on \d+ \w{3} \d{4}/);
  expect(dialogs.some((d) => d.includes('Signing freezes this inspection; later changes need a new inspection'))).toBe(true);
  await expect(page.getByTestId('sign-inspection')).toHaveCount(0);
  await expect(page.getByTestId('edit-inspection')).toHaveCount(0);
  await expect(page.getByTestId('add-thermal-LA')).toHaveCount(0);
  await expect(page.getByTestId('more-kinds-LA')).toHaveCount(0);
  await expect(page.getByRole('checkbox')).toHaveCount(0);
  await expect(panel.getByTestId('reading-thermal')).not.toContainText('Edit');
  await page.screenshot({ path: `${ARTIFACTS}/inspection-signed-phone.png`, fullPage: true });

  // ---- every row reached the server
  await expectQueueEmpty(page);
  const [inspection] = await query<{ kind: string; load_pct: number; signed_at: Date | null; signed_by_name: string }>(
    'SELECT kind, load_pct, signed_at, signed_by_name FROM inspection WHERE id = $1',
    [inspectionId],
  );
  expect(inspection.kind).toBe('thermal-survey');
  expect(inspection.load_pct).toBe(30);
  expect(inspection.signed_at).not.toBeNull();
  const readings = await query<{ kind: string; temperature_c: number | null; specified: number | null; spec_source: string | null; as_found_value: number | null; check_item: string | null }>(
    'SELECT kind, temperature_c, specified, spec_source, as_found_value, check_item FROM reading WHERE inspection_id = $1 AND deleted_at IS NULL ORDER BY kind',
    [inspectionId],
  );
  expect(readings.map((r) => r.kind)).toEqual(['thermal', 'torque', 'visual']);
  expect(readings[0].temperature_c).toBe(86);
  const edits = pushed.filter((m) => m.name === 'reading.patch');
  expect(edits.map((m) => m.fields)).toEqual([{ temperatureC: 86 }]);
  expect(readings[1]).toMatchObject({ specified: 20, spec_source: 'fallback-table', as_found_value: 12 });
  expect(readings[2].check_item).toBe('open-knockouts');
  const untickedReadings = await query<{ check_item: string }>(
    'SELECT check_item FROM reading WHERE inspection_id = $1 AND deleted_at IS NOT NULL',
    [inspectionId],
  );
  expect(untickedReadings.map((r) => r.check_item)).toEqual(['cover-screws']);
  const deficiencies = await query<{ source: string; priority: number; title: string; reading_id: string | null; check_item: string | null }>(
    'SELECT source, priority, title, reading_id, check_item FROM deficiency WHERE inspection_id = $1 ORDER BY source',
    [inspectionId],
  );
  expect(deficiencies).toHaveLength(3);
  expect(deficiencies.filter((d) => d.source === 'checklist').map((d) => [d.check_item, d.priority]).sort()).toEqual([
    ['cover-screws', 3],
    ['open-knockouts', 2],
  ]);
  expect(deficiencies[2]).toMatchObject({ source: 'reading', priority: 1, title: 'Hot lug, LA 13 phase B' });
  expect(deficiencies.every((d) => d.reading_id)).toBe(true);
});

test('an owner reads inspections but is offered no way to start one', async ({ page }) => {
  await signIn(page, 'owner');
  await page.getByRole('button', { name: 'Building Brackenfold Family Clinic' }).click();
  await expect(page.getByTestId('building-inspections')).toBeVisible();
  await expect(page.getByTestId('new-inspection')).toHaveCount(0);
  await page.getByTestId('panel-LA').click();
  await expect(page.getByTestId('position-1')).toBeVisible();
  await openPanelActions(page);
  await expect(page.getByTestId('inspect-panel')).toHaveCount(0);
});

test('an electrician records a torque audit with no signal; it arrives when the signal returns, raising nothing', async ({ page, context }) => {
  test.setTimeout(300_000);
  await signIn(page, 'electrician');
  await openPanel(page, 'Brackenfold Family Clinic', 'LB');
  await waitOfflineReady(page);
  await context.setOffline(true);
  await expectStatus(page, 'offline');

  await openPanelActions(page);
  await page.getByTestId('inspect-panel').click();
  await page.getByRole('radio', { name: 'Kind of inspection: Torque audit' }).click();
  const note = `offline audit ${Date.now()}`;
  await page.getByTestId('field-notes').fill(note);
  await page.getByTestId('save-inspection').click();
  await expect(page.getByTestId('inspection-header')).toContainText('Torque audit');
  const inspectionId = new URL(page.url()).pathname.split('/')[2];
  // the maker's value, held: nothing to raise
  await page.getByTestId('add-torque-LB').click();
  await page.getByTestId('field-circuit').click();
  await page.getByTestId('field-circuit-1').click();
  await page.getByTestId('field-specified').fill('25');
  await page.getByRole('radio', { name: 'As found: Held at the value' }).click();
  await page.getByTestId('field-as-left').fill('25');
  await expect(page.getByTestId('live-assessment').getByTestId('reading-no-action')).toHaveText('✓ No action');
  await page.getByTestId('save-reading').click();
  await page.getByTestId('reading-done').click();
  const panel = page.getByTestId('inspection-panel-LB');
  await panel.getByTestId('checklist-toggle-LB').click();
  await expect(panel).toContainText('an inspector raises the deficiency from it');
  await panel.getByTestId('check-directory-missing').click();
  await expect(page.getByTestId('inspection-deficiencies')).toContainText('None yet');
  // the details stay editable until the sign-off
  await page.getByTestId('edit-inspection').click();
  await page.getByTestId('field-load-pct').fill('55');
  await page.getByTestId('save-inspection').click();
  await expect(page.getByTestId('inspection-load')).toHaveText('55 % of normal');
  // electricians do not sign
  await expect(page.getByTestId('sign-inspection')).toHaveCount(0);
  await expectStatus(page, 'on this device (4)');

  await context.setOffline(false);
  await expectQueueEmpty(page, 60_000);
  const [inspection] = await query<{ kind: string; notes: string; load_pct: number }>(
    'SELECT kind, notes, load_pct FROM inspection WHERE id = $1',
    [inspectionId],
  );
  expect(inspection).toEqual({ kind: 'torque-audit', notes: note, load_pct: 55 });
  const readings = await query<{ kind: string }>('SELECT kind FROM reading WHERE inspection_id = $1 ORDER BY kind', [inspectionId]);
  expect(readings.map((r) => r.kind)).toEqual(['torque', 'visual']);
  expect(await query('SELECT id FROM deficiency WHERE inspection_id = $1', [inspectionId])).toHaveLength(0);
});

test('a signed inspection that raised nothing says so, and does not ask anyone to tick the checklist', async ({ page }) => {
  const [signed] = await query<{ id: string }>(
    `SELECT i.id FROM inspection i JOIN building b ON b.id = i.building_id
      WHERE b.name = 'Brackenfold Family Clinic' AND i.signed_at IS NOT NULL AND i.deleted_at IS NULL
        AND NOT EXISTS (SELECT 1 FROM deficiency d WHERE d.inspection_id = i.id AND d.deleted_at IS NULL)
      ORDER BY i.id LIMIT 1`,
  );
  // the admin may raise deficiencies, so an open inspection would invite a tick; a signed one is frozen
  await signIn(page, 'admin');
  await page.goto(`/inspections/${signed.id}`);
  const raised = page.getByTestId('inspection-deficiencies');
  await expect(raised).toContainText('None raised: the inspection is signed.');
  await expect(raised).not.toContainText('Tick');
});

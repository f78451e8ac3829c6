/**
 * Deficiencies on screen, from raising one by hand to its verification or deferral, as each role
 * sees it; the Findings tab and its filters; and a circuit's trip history with what it says. The
 * steps run in order (each role signs in on its own device) and check what reached the server.
 */
import { expect, test, type Browser, type Page } from '@playwright/test';
import { query } from './db';
import { ARTIFACTS, expectQueueEmpty, openPanel, signIn } from './helpers';

type Role = 'admin' | 'electrician' | 'inspector' | 'owner';

const run = Date.now() % 100_000;
const REPAIR_TITLE = `Open knockout beside LA main ${run}`;
const DEFER_TITLE = `LB directory out of date ${run}`;
const P1_TITLE = `Scorched neutral bar ${run}`;
const P4_TITLE = `Faded panel label ${run}`;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "1 Jan 2027" for today + days (UTC, as the app and the server date deficiencies). */
function dueWordsIn(days: number): string {
  const d = new Date();
  d.setUTCDate(d.getUTCDate() + days);
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`;
}

async function device(browser: Browser, role: Role, width = 390, height = 844) {
  const context = await browser.newContext({ viewport: { width, height } });
  const page = await context.newPage();
  await signIn(page, role);
  return { context, page };
}

async function openFindings(page: Page) {
  // a deficiency screen sits above the tabs: go by address (the device's copy is kept)
  await page.goto('/findings');
  await expect(page.getByTestId('priority-counts')).toBeVisible();
}

const findingRow = (page: Page, title: string) => page.getByTestId('finding-rows').getByRole('link', { name: new RegExp(title) });

async function raiseByHand(page: Page, fields: { title: string; panel: string | null; priority: string; circuit?: number }) {
  await page.goto('/');
  await page.getByRole('button', { name: 'Building Brackenfold Family Clinic' }).click();
  await page.getByTestId('raise-deficiency').click();
  await page.getByTestId('field-title').fill(fields.title);
  if (fields.panel) await page.getByRole('radio', { name: `Panel (optional): Panel ${fields.panel}` }).click();
  if (fields.circuit) {
    await page.getByTestId('circuit-picker').click();
    await page.getByTestId(`circuit-option-${fields.circuit}`).click();
  }
  await page.getByRole('radio', { name: `Priority: ${fields.priority}` }).click();
  await page.getByTestId('save-deficiency').click();
  await expect(page.getByTestId('deficiency-title')).toHaveText(fields.title);
}

async function deficiencyRow(title: string) {
  const [row] = await query<{ id: string; status: string; priority: number; due_on: string; source: string; repair_note: string; defer_reason: string; review_on: string | null }>(
    'SELECT id, status, priority, due_on, source, repair_note, defer_reason, review_on FROM deficiency WHERE title = $1 AND deleted_at IS NULL',
    [title],
  );
  return row;
}

test.describe.serial('deficiencies', () => {
  test('an inspector raises a P2 by hand on panel LA; Findings lists it with its priority word and due date', async ({ browser }) => {
    const { context, page } = await device(browser, 'inspector');
    await raiseByHand(page, { title: REPAIR_TITLE, panel: 'LA', priority: 'P2 soon', circuit: 3 });
    // the demo organisation keeps the default due days: P2 soon = 30 days
    await expect(page.getByTestId('deficiency-due')).toHaveText(`Due in 30 days (${dueWordsIn(30)})`);
    await expect(page.getByTestId('deficiency-where')).toHaveText('Brackenfold Family Clinic · Panel LA');
    await expect(page.getByTestId('deficiency-circuit')).toContainText('Exam 3 & 4 receptacles');
    await expectQueueEmpty(page);

    await openFindings(page);
    const row = findingRow(page, REPAIR_TITLE);
    await expect(row.getByTestId('priority-chip-2')).toHaveText('P2 soon');
    await expect(row.getByTestId('finding-due')).toHaveText(`due in 30 days (${dueWordsIn(30)})`);
    await expect(row).toContainText('Panel LA · circuit 3, Exam 3 & 4 receptacles');
    await page.screenshot({ path: `${ARTIFACTS}/findings-phone.png` });

    const stored = await deficiencyRow(REPAIR_TITLE);
    expect(stored).toMatchObject({ status: 'open', priority: 2, source: 'manual' });
    const due = new Date();
    due.setUTCDate(due.getUTCDate() + 30);
    expect(stored.due_on).toBe(due.toISOString().slice(0, 10));
    await context.close();
  });

  test('an electrician cannot mark it repaired without evidence, and can with a note', async ({ browser }) => {
    const { context, page } = await device(browser, 'electrician');
    await openFindings(page);
    await findingRow(page, REPAIR_TITLE).click();
    await page.getByTestId('action-repair').click();
    await expect(page.getByTestId('form-repair')).toContainText('say what was done here, or add a photo of the repair');
    await page.getByTestId('confirm-repair').click();
    await expect(page.getByTestId('form-repair')).toContainText('✕ say what was done, or add a photo of the repair');
    await expect(page.getByTestId('deficiency-detail').getByTestId('status-open')).toBeVisible();

    await page.getByTestId('field-repair-note').fill('Fitted a listed filler plate');
    await page.getByTestId('confirm-repair').click();
    await expect(page.getByTestId('deficiency-detail').getByTestId('status-repaired')).toHaveText('◐ Repaired');
    await expectQueueEmpty(page);
    // the server's history line, in words
    await expect(page.getByTestId('history').getByTestId('history-change').last()).toContainText('status: Open → Repaired');
    expect(await deficiencyRow(REPAIR_TITLE)).toMatchObject({ status: 'repaired', repair_note: 'Fitted a listed filler plate' });
    // an electrician does not verify their own repair
    await expect(page.getByTestId('action-verify')).toHaveCount(0);
    await context.close();
  });

  test('the inspector verifies the repair and it leaves the outstanding list', async ({ browser }) => {
    const { context, page } = await device(browser, 'inspector');
    await openFindings(page);
    await expect(findingRow(page, REPAIR_TITLE)).toContainText('Repaired');
    await findingRow(page, REPAIR_TITLE).click();
    await page.getByTestId('action-verify').click();
    await expect(page.getByTestId('deficiency-detail').getByTestId('status-verified')).toBeVisible();
    await expectQueueEmpty(page);
    expect((await deficiencyRow(REPAIR_TITLE)).status).toBe('verified');

    await page.goBack();
    await expect(page.getByTestId('priority-counts')).toBeVisible();
    await expect(page.getByText(REPAIR_TITLE)).toHaveCount(0);
    // still on record: choose the status to see it
    await page.getByTestId('toggle-filters').click();
    await page.getByRole('radio', { name: 'Status: Verified' }).click();
    await expect(findingRow(page, REPAIR_TITLE)).toContainText('Verified');
    await context.close();
  });

  test('the owner must give a reason and a review date to defer, and a comment shows in the history', async ({ browser }) => {
    const inspector = await device(browser, 'inspector');
    await raiseByHand(inspector.page, { title: DEFER_TITLE, panel: 'LB', priority: 'P3 planned' });
    await expectQueueEmpty(inspector.page);
    await inspector.context.close();

    const { context, page } = await device(browser, 'owner');
    // owners raise nothing: no button on the building
    await page.getByRole('button', { name: 'Building Brackenfold Family Clinic' }).click();
    await expect(page.getByTestId('building-deficiencies')).toBeVisible();
    await expect(page.getByTestId('raise-deficiency')).toHaveCount(0);

    await openFindings(page);
    await findingRow(page, DEFER_TITLE).click();
    await expect(page.getByTestId('action-repair')).toHaveCount(0);
    await page.getByTestId('action-defer').click();
    const form = page.getByTestId('form-defer');
    // before anything is sent the form says both are needed, in words (not colour alone)
    await expect(form).toContainText('Why it is deferred (required)');
    await expect(form).toContainText('Look at it again on (required)');
    // the review date is the browser's own date picker (the phone's calendar), not typed text
    const reviewOn = page.getByTestId('field-review-on');
    await expect(reviewOn).toHaveAttribute('type', 'date');
    await expect(reviewOn).toHaveAttribute('aria-required', 'true');
    await page.getByTestId('confirm-defer').click();
    await expect(form).toContainText('✕ say why the repair is deferred');
    // the error sits with its field, and the field says it is in error
    await expect(reviewOn.locator('..')).toContainText('✕ choose when to look at it again');
    await expect(reviewOn).toHaveAttribute('aria-invalid', 'true');
    await reviewOn.fill('2001-01-01');
    await page.getByTestId('confirm-defer').click();
    await expect(reviewOn.locator('..')).toContainText('✕ choose a date from today on');

    await page.getByTestId('field-defer-reason').fill('Panel LB is replaced in the spring remodel');
    await page.getByTestId('field-review-on').fill('2099-04-01');
    await page.getByTestId('confirm-defer').click();
    await expect(page.getByTestId('deficiency-detail').getByTestId('status-deferred')).toBeVisible();
    await expect(page.getByTestId('deficiency-due')).toHaveText('Deferred: look again 1 Apr 2099');
    await expect(page.getByTestId('action-undefer')).toBeVisible();

    await page.getByTestId('post-comment').click();
    await expect(page.getByText('✕ a comment is required')).toBeVisible();
    await page.getByTestId('field-comment').fill('Remodel contractor booked for March.');
    await page.getByTestId('post-comment').click();
    const comment = page.getByTestId('history-comment').last();
    await expect(comment).toContainText('Remodel contractor booked for March.');
    await expect(comment).toContainText(/^you · /);
    await expectQueueEmpty(page);
    await expect(page.getByTestId('history')).toContainText('status: Open → Deferred');
    await expect(page.getByTestId('history')).toContainText('look again on: none → 1 Apr 2099');
    await page.screenshot({ path: `${ARTIFACTS}/deficiency-deferred-owner.png` });

    const stored = await deficiencyRow(DEFER_TITLE);
    expect(stored).toMatchObject({ status: 'deferred', defer_reason: 'Panel LB is replaced in the spring remodel', review_on: '2099-04-01' });
    const comments = await query<{ text: string; user_name: string }>(
      `SELECT text, user_name FROM deficiency_entry WHERE deficiency_id = $1 AND kind = 'comment'`,
      [stored.id],
    );
    expect(comments).toEqual([{ text: 'Remodel contractor booked for March.', user_name: 'Tobias Ashcombe' }]);
    await context.close();
  });

  test('Findings filters by priority with the counts at the top, side by side with the detail on a wide screen', async ({ browser }) => {
    const { context, page } = await device(browser, 'inspector', 1280, 800);
    await raiseByHand(page, { title: P1_TITLE, panel: 'MDP', priority: 'P1 now' });
    await raiseByHand(page, { title: P4_TITLE, panel: null, priority: 'P4 watch' });
    await expectQueueEmpty(page);
    await openFindings(page);
    await expect(findingRow(page, P1_TITLE)).toBeVisible();
    await expect(findingRow(page, P4_TITLE)).toBeVisible();
    // most urgent first
    const titles = await page.getByTestId('finding-rows').getByTestId('finding-title').allTextContents();
    expect(titles.indexOf(P1_TITLE)).toBeLessThan(titles.indexOf(P4_TITLE));

    await expect(page.getByTestId('count-p4')).toContainText('P4 watch');
    await page.getByTestId('count-p4').click();
    await expect(page.getByTestId('count-p4')).toHaveAttribute('aria-checked', 'true');
    await expect(findingRow(page, P4_TITLE)).toBeVisible();
    await expect(findingRow(page, P1_TITLE)).toHaveCount(0);
    await expect(page.getByTestId('finding-summary')).toContainText('P4 watch');

    // the second pane shows the chosen one
    await findingRow(page, P4_TITLE).click();
    await expect(page.getByTestId('finding-detail-pane').getByTestId('deficiency-title')).toHaveText(P4_TITLE);
    await expect(page.getByTestId('finding-detail-pane').getByTestId('deficiency-due')).toHaveText(`Due in 365 days (${dueWordsIn(365)})`);
    await page.screenshot({ path: `${ARTIFACTS}/findings-wide.png` });

    await page.getByTestId('count-p4').click();
    await page.getByTestId('count-p1').click();
    await expect(findingRow(page, P1_TITLE)).toBeVisible();
    await expect(findingRow(page, P4_TITLE)).toHaveCount(0);

    // raised by mistake: deleted after a confirm
    const dialogs: string[] = [];
    page.on('dialog', (dialog) => {
      dialogs.push(dialog.message());
      void dialog.accept();
    });
    await page.getByTestId('count-p1').click();
    await findingRow(page, P4_TITLE).click();
    await page.getByTestId('finding-detail-pane').getByTestId('action-delete').click();
    await expect(findingRow(page, P4_TITLE)).toHaveCount(0);
    expect(dialogs[0]).toContain('Only for a deficiency raised by mistake');
    await expectQueueEmpty(page);
    const [gone] = await query<{ deleted_at: Date | null }>('SELECT deleted_at FROM deficiency WHERE title = $1', [P4_TITLE]);
    expect(gone.deleted_at).not.toBeNull();
    await context.close();
  });

  test('a trip at 5 A on a 20 A breaker is recorded and read as well below the rating; one without a load says so', async ({ browser }) => {
    const { context, page } = await device(browser, 'electrician');
    await openPanel(page, 'Brackenfold Family Clinic', 'LA');
    await page.getByTestId('position-3').click();
    await expect(page.getByTestId('circuit-record')).toBeVisible();
    await page.getByTestId('record-trip').click();

    const yesterday = new Date(Date.now() - 86_400_000);
    const pad = (n: number) => String(n).padStart(2, '0');
    const date = `${yesterday.getFullYear()}-${pad(yesterday.getMonth() + 1)}-${pad(yesterday.getDate())}`;
    const circumstances = `Tripped with only the exam lights on ${run}`;
    await page.getByTestId('field-trip-load').fill('-5');
    await page.getByTestId('field-trip-time').fill('25:10');
    await page.getByTestId('save-trip').click();
    await expect(page.getByText('✕ cannot be negative')).toBeVisible();
    await expect(page.getByText('✕ a time as HH:MM (24-hour)')).toBeVisible();

    await page.getByTestId('field-trip-date').fill(date);
    await page.getByTestId('field-trip-time').fill('07:30');
    await page.getByTestId('field-trip-load').fill('5');
    await expect(page.getByText('5 A is 25 % of the 20 A rating')).toBeVisible();
    await page.getByTestId('field-trip-circumstances').fill(circumstances);
    await page.getByTestId('save-trip').click();

    const record = page.getByTestId('circuit-record');
    await expect(record.getByTestId('trip-row').filter({ hasText: circumstances })).toContainText('5 A (25 % of 20 A)');
    const findings = record.getByTestId('trip-findings');
    await expect(findings).toContainText(/\d+ trips? with the load under 80 % of the 20 A rating/);
    await expect(findings).toContainText('No hot or loose termination on record');
    await expect(record).toContainText('NFPA 70E');

    // a second trip, nobody knows the load
    await page.getByTestId('record-trip').click();
    await page.getByTestId('field-trip-date').fill(date);
    await page.getByTestId('field-trip-time').fill('09:00');
    await page.getByTestId('save-trip').click();
    await expect(findings).toContainText(/\d+ trips? (has|have) no load recorded/);
    await expect(record.getByTestId('trip-row').first()).toContainText('load not recorded');
    await expectQueueEmpty(page);

    const trips = await query<{ load_a: number | null }>('SELECT load_a FROM trip_event WHERE circumstances = $1', [circumstances]);
    expect(trips.map((t) => Number(t.load_a))).toEqual([5]);
    await context.close();
  });
});

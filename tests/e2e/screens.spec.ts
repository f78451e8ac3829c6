/**
 * Every main screen as each role sees it, at a phone's 390 × 844 and a desk's 1280 × 800, saved as
 * screenshots of the whole content (the window grown until no scroll container hides anything) in
 * tests/artifacts/screens/<role>-<screen>-<width>.png for a person to look at. Each screen must show its own content first (a screen stuck on "loading" or an error fails).
 */
import { expect, test, type Locator, type Page } from '@playwright/test';
import { query } from './db';
import { ARTIFACTS, signIn } from './helpers';

const SIZES = [
  { width: 390, height: 844 },
  { width: 1280, height: 800 },
] as const;
const DIR = `${ARTIFACTS}/screens`;
type Role = 'admin' | 'electrician' | 'inspector' | 'owner';

interface Ids {
  building: string;
  panel: string;
  circuit: string;
  inspection: string;
  openInspection: { id: string; kind: string } | null;
  deficiency: string;
}

async function demoIds(): Promise<Ids> {
  const [b] = await query<{ id: string }>(`SELECT id FROM building WHERE name = 'Brackenfold Family Clinic'`);
  const [p] = await query<{ id: string }>(`SELECT id FROM panel WHERE building_id = $1 AND tag = 'LA' AND deleted_at IS NULL`, [b.id]);
  // LA 28: the autoclave circuit with trips, a hot lug and a loose terminal on record
  const [c] = await query<{ id: string }>(`SELECT id FROM circuit WHERE panel_id = $1 AND position = 28 AND deleted_at IS NULL`, [p.id]);
  const inspections = await query<{ id: string; kind: string; signed: boolean }>(
    `SELECT id, kind, signed_at IS NOT NULL AS signed FROM inspection WHERE building_id = $1 AND deleted_at IS NULL ORDER BY id`,
    [b.id],
  );
  const open = inspections.find((i) => !i.signed) ?? null;
  const [d] = await query<{ id: string }>(`SELECT id FROM deficiency WHERE building_id = $1 AND deleted_at IS NULL ORDER BY priority, id LIMIT 1`, [b.id]);
  return { building: b.id, panel: p.id, circuit: c.id, inspection: inspections[0].id, openInspection: open, deficiency: d.id };
}

/** A screen: where it is, what shows that it has its content, and which roles may open it. */
interface Screen {
  name: string;
  path: (ids: Ids) => string | null;
  ready: (page: Page) => Locator;
  roles?: readonly Role[];
}

const READING_KIND: Record<string, string> = { 'thermal-survey': 'thermal', 'torque-audit': 'torque' };

const SCREENS: readonly Screen[] = [
  { name: 'buildings', path: () => '/', ready: (p) => p.getByText('Brackenfold Family Clinic').first() },
  { name: 'building', path: (i) => `/buildings/${i.building}`, ready: (p) => p.getByTestId('panel-LA') },
  { name: 'panel', path: (i) => `/panels/${i.panel}`, ready: (p) => p.getByTestId('position-1') },
  { name: 'circuit', path: (i) => `/panels/${i.panel}/circuits/${i.circuit}`, ready: (p) => p.getByTestId('circuit-record') },
  {
    name: 'circuit-edit',
    path: (i) => `/panels/${i.panel}/circuits/${i.circuit}?edit=1`,
    ready: (p) => p.getByTestId('field-description'),
    roles: ['admin', 'electrician'],
  },
  { name: 'inspection', path: (i) => `/inspections/${i.inspection}`, ready: (p) => p.getByText(/Panel LA|LA/).first() },
  {
    name: 'reading',
    path: (i) =>
      i.openInspection ? `/inspections/${i.openInspection.id}/reading?kind=${READING_KIND[i.openInspection.kind] ?? 'visual'}&panelId=${i.panel}` : null,
    ready: (p) => p.getByRole('button', { name: /save/i }).first(),
    roles: ['admin', 'electrician', 'inspector'],
  },
  { name: 'findings', path: () => '/findings', ready: (p) => p.getByTestId('priority-counts') },
  { name: 'deficiency', path: (i) => `/deficiencies/${i.deficiency}`, ready: (p) => p.getByTestId('deficiency-title') },
  { name: 'sync', path: () => '/sync', ready: (p) => p.getByTestId('sync-status').first() },
  { name: 'me', path: () => '/me', ready: (p) => p.getByText(/@ampwright\.test/).first() },
  { name: 'bands', path: () => '/bands', ready: (p) => p.getByRole('heading').first(), roles: ['admin', 'electrician', 'inspector'] },
  { name: 'users', path: () => '/users', ready: (p) => p.getByText(/@ampwright\.test/).first(), roles: ['admin'] },
];

const settle = (page: Page) =>
  page.evaluate(() => new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(resolve))));

/** The most any scroll container of the page hides below its fold (screens scroll inside, not the page). */
function hiddenBelow(page: Page): Promise<number> {
  return page.evaluate(() => {
    let hidden = 0;
    for (const element of Array.from(document.querySelectorAll<HTMLElement>('body *'))) {
      if (!/(auto|scroll)/.test(getComputedStyle(element).overflowY)) continue;
      hidden = Math.max(hidden, element.scrollHeight - element.clientHeight);
    }
    return hidden;
  });
}

/** Caps the picture's height: a schedule of 42 positions fits, an endless list would not. */
const MAX_HEIGHT = 9000;

async function shoot(page: Page, name: string) {
  for (const size of SIZES) {
    await page.setViewportSize(size);
    // let the layout settle to the new width (wide layouts swap components) before the picture
    await settle(page);
    // a screen scrolls inside its own container, so "full page" alone stops at the first
    // screenful: grow the window until nothing is hidden below (twice: lists render more rows)
    for (let round = 0; round < 2; round++) {
      const hidden = await hiddenBelow(page);
      if (hidden <= 0) break;
      const { height } = page.viewportSize() ?? size;
      await page.setViewportSize({ width: size.width, height: Math.min(height + hidden, MAX_HEIGHT) });
      await settle(page);
    }
    await page.screenshot({ path: `${DIR}/${name}-${size.width}.png`, fullPage: true });
    await page.setViewportSize(size);
  }
}

test('sign-in screen at both widths', async ({ page }) => {
  await page.goto('/');
  await expect(page.getByTestId('sign-in-email')).toBeVisible();
  await shoot(page, 'sign-in');
});

for (const role of ['electrician', 'inspector', 'owner', 'admin'] as const) {
  test(`every main screen as ${role}, at 390 and 1280 px`, async ({ page }) => {
    test.setTimeout(240_000);
    const ids = await demoIds();
    await signIn(page, role);
    for (const screen of SCREENS) {
      if (screen.roles && !screen.roles.includes(role)) continue;
      const path = screen.path(ids);
      if (!path) continue;
      await page.goto(path);
      await expect(screen.ready(page), `${screen.name} as ${role}`).toBeVisible({ timeout: 20_000 });
      await shoot(page, `${role}-${screen.name}`);
    }
  });
}

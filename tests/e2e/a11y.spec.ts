/**
 * Screen readers and thumbs on the main screens at 390×844 (a phone):
 *  - axe-core (WCAG 2.0/2.1 A and AA rules, and axe's best-practice rules) finds no critical and no
 *    serious violation. No rule is switched off: colour contrast in particular stays on.
 *  - every button, link, radio, checkbox, tab and date field is at least 44×44 px (WCAG 2.1
 *    §2.5.5 Target Size, the size DESIGN.md asks for a gloved thumb).
 *  - every screen has a main landmark, and the tab bar is a navigation landmark ("Sections").
 *  - headings a screen reader can walk: exactly one level-1 heading (the header bar's title, or the
 *    screen's own title where there is no bar), a level-2 heading on every screen with sections, and
 *    no level skipped going down (WCAG 2.1 §1.3.1 Info and Relationships, §2.4.6 Headings and
 *    Labels; axe's `page-has-heading-one` and `heading-order` are only "moderate", so they are
 *    checked here by hand).
 *  - nothing a phone cuts: the page's title is not jammed against the screen's left edge, and no
 *    field's placeholder is wider than the field (the end of the example was cut off).
 * Both in the light theme and the dark one (the browser asks for dark: prefers-color-scheme), on
 * each screen as it stands. The counts per screen land in tests/artifacts/a11y-<scheme>.txt.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import AxeBuilder from '@axe-core/playwright';
import type { AxeResults, RunOptions } from 'axe-core';
import { expect, test, type Page } from '@playwright/test';
import { query } from './db';
import { ARTIFACTS, DEMO_PASSWORD } from './helpers';

interface Screen {
  name: string;
  path: string;
  /** something on the screen that says it has drawn its content */
  ready: (page: Page) => ReturnType<Page['getByTestId']>;
  /** the screen is cut into titled sections (cards, groups): it must have a level-2 heading */
  sections: boolean;
}

async function screens(): Promise<Screen[]> {
  const [ids] = await query<{ building: string; panel: string; circuit: string; inspection: string; deficiency: string }>(
    `SELECT b.id AS building, p.id AS panel,
            (SELECT c.id FROM circuit c WHERE c.panel_id = p.id AND c.position = 28 AND c.deleted_at IS NULL) AS circuit,
            (SELECT i.id FROM inspection i WHERE i.building_id = b.id AND i.signed_at IS NULL AND i.deleted_at IS NULL ORDER BY i.id LIMIT 1) AS inspection,
            (SELECT d.id FROM deficiency d WHERE d.building_id = b.id AND d.deleted_at IS NULL ORDER BY d.id LIMIT 1) AS deficiency
       FROM building b JOIN panel p ON p.building_id = b.id AND p.tag = 'LA' AND p.deleted_at IS NULL
      WHERE b.name = 'Brackenfold Family Clinic'`,
  );
  return [
    { name: 'Buildings', sections: false, path: '/', ready: (p) => p.getByRole('button', { name: 'Building Brackenfold Family Clinic' }) },
    { name: 'a building', sections: true, path: `/buildings/${ids.building}`, ready: (p) => p.getByTestId('panel-LA') },
    { name: 'the panel schedule', sections: true, path: `/panels/${ids.panel}`, ready: (p) => p.getByTestId('position-1') },
    { name: 'a circuit', sections: true, path: `/panels/${ids.panel}/circuits/${ids.circuit}`, ready: (p) => p.getByRole('heading', { name: 'LA · 28' }) },
    {
      name: 'a reading form',
      sections: true,
      path: `/inspections/${ids.inspection}/reading?kind=torque&panelId=${ids.panel}`,
      ready: (p) => p.getByTestId('save-reading'),
    },
    { name: 'Findings', sections: true, path: '/findings', ready: (p) => p.getByTestId('priority-counts') },
    { name: 'a deficiency', sections: true, path: `/deficiencies/${ids.deficiency}`, ready: (p) => p.getByTestId('deficiency-detail') },
    { name: 'Sync', sections: true, path: '/sync', ready: (p) => p.getByTestId('sync-now') },
    { name: 'Me', sections: true, path: '/me', ready: (p) => p.getByTestId('sign-out') },
  ];
}

declare global {
  interface Window {
    axe?: { run(context: Document, options: RunOptions): Promise<AxeResults> };
  }
}

const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/**
 * Critical and serious axe findings on the page as it stands, one line per rule and element.
 * axe-core runs in the page itself (`axe.run` with its default rules, injected once per page load
 * through the DevTools protocol, which the app's Content-Security-Policy does not govern): the
 * @axe-core/playwright builder finishes every run in a blank page it opens, one to three seconds a
 * call for the same result on a page of one frame. A page with frames still goes through the builder.
 */
async function axeProblems(page: Page): Promise<string[]> {
  let result: AxeResults;
  if (page.frames().length > 1) {
    result = await new AxeBuilder({ page }).analyze();
  } else {
    if (!(await page.evaluate(() => typeof window.axe === 'object'))) await page.evaluate(AXE_SOURCE);
    result = await page.evaluate(() => window.axe!.run(document, {}));
  }
  return result.violations
    .filter((v) => v.impact === 'critical' || v.impact === 'serious')
    .flatMap((v) => v.nodes.map((n) => `${v.impact} ${v.id}: ${n.target.join(' ')} — ${n.failureSummary?.split('\n')[1]?.trim() ?? v.help}`));
}

/**
 * What is wrong with the headings on the page as a screen reader meets them (visible ones, outside
 * screens the stack has hidden), in document order: not one level-1 heading, no level 2 on a screen
 * with sections, or a level skipped going down (a 1 followed by a 3).
 */
async function headingProblems(page: Page, sections: boolean): Promise<string[]> {
  const headings = await page.evaluate(() =>
    Array.from(document.querySelectorAll<HTMLElement>('h1, h2, h3, h4, h5, h6, [role="heading"]'))
      .filter((el) => {
        const box = el.getBoundingClientRect();
        return box.width > 0 && box.height > 0 && !el.closest('[aria-hidden="true"]');
      })
      .map((el) => {
        const level = Number(el.getAttribute('aria-level') ?? (/^H([1-6])$/.exec(el.tagName)?.[1] ?? '2'));
        return { level, text: (el.textContent ?? '').trim().slice(0, 40) };
      }),
  );
  const problems: string[] = [];
  const list = headings.map((h) => `h${h.level} "${h.text}"`).join(', ') || 'none';
  const ones = headings.filter((h) => h.level === 1).length;
  if (ones !== 1) problems.push(`${ones} level-1 headings (want 1): ${list}`);
  if (sections && !headings.some((h) => h.level === 2)) problems.push(`no level-2 heading for its sections: ${list}`);
  headings.forEach((h, i) => {
    const before = i === 0 ? 0 : headings[i - 1].level;
    if (h.level > before + 1) problems.push(`heading level skipped: h${h.level} "${h.text}" after ${i === 0 ? 'the top' : `h${before}`}`);
  });
  return problems;
}

/** Text a phone cuts or jams against its edge: the page title's left edge, placeholders wider than their field. */
async function cutText(page: Page): Promise<string[]> {
  return page.evaluate((edge) => {
    const cut: string[] = [];
    const shown = (el: HTMLElement) => {
      const box = el.getBoundingClientRect();
      return box.width > 0 && box.height > 0 && !el.closest('[aria-hidden="true"]');
    };
    const title = Array.from(document.querySelectorAll<HTMLElement>('h1, [role="heading"][aria-level="1"]')).find(shown);
    if (title && title.getBoundingClientRect().left < edge) {
      cut.push(`title "${title.textContent}" starts ${Math.round(title.getBoundingClientRect().left)} px from the screen's edge (want ≥ ${edge})`);
    }
    const ruler = document.createElement('canvas').getContext('2d');
    for (const field of Array.from(document.querySelectorAll<HTMLInputElement | HTMLTextAreaElement>('input[placeholder], textarea[placeholder]'))) {
      if (!ruler || !shown(field) || field.value !== '') continue;
      const style = getComputedStyle(field);
      ruler.font = `${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
      const room = field.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight);
      // a textarea wraps its placeholder; only a one-line field cuts it
      if (field.tagName === 'INPUT' && ruler.measureText(field.placeholder).width > room + 0.5) {
        cut.push(`placeholder "${field.placeholder}" is wider than its field (${Math.round(room)} px): its end is cut off`);
      }
    }
    return cut;
  }, 12);
}

/** Controls a thumb must hit that are smaller than 44×44 px (visible ones only). */
async function smallTargets(page: Page): Promise<string[]> {
  return page.evaluate((min) => {
    const selector = 'a[href], button, [role="button"], [role="link"], [role="radio"], [role="checkbox"], [role="tab"], input[type="date"]';
    const small: string[] = [];
    for (const el of Array.from(document.querySelectorAll<HTMLElement>(selector))) {
      const box = el.getBoundingClientRect();
      const style = getComputedStyle(el);
      if (box.width === 0 || box.height === 0 || style.visibility === 'hidden') continue;
      // a control inside a hidden screen of the stack is not there for the user
      if (el.closest('[aria-hidden="true"]')) continue;
      if (box.width < min - 0.5 || box.height < min - 0.5) {
        const name = el.getAttribute('aria-label') ?? el.textContent?.trim().slice(0, 40) ?? el.tagName;
        small.push(`${name}: ${Math.round(box.width)}×${Math.round(box.height)}`);
      }
    }
    return small;
  }, 44);
}

const SCHEMES = ['light', 'dark'] as const;
type Scheme = (typeof SCHEMES)[number];

/**
 * Both themes on each screen: the page is loaded once and the browser's `prefers-color-scheme`
 * switched under it, which the app follows at once as a user's phone does (on the web every colour
 * is a CSS variable, components/ui/theme.ts). The <html> element says which theme it shows.
 */
async function inEachScheme(page: Page, check: (scheme: Scheme) => Promise<void>): Promise<void> {
  for (const scheme of SCHEMES) {
    await page.emulateMedia({ colorScheme: scheme });
    await expect(page.locator('html')).toHaveAttribute('data-theme', scheme);
    await check(scheme);
  }
}

test('main screens in the light and dark themes: no critical or serious axe finding, every target ≥ 44 px', async ({ browser }) => {
  // ten screens, each read whole by axe twice: about 75 s on a quiet machine, far longer on a busy one
  test.setTimeout(900_000);
  const context = await browser.newContext({ colorScheme: 'light' });
  const page = await context.newPage();
  const report: Record<Scheme, string[]> = { light: [], dark: [] };
  const problems: string[] = [];
  const check = (screen: string, sections: boolean) => async (scheme: Scheme) => {
    const axe = await axeProblems(page);
    const small = await smallTargets(page);
    const headings = await headingProblems(page, sections);
    const cut = await cutText(page);
    report[scheme].push(
      `${screen}: ${axe.length} critical/serious axe finding(s), ${small.length} target(s) under 44 px, ${headings.length} heading problem(s), ${cut.length} cut text(s)`,
    );
    problems.push(
      ...axe.map((p) => `${scheme} · ${screen} · ${p}`),
      ...small.map((s) => `${scheme} · ${screen} · small target ${s}`),
      ...headings.map((h) => `${scheme} · ${screen} · ${h}`),
      ...cut.map((c) => `${scheme} · ${screen} · ${c}`),
    );
    await page.screenshot({ path: `${ARTIFACTS}/a11y-${scheme}-${screen.replace(/\W+/g, '-')}.png`, fullPage: true });
  };

  await page.goto('/');
  await expect(page.getByTestId('sign-in-submit')).toBeVisible();
  // the checker itself: a nameless button and grey on grey are found, then taken away again
  await page.evaluate(() => {
    const canary = document.createElement('div');
    canary.id = 'axe-canary';
    canary.innerHTML = '<button></button><p style="color:#777;background:#888">Grey on grey</p>';
    document.querySelector('main')?.append(canary);
  });
  const found = (await axeProblems(page)).join('\n');
  expect(found).toContain('critical button-name');
  expect(found).toContain('serious color-contrast');
  await page.evaluate(() => document.getElementById('axe-canary')?.remove());
  await inEachScheme(page, check('sign-in', false));
  // the electrician edits circuits and records readings: the screens with the most controls
  await page.getByTestId('sign-in-email').fill('electrician@ampwright.test');
  await page.getByTestId('sign-in-password').fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await expect(page.getByText('Brackenfold Family Clinic')).toBeVisible();
  await expect(page.getByRole('navigation', { name: 'Sections' })).toBeVisible();

  for (const screen of await screens()) {
    await page.goto(screen.path);
    await expect(screen.ready(page).first()).toBeVisible({ timeout: 20_000 });
    await inEachScheme(page, check(screen.name, screen.sections));
    // landmarks: the screen's body is the main one; on a phone the tab bar (when shown) is the navigation
    if ((await page.getByRole('main').filter({ visible: true }).count()) === 0) problems.push(`${screen.name} · no main landmark`);
  }
  for (const scheme of SCHEMES) {
    const own = problems.filter((p) => p.startsWith(`${scheme} · `));
    writeFileSync(`${ARTIFACTS}/a11y-${scheme}.txt`, [...report[scheme], '', ...own].join('\n') + '\n');
  }
  await context.close();
  expect(problems, [...report.light, ...report.dark].join('\n')).toEqual([]);
});

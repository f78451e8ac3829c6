import { expect, test, type Page } from '@playwright/test';
import { openPanel, signIn } from './helpers';

/**
 * Every schedule row holds its own content: nothing sticks out of a row, no row covers the next,
 * and no text is cut short. Long warnings (the demo's LA 27 and 31 carry two) must make the row
 * taller, not spill over the row below or stop mid-sentence.
 */
async function scheduleProblems(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const problems: string[] = [];
    const rows = Array.from(document.querySelectorAll<HTMLElement>('[data-testid^="position-"]'));
    if (rows.length === 0) return ['no schedule rows on the page'];
    const boxes = rows.map((row) => ({ id: row.dataset.testid ?? '?', box: row.getBoundingClientRect(), row }));
    for (const { id, box, row } of boxes) {
      for (const child of Array.from(row.querySelectorAll<HTMLElement>('*'))) {
        const b = child.getBoundingClientRect();
        if (b.width === 0 && b.height === 0) continue;
        const out = b.left < box.left - 1 || b.right > box.right + 1 || b.top < box.top - 1 || b.bottom > box.bottom + 1;
        if (out) problems.push(`${id}: "${(child.textContent ?? '').slice(0, 60)}" sticks out of its row`);
        // text cut short: a clamped or fixed-height text box holds more than it shows
        const ownText = Array.from(child.childNodes).some((n) => n.nodeType === Node.TEXT_NODE && (n.textContent ?? '').trim() !== '');
        if (ownText && child.scrollHeight > child.clientHeight + 1) {
          problems.push(`${id}: "${(child.textContent ?? '').slice(0, 60)}" is cut short (${child.scrollHeight} px of text in ${child.clientHeight} px)`);
        }
      }
    }
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i].box;
        const b = boxes[j].box;
        const w = Math.min(a.right, b.right) - Math.max(a.left, b.left);
        const h = Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top);
        if (w > 1 && h > 1) problems.push(`${boxes[i].id} and ${boxes[j].id} overlap by ${Math.round(h)} px`);
      }
    }
    return problems;
  });
}

for (const width of [390, 1024, 1280]) {
  test(`schedule rows grow to their content at ${width} px (demo panels LA and LB)`, async ({ page }) => {
    await page.setViewportSize({ width, height: 900 });
    await signIn(page, 'electrician');
    await openPanel(page, 'Brackenfold Family Clinic', 'LA');
    // the demo's LA 27 carries two warnings: the long first one must show whole
    await expect(page.getByTestId('position-27').getByTestId('circuit-warning')).toBeVisible();
    expect(await scheduleProblems(page)).toEqual([]);
    await page.goBack();
    await page.getByTestId('panel-LB').click();
    await expect(page.getByTestId('position-1')).toBeVisible();
    expect(await scheduleProblems(page)).toEqual([]);
  });
}

/**
 * Part (d) of `npm run bench:sync`: in headless Chromium, the time from a reload with the network
 * off to the first rendered schedule of a building already on the device, and the size of the
 * persisted cache. Needs the web build in dist/ (npm start or npm test makes it).
 */
import { chromium, type Page } from '@playwright/test';
import { MARKS } from '../lib/perf-mark';

/** Debian's Chromium, headless, as the browser suite runs it (playwright.config.ts). */
export function launchChromium() {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** What the app keeps in IndexedDB (its `ampwright` store): all values, and the largest one. */
export async function storedBytes(page: Page): Promise<{ total: number; largest: number }> {
  return page.evaluate(async () => {
    const db: IDBDatabase = await new Promise((resolve, reject) => {
      const req = indexedDB.open('ampwright');
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error);
    });
    const values: unknown[] = await new Promise((resolve) => {
      const req = db.transaction('kv').objectStore('kv').getAll();
      req.onsuccess = () => resolve(req.result);
    });
    db.close();
    const bytes = values.map((v) => (typeof v === 'string' ? new Blob([v]).size : 0));
    return { total: bytes.reduce((a, b) => a + b, 0), largest: Math.max(0, ...bytes) };
  });
}

/**
 * Reloads the page (offline, in these benches) and answers the milliseconds from the reload to the
 * schedule's first render, read from the mark the page sets itself (lib/perf-mark.ts). Waiting with
 * a locator instead polls the page's DOM in the same slowed renderer: that work landed in the
 * figure (BENCH_OFFLINE_WAIT=locator measures that way, for comparison).
 */
export async function offlineReloadMs(page: Page, timeout: number): Promise<number> {
  const started = Date.now();
  await page.reload({ waitUntil: 'commit' });
  if (process.env.BENCH_OFFLINE_WAIT === 'locator') {
    await page.getByTestId('position-1').waitFor({ timeout });
    return Date.now() - started;
  }
  const shown = await page.waitForFunction(
    (name) => {
      const mark = performance.getEntriesByName(name, 'mark')[0];
      return mark ? performance.timeOrigin + mark.startTime : 0;
    },
    MARKS.scheduleShown,
    { polling: 250, timeout },
  );
  const shownAt = (await shown.jsonValue()) as number;
  // the mark is the schedule's: its first position is there
  await page.getByTestId('position-1').waitFor({ timeout });
  return Math.round(shownAt - started);
}

export interface OfflineOpenResult {
  /** reload → first position of the schedule visible, per run */
  runsMs: number[];
  medianMs: number;
  /** bytes of the persisted cache (the building copy, the session, the queue) in IndexedDB */
  cacheBytes: number;
}

export async function benchOfflineOpen(opts: {
  baseUrl: string;
  email: string;
  password: string;
  panelPath: string;
  runs?: number;
}): Promise<OfflineOpenResult> {
  const browser = await launchChromium();
  try {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await page.goto(opts.baseUrl);
    await page.getByTestId('sign-in-email').fill(opts.email);
    await page.getByTestId('sign-in-password').fill(opts.password);
    await page.getByTestId('sign-in-submit').click();
    await page.getByTestId('sync-status').filter({ visible: true }).first().waitFor({ timeout: 60_000 });
    await page.goto(opts.baseUrl + opts.panelPath);
    await page.getByTestId('position-1').waitFor({ timeout: 60_000 });
    await page.waitForSelector('html[data-offline-ready="true"]', { state: 'attached', timeout: 30_000 });
    // let the throttled save of the pulled copy land
    await page.waitForTimeout(1500);
    await context.setOffline(true);
    const runsMs: number[] = [];
    for (let i = 0; i < (opts.runs ?? 5); i++) {
      runsMs.push(await offlineReloadMs(page, 30_000));
    }
    const { total: cacheBytes } = await storedBytes(page);
    const sorted = [...runsMs].sort((a, b) => a - b);
    return { runsMs, medianMs: sorted[Math.floor(sorted.length / 2)], cacheBytes };
  } finally {
    await browser.close();
  }
}

/**
 * Part (d) of `npm run bench:sync`: in headless Chromium, the time from a reload with the network
 * off to the first rendered schedule of a building already on the device, and the size of the
 * persisted cache. Needs the web build in dist/ (npm start or npm test makes it).
 */
import { chromium, type Page } from '@playwright/test';

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
      const started = Date.now();
      await page.reload({ waitUntil: 'commit' });
      await page.getByTestId('position-1').waitFor({ timeout: 30_000 });
      runsMs.push(Date.now() - started);
    }
    const { total: cacheBytes } = await storedBytes(page);
    const sorted = [...runsMs].sort((a, b) => a - b);
    return { runsMs, medianMs: sorted[Math.floor(sorted.length / 2)], cacheBytes };
  } finally {
    await browser.close();
  }
}

import { defineConfig } from '@playwright/test';

/** Browser tests drive Debian's Chromium (never a downloaded browser) against the served web build. */
export default defineConfig({
  testDir: 'tests/e2e',
  // the screenshots of every main screen (about 6 minutes) are taken on request, to keep npm test
  // under 10 minutes: `npm run test:screens`
  testIgnore: process.env.AMPWRIGHT_SCREENS === '1' ? [] : ['**/screens.spec.ts'],
  outputDir: 'test-results',
  // ceilings, not waits: a check passes the moment it holds. They are set for a loaded two-core
  // machine (the suite run three times beside other builds and suites, with a load of 20–34),
  // where a sign-in and first pull took over 10 s and failed tests that were right
  timeout: 180_000,
  expect: { timeout: 30_000 },
  workers: 1,
  retries: 0,
  reporter: [['list']],
  use: {
    baseURL: process.env.E2E_BASE_URL ?? 'http://127.0.0.1:8090',
    viewport: { width: 390, height: 844 },
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    },
    trace: 'off',
  },
});

import { defineConfig } from '@playwright/test';

// Debian's Chromium, headless; never a browser download. `npm test` starts the server and sets BASE_URL.
export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'tests/artifacts/results',
  timeout: 60_000,
  fullyParallel: false,
  workers: 1,
  retries: 0,
  reporter: [['list'], ['json']],
  // The shop-mode spec needs a server in shop mode on an empty database (`npm test` starts one: SHOP_BASE_URL);
  // every other spec runs against the demo server.
  projects: [
    { name: 'demo', testIgnore: /shop-mode\.spec\.ts$/ },
    ...(process.env.SHOP_BASE_URL ? [{ name: 'shop', testMatch: /shop-mode\.spec\.ts$/, use: { baseURL: process.env.SHOP_BASE_URL } }] : []),
  ],
  use: {
    baseURL: process.env.BASE_URL ?? 'http://127.0.0.1:5180',
    screenshot: 'on',
    trace: 'retain-on-failure',
    viewport: { width: 1280, height: 800 },
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
  },
});

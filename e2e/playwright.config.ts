import { defineConfig } from '@playwright/test';

/** Debian's Chromium; test tools' own browser downloads do not work on our machines. */
export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
/** Flags that keep Chromium from reaching out to the network on a closed machine. */
export const CHROME_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
export const PORT = Number(process.env.E2E_PORT ?? 4173);
export const BASE_URL = `http://localhost:${PORT}`;
/** A phone: 390×844 CSS px, touch. */
export const PHONE = {
  viewport: { width: 390, height: 844 },
  deviceScaleFactor: 2,
  isMobile: true,
  hasTouch: true,
};

export default defineConfig({
  testDir: '.',
  testMatch: '**/*.spec.ts',
  testIgnore: 'bench/**',
  timeout: 60_000,
  workers: 1,
  retries: 0,
  forbidOnly: !!process.env.CI,
  reporter: [['list'], ['json', { outputFile: '../test-results/e2e.json' }]],
  outputDir: '../test-results/pw',
  use: {
    baseURL: BASE_URL,
    headless: true,
    ...PHONE,
    launchOptions: { executablePath: CHROMIUM, args: CHROME_ARGS },
  },
  webServer: {
    command: `npx vite preview --port ${PORT} --strictPort`,
    url: BASE_URL,
    reuseExistingServer: !process.env.CI,
    timeout: 30_000,
    cwd: '..',
  },
});

import { defineConfig, devices } from '@playwright/test'
import { CHROMIUM } from './tests/support/chromium'

// Playwright drives Debian's Chromium (Playwright's own browser download cannot run here)
// against the built server that scripts/test.sh starts on BASE_URL.
export default defineConfig({
  testDir: 'tests/e2e',
  timeout: 60_000,
  expect: { timeout: 10_000 },
  fullyParallel: false,
  workers: 1,
  retries: 0,
  reporter: [['list']],
  outputDir: 'test-results',
  use: {
    baseURL: process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100',
    ...devices['Desktop Chrome'],
    viewport: { width: 1024, height: 768 },
    hasTouch: true,
    launchOptions: CHROMIUM,
    screenshot: 'only-on-failure',
  },
})

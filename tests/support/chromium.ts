// Debian's Chromium as the browser tests and the browser benches launch it (Playwright's own
// browser download cannot run here): no sandbox (root in CI), no GPU, nothing fetched in the
// background.
export const CHROMIUM = {
  executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
  args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-quic', '--no-first-run'],
}

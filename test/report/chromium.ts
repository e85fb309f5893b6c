/** The system Chromium for unit tests that open a page (report HTML, chart SVG), launched as the browser tests launch it. */
import { existsSync } from 'node:fs';
import { afterAll, beforeAll } from 'vitest';
import { chromium, type Browser } from 'playwright-core';

/** Where Chromium is installed (TALLYWISE_CHROMIUM, else Debian's paths), or undefined: tests that need it are skipped. */
export const browserPath = [process.env['TALLYWISE_CHROMIUM'], '/usr/bin/chromium', '/usr/bin/chromium-browser'].find((p): p is string => !!p && existsSync(p));

export function launchChromium(path: string): Promise<Browser> {
  return chromium.launch({ executablePath: path, headless: true, args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] });
}

/** One Chromium for the test file, launched before its tests and closed after them (when installed); call at the top level. */
export function chromiumForFile(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    if (browserPath) browser = await launchChromium(browserPath);
  }, 60_000);
  afterAll(async () => browser?.close());
  return () => {
    if (!browser) throw new Error('Chromium is not running: install it (apt-get install -y chromium) or set TALLYWISE_CHROMIUM.');
    return browser;
  };
}

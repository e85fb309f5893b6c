import { existsSync, mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { bridgeGlobal, channels, type HostCommand, type JobProgress } from '@shared/host/contract';
import { dispatchHostCall } from '@shared/host/dispatch';
import { createHostServices } from '../../src-main/services/host-services';
import type { DialogPort, HostEnvironment } from '../../src-main/services/ports';
import { serveFolder } from './static-server';

/**
 * Runs the built renderer in Debian's Chromium with the host bridge wired to
 * the real main-process services in this Node process. Only the transport
 * differs from the desktop app: an exposed binding instead of Electron IPC.
 */

export const root = resolve(__dirname, '../..');
export const outputDir = join(root, 'test-output', 'e2e');

export function chromiumPath(): string {
  const candidates = [process.env['TALLYWISE_CHROMIUM'], '/usr/bin/chromium', '/usr/bin/chromium-browser'].filter(Boolean) as string[];
  const found = candidates.find((p) => existsSync(p));
  if (!found) throw new Error('Chromium is not installed: run `apt-get install -y chromium` (or set TALLYWISE_CHROMIUM).');
  return found;
}

/** Answers to dialogs, queued by a test; an empty queue answers "cancelled". */
export class ScriptedDialogs implements DialogPort {
  readonly opens: (string | null)[] = [];
  readonly saves: (string | null)[] = [];
  async chooseOpen(): Promise<string | null> {
    return this.opens.shift() ?? null;
  }
  async chooseSave(): Promise<string | null> {
    return this.saves.shift() ?? null;
  }
  readonly folders: (string | null)[] = [];
  async chooseFolder(): Promise<string | null> {
    return this.folders.shift() ?? null;
  }
}

export interface AppSession {
  page: Page;
  dialogs: ScriptedDialogs;
  consoleErrors: string[];
  /** Sends a host command, as a menu item would. */
  command(c: HostCommand): Promise<void>;
  screenshot(name: string): Promise<string>;
  close(): Promise<void>;
}

let browser: Browser | null = null;

async function sharedBrowser(): Promise<Browser> {
  if (browser) return browser;
  browser = await chromium.launch({
    executablePath: chromiumPath(),
    headless: true,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-quic'],
  });
  return browser;
}

export async function closeBrowser(): Promise<void> {
  await browser?.close();
  browser = null;
}

export async function openApp(opts: { width?: number; height?: number; scale?: number; env?: Partial<HostEnvironment> } = {}): Promise<AppSession> {
  const rendererDir = join(root, 'out', 'renderer');
  if (!existsSync(join(rendererDir, 'index.html'))) throw new Error('The renderer is not built: run `npm run build` first.');
  const server = await serveFolder(rendererDir);
  const dialogs = new ScriptedDialogs();
  const userDataDir = mkdtempSync(join(tmpdir(), 'tallywise-e2e-'));
  // Jobs' progress goes to the page as Electron's webContents.send would carry it (once the page exists).
  let page: Page | null = null;
  const progress = (event: JobProgress) => void page?.evaluate((e) => (window as unknown as { __tallywiseProgress(e: unknown): void }).__tallywiseProgress(e), event).catch(() => undefined);
  const services = createHostServices({
    appName: 'Tallywise',
    appVersion: '0.0.0-test',
    platform: process.platform,
    userDataDir,
    dialogs,
    shell: { reveal: async () => true },
    progress,
    ...opts.env,
  });
  const b = await sharedBrowser();
  const context: BrowserContext = await b.newContext({ viewport: { width: opts.width ?? 1366, height: opts.height ?? 768 }, deviceScaleFactor: opts.scale ?? 1 });
  page = await context.newPage();
  const consoleErrors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') consoleErrors.push(m.text());
  });
  page.on('pageerror', (e) => consoleErrors.push(String(e)));
  await page.exposeBinding('__tallywiseCall', (_source, channel: string, input: unknown) => dispatchHostCall(services, channel, input));
  await page.addInitScript(
    ({ names, global }) => {
      const listeners = new Set<(c: string) => void>();
      const bridge: Record<string, unknown> = {};
      const w = window as unknown as Record<string, unknown>;
      for (const name of names) bridge[name] = (input: unknown) => (w['__tallywiseCall'] as (c: string, i: unknown) => Promise<unknown>)(name, input);
      bridge['onCommand'] = (l: (c: string) => void) => {
        listeners.add(l);
        return () => listeners.delete(l);
      };
      w['__tallywiseEmit'] = (c: string) => listeners.forEach((l) => l(c));
      const progressListeners = new Set<(p: unknown) => void>();
      bridge['onProgress'] = (l: (p: unknown) => void) => {
        progressListeners.add(l);
        return () => progressListeners.delete(l);
      };
      w['__tallywiseProgress'] = (p: unknown) => progressListeners.forEach((l) => l(p));
      w[global] = Object.freeze(bridge);
    },
    { names: channels as string[], global: bridgeGlobal },
  );
  await page.goto(server.url);
  mkdirSync(outputDir, { recursive: true });
  return {
    page,
    dialogs,
    consoleErrors,
    command: (c) => page.evaluate((cmd) => (window as unknown as { __tallywiseEmit(c: string): void }).__tallywiseEmit(cmd), c),
    async screenshot(name) {
      const file = join(outputDir, `${name}.png`);
      await page.screenshot({ path: file, fullPage: false });
      return file;
    },
    async close() {
      await context.close();
      await server.close();
    },
  };
}

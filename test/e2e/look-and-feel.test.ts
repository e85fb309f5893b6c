import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { closeBrowser, openApp, type AppSession } from './harness';
import { fitDistribution, leaveOutRowsWithoutOffset } from './models-steps';
import { focusedOf, inViewport, overflowOf, tabThrough, tabTo } from './layout-probe';

// The whole app from the keyboard, on a small laptop screen (1366 x 768) and
// on a 4K screen (3840 x 2160 physical pixels: a 1920 x 1080 viewport at
// device scale 2) and a 2560 x 1440 viewport at scale 1. On every stage: a
// screenshot, no horizontal scrolling of the page or the stage and nothing
// sticking out of it, the main controls on screen, Tab reaching the main
// actions in order with a visible focus ring, and Escape closing a dialog.
// The stage rail is worked with the arrow keys and Enter, the records grid
// with the arrow keys and Space.

afterAll(closeBrowser);

const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;

const screens = [
  { name: '1366x768', width: 1366, height: 768, scale: 1 },
  { name: '4k', width: 1920, height: 1080, scale: 2 },
  { name: '2560x1440', width: 2560, height: 1440, scale: 1 },
];

async function expectNoOverflow(page: Page): Promise<void> {
  const o = await overflowOf(page);
  expect(o.page.scrollWidth).toBeLessThanOrEqual(o.page.clientWidth);
  expect(o.stage.scrollWidth).toBeLessThanOrEqual(o.stage.clientWidth);
  expect(o.cutOff).toEqual([]);
}

const rail = (page: Page, stage: string) => page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: stage });

/** Focus one stage button on the rail, then Up/Down to `target`, then Enter. */
async function goByRail(page: Page, target: string): Promise<void> {
  await rail(page, 'Programme').focus();
  for (let i = 0; i < 4 && (await focusedOf(page)).name !== `${['Programme', 'Records', 'Models', 'Report'].indexOf(target) + 1}${target}`; i++) await page.keyboard.press('ArrowDown');
  const f = await focusedOf(page);
  expect(f.name).toBe(`${['Programme', 'Records', 'Models', 'Report'].indexOf(target) + 1}${target}`);
  expect(f.ringed).toBe(true);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 1, name: target }).waitFor({ timeout: 60_000 });
}

async function programmeStage(app: AppSession, shot: string): Promise<void> {
  const { page } = app;
  await page.getByTestId('count-sites').waitFor({ timeout: 30_000 });
  await app.screenshot(`${shot}-programme`);
  await expectNoOverflow(page);
  // From the top of the page: the skip link, then the four stages in order, each with its ring.
  await page.locator('body').focus();
  const order = await tabThrough(page, 5);
  expect(order.map((f) => f.name)).toEqual(['Skip to the stage', '1Programme', '2Records', '3Models', '4Report']);
  for (const f of order.slice(1)) expect(f.ringed && f.inView).toBe(true);
  // The rail wraps with the arrow keys: Up from the first stage is the last.
  await rail(page, 'Programme').focus();
  await page.keyboard.press('ArrowUp');
  await expect(focusedOf(page).then((f) => f.name)).resolves.toBe('4Report');
  await page.keyboard.press('Home');
  await expect(focusedOf(page).then((f) => f.name)).resolves.toBe('1Programme');
}

async function recordsStage(app: AppSession, shot: string): Promise<void> {
  const { page } = app;
  await app.command('open-demo');
  await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
  await goByRail(page, 'Records');
  const grid = page.getByTestId('records-grid');
  await grid.locator('.ag-row .ag-cell[col-id="site"]').first().waitFor({ timeout: 30_000 });
  await app.screenshot(`${shot}-records`);
  await expectNoOverflow(page);
  for (const c of [grid, page.getByRole('tab', { name: /Findings/ }), page.getByRole('button', { name: /Import another workbook/ }), page.getByLabel('Filter by flag')]) await expect(inViewport(page, c)).resolves.toBe(true);

  // Tab from the rail: the filters come before the grid, and the grid takes the focus (its header first).
  await rail(page, 'Records').focus();
  const filter = await tabTo(page, /^Filter by flag$/, 30);
  expect(filter.ringed).toBe(true);
  let inGrid = false;
  for (let i = 0; i < 30 && !inGrid; i++) {
    await page.keyboard.press('Tab');
    inGrid = await page.evaluate(() => !!document.activeElement?.closest('[data-testid="records-grid"]'));
  }
  expect(inGrid).toBe(true);
  // Down to the first record, then Space ticks it; the grid draws its own focus ring on the cell.
  await page.keyboard.press('ArrowDown');
  await expect(page.evaluate(() => !!document.activeElement?.closest('.ag-row'))).resolves.toBe(true);
  await page.keyboard.press('Space');
  await expect.poll(() => grid.locator('.ag-row-selected').count()).toBeGreaterThan(0);
  await app.screenshot(`${shot}-records-keyboard`);
  // Right to the site cell, Enter opens its editor, Escape leaves it unchanged.
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('ArrowRight');
  await expect(page.evaluate(() => document.activeElement?.closest('.ag-cell')?.getAttribute('col-id'))).resolves.toBe('site');
  await page.keyboard.press('Enter');
  await expect.poll(() => grid.locator('.ag-cell-inline-editing').count()).toBe(1);
  await page.keyboard.press('Escape');
  await expect.poll(() => grid.locator('.ag-cell-inline-editing').count()).toBe(0);
  await expect.poll(() => page.getByTestId('records-summary').textContent()).toMatch(/0 changes in effect/);

  // The findings list is reached with Tab after its filters; the ring shows inside the card.
  await page.getByRole('tab', { name: /Findings/ }).focus();
  const show = await tabTo(page, /^Show \d+ records$/, 20);
  expect(show.ringed && show.inView).toBe(true);
  await app.screenshot(`${shot}-records-findings-focus`);
  // The side panel's tabs go along with Left and Right.
  await page.getByRole('tab', { name: /Findings/ }).focus();
  await page.keyboard.press('ArrowRight');
  await expect.poll(() => page.getByRole('tab', { name: /Changes/ }).getAttribute('aria-selected')).toBe('true');
  await page.keyboard.press('ArrowLeft');
  await expect.poll(() => page.getByRole('tab', { name: /Findings/ }).getAttribute('aria-selected')).toBe('true');

  // A dialog from the keyboard: the focus goes into it, Tab stays in it, Escape closes it and gives the focus back.
  const leaveOut = page.getByRole('button', { name: 'Leave out…' });
  await leaveOut.focus();
  await page.keyboard.press('Enter');
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  await app.screenshot(`${shot}-records-dialog`);
  await expect(page.evaluate(() => !!document.activeElement?.closest('[role="dialog"]'))).resolves.toBe(true);
  for (const _ of [1, 2, 3, 4]) await page.keyboard.press('Tab');
  await expect(page.evaluate(() => !!document.activeElement?.closest('[role="dialog"]'))).resolves.toBe(true);
  await page.keyboard.press('Escape');
  await expect.poll(() => dialog.count()).toBe(0);
  await expect(focusedOf(page).then((f) => f.name)).resolves.toBe('Leave out…');
}

async function modelsStage(app: AppSession, shot: string): Promise<void> {
  const { page } = app;
  await goByRail(page, 'Models');
  await page.getByTestId('models-summary').waitFor();
  // The species box and the distribution from the keyboard.
  const species = page.getByRole('checkbox', { name: toad.label, exact: true });
  await species.focus();
  await page.keyboard.press('Space');
  await expect.poll(() => species.isChecked()).toBe(true);
  await leaveOutRowsWithoutOffset(page);
  // The model written out and the Fit button are on screen without scrolling the builder.
  await expect(inViewport(page, page.getByTestId('model-equation'))).resolves.toBe(true);
  await expect(inViewport(page, page.getByTestId('fit-button'))).resolves.toBe(true);
  await app.screenshot(`${shot}-models-builder`);
  await expectNoOverflow(page);

  // Tab from the rail runs through the builder in reading order and reaches Fit.
  await rail(page, 'Models').focus();
  const names: string[] = [];
  for (let i = 0; i < 80 && names[names.length - 1] !== 'Fit the model'; i++) {
    await page.keyboard.press('Tab');
    const f = await focusedOf(page);
    if (f.tag !== 'body') expect(f.ringed, `focus ring on ${f.name}`).toBe(true);
    names.push(f.name);
  }
  const at = (n: string | RegExp) => names.findIndex((x) => (typeof n === 'string' ? x === n : n.test(x)));
  expect(at(/All species/)).toBeGreaterThan(-1);
  expect(at(/All species/)).toBeLessThan(at('Distribution'));
  expect(at('Distribution')).toBeLessThan(at('Fit the model'));
  await app.screenshot(`${shot}-models-fit-focused`);

  await fitDistribution(page, 'poisson', 1);
  await fitDistribution(page, 'negbin', 2);
  await app.screenshot(`${shot}-models-compare`);
  await expectNoOverflow(page);
  for (const c of [page.getByTestId('comparison').locator('thead'), page.getByRole('tab', { name: new RegExp(`^${toad.label}`) })]) await expect(inViewport(page, c)).resolves.toBe(true);
  // Every column of the comparison is in view, down to the report choice and Remove, with no scrolling of its box.
  const fits = await page.getByTestId('comparison').evaluate((t) => ({ table: t.scrollWidth, box: t.parentElement!.clientWidth }));
  expect(fits.table).toBeLessThanOrEqual(fits.box);
  // The species tabs answer Left/Right too (one species here: it stays shown).
  const speciesTab = page.getByRole('tab', { name: new RegExp(`^${toad.label}`) });
  await speciesTab.focus();
  await page.keyboard.press('ArrowRight');
  await expect.poll(() => speciesTab.getAttribute('aria-selected')).toBe('true');
  // Choosing the model for the report from the keyboard: the radio of the negative binomial row.
  const use = page.getByRole('radio', { name: /Use "Negative binomial/ });
  await use.focus();
  await page.keyboard.press('Space');
  await expect.poll(() => use.isChecked()).toBe(true);

  await page.getByTestId('coefficients').scrollIntoViewIfNeeded();
  await app.screenshot(`${shot}-models-coefficients`);
  const residuals = page.getByTestId('chart-residuals');
  await residuals.waitFor({ timeout: 120_000 });
  await residuals.scrollIntoViewIfNeeded();
  await app.screenshot(`${shot}-models-charts`);
  await expectNoOverflow(page);
  // Each chart fits its panel.
  const charts = await page.locator('.chart').evaluateAll((els) => els.map((e) => ({ panel: e.clientWidth, canvas: (e.querySelector('canvas') as HTMLCanvasElement | null)?.getBoundingClientRect().width ?? 0 })));
  expect(charts.length).toBeGreaterThan(3);
  for (const c of charts) expect(c.canvas).toBeLessThanOrEqual(c.panel);
  // A chart point is not the only way to its records: the keyboard route is written beside the charts.
  await expect.poll(() => page.getByTestId('keyboard-route').textContent()).toMatch(/Records stage/);
}

async function reportStage(app: AppSession, shot: string): Promise<void> {
  const { page } = app;
  await goByRail(page, 'Report');
  await app.screenshot(`${shot}-report`);
  await expectNoOverflow(page);
  const choose = page.getByRole('button', { name: 'Choose folder…' });
  await expect(inViewport(page, choose)).resolves.toBe(true);
  await rail(page, 'Report').focus();
  const f = await tabTo(page, /^Choose folder…$/, 30);
  expect(f.ringed).toBe(true);
}

describe('look and feel from the keyboard on a small and a very large screen', () => {
  for (const s of screens) {
    it(`works every stage by keyboard at ${s.name}`, async () => {
      const app = await openApp({ width: s.width, height: s.height, scale: s.scale });
      const shot = `look-${s.name}`;
      try {
        await programmeStage(app, shot);
        await recordsStage(app, shot);
        await modelsStage(app, shot);
        await reportStage(app, shot);
        expect(app.consoleErrors).toEqual([]);
      } finally {
        await app.close();
      }
    }, 600_000);
  }
});

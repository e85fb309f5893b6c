import { afterAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp } from './harness';
import { openDemoModels } from './demo-models';
import { DEMO_TRUTH } from '@shared/demo/truth';

// Building a model in the Models stage of the demo programme: a factor, a
// number, their interaction and a smooth season curve; the model typeset as
// an equation (KaTeX, with its fonts served under the page's content
// security policy); a spec check that refuses a curve with more degrees of
// freedom than there are seasons; then the fit. The number of seasons comes
// from the demo's definition (src-shared/demo/truth.ts).

afterAll(closeBrowser);

const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;
const seasons = DEMO_TRUTH.lastSeason - DEMO_TRUTH.firstSeason + 1;

describe('the model builder', () => {
  it('builds a model with an interaction and a smooth season curve, shows it typeset, checks it and fits it', async () => {
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await openDemoModels(app, toad.label);
      await page.getByRole('checkbox', { name: /^area/ }).check();
      await page.getByRole('checkbox', { name: /leave out rows where an offset is missing/ }).check();
      await page.getByLabel('Distribution').selectOption('negbin');
      await page.getByLabel('Count part: habitat').selectOption('factor');
      await page.getByLabel('Count part: visits').selectOption('numeric');
      await page.getByLabel('Interaction: first predictor').selectOption('habitat');
      await page.getByLabel('Interaction: second predictor').selectOption('visits');
      await page.getByRole('button', { name: 'Add interaction' }).click();
      await expect.poll(() => page.getByRole('button', { name: 'Remove the interaction habitat × visits' }).count()).toBe(1);
      // The same pair cannot be added twice.
      await expect.poll(() => page.getByRole('button', { name: 'Add interaction' }).isDisabled()).toBe(true);
      await page.getByLabel('Season term').selectOption('smooth');

      // Habitat belongs to the pond: beside a fixed site effect (the default) it cannot be estimated, and the builder says so.
      const problems = page.getByTestId('spec-problems');
      await expect.poll(() => problems.textContent()).toContain(`The predictor "habitat" does not change within any site in the ${toad.label} rows, so the fixed site effect (one term per site) takes it in`);
      await expect.poll(() => page.getByTestId('fit-button').isDisabled()).toBe(true);
      await page.getByLabel('Site effect').selectOption('random');
      await expect.poll(() => problems.count()).toBe(0);

      // The model is typeset: KaTeX's HTML with its MathML beside it, no KaTeX error box.
      const equation = page.getByTestId('model-equation');
      await expect.poll(() => equation.locator('.equation-line .katex .katex-html').count()).toBeGreaterThanOrEqual(2);
      await expect.poll(() => equation.locator('.katex-error').count()).toBe(0);
      const mathText = async (selector: string) => (await equation.locator(`.equation-line ${selector}`).allTextContents()).join(' ');
      const names = await mathText('math mtext');
      for (const name of ['count', 'habitat', 'visits', 'season', 'effort', 'area', 'site']) expect(names).toContain(name);
      // NB2: the variance line has mu squared over theta; the log of the expected count is on the left.
      const identifiers = await mathText('math mi');
      expect(identifiers).toContain('θ');
      expect(identifiers).toContain('μ');
      expect(identifiers).toContain('log');
      // The random site effect: u ~ Normal(0, sigma^2).
      expect(identifiers).toContain('σ');
      expect(`${identifiers} ${await mathText('math mo')}`).toContain('Normal');
      // The symbols are explained, the smooth curve as a sum of spline basis functions with the chosen df (4 to start).
      await equation.getByText('What the symbols mean').click();
      const where = (await equation.locator('.equation-where li').allInnerTexts()).join('\n').replace(/\u00a0/g, ' ');
      expect(where).toContain('natural cubic spline with 4 degrees of freedom');
      expect(where).toContain('effort in hours (column effort_h)');
      expect(where).toMatch(/how the slope of visits differs at level/);
      // KaTeX's fonts are loaded from the app itself (font-src 'self' in index.html).
      await page.evaluate(() => document.fonts.ready);
      const loaded = await page.evaluate(() => [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family.replace(/"/g, '')));
      expect(loaded).toContain('KaTeX_Math');
      expect(loaded).toContain('KaTeX_Main');
      await app.screenshot('models-build-equation');

      // A zero-inflated model adds the zero part: its own predictors and a logit line in the equation.
      await page.getByLabel('Distribution').selectOption('zinb');
      await page.getByLabel('Zero part (chance of an extra zero): visits').selectOption('numeric');
      await expect(mathText('math mi')).resolves.toContain('logit');
      await expect(mathText('math mi')).resolves.toContain('π');
      await expect(mathText('math mi')).resolves.toContain('γ');
      await expect.poll(() => problems.textContent()).toContain('A random site effect is available only with the Poisson and negative binomial models');
      await equation.scrollIntoViewIfNeeded();
      await app.screenshot('models-build-zero-part');
      await page.getByLabel('Distribution').selectOption('negbin');
      await expect(mathText('math mi')).resolves.not.toContain('logit');

      // A curve with as many degrees of freedom as there are seasons cannot be fitted: said in plain words.
      await page.getByLabel('Degrees of freedom of the season curve').fill(String(seasons));
      await expect.poll(() => problems.textContent()).toContain(`asks for ${seasons} degrees of freedom, but the ${toad.label} rows come from only ${seasons} seasons; choose at most ${seasons - 1}`);
      await expect.poll(() => page.getByTestId('fit-button').isDisabled()).toBe(true);
      await app.screenshot('models-build-check');

      await page.getByLabel('Degrees of freedom of the season curve').fill('4');
      await expect.poll(() => problems.count()).toBe(0);
      await page.getByTestId('fit-button').click();
      const row = page.getByTestId('comparison').locator('tbody tr');
      await row.first().waitFor({ timeout: 120_000 });
      await expect.poll(() => row.first().textContent()).toContain('habitat + visits + habitat × visits + smooth season (4 df), site random (9 pts)');
      // The fit has the interaction's columns and the four spline columns (engine names, src-shared/engine/design/build.ts).
      const result = (await page.getByTestId('model-result').textContent()) ?? '';
      expect(result).toMatch(/habitat=[^&]+ & visits/);
      for (let j = 1; j <= 4; j++) expect(result).toContain(`season[ns${j}]`);
      await app.screenshot('models-build-fitted');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});

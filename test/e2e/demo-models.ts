import type { AppSession } from './harness';

/**
 * Opens the demo programme and goes to the Models stage with one species
 * ticked: the start of every browser test of the model builder.
 */
export async function openDemoModels(app: AppSession, species: string): Promise<void> {
  const { page } = app;
  await app.command('open-demo');
  await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
  await page.getByRole('button', { name: 'Models' }).click();
  await page.getByTestId('models-summary').waitFor();
  await page.getByRole('checkbox', { name: species, exact: true }).check();
}

import { afterAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp } from './harness';
import { demoOverview } from '../../src-main/services/demo-overview';
import { buildDemo } from '@shared/demo/build';
import { DEFAULT_DEMO_SEED } from '@shared/demo/truth';

// The demo command opens every season workbook as one project. The expected
// record count comes from the demo's own simulation (visit records before any
// mess) plus one record per species for each row the generator duplicated.

afterAll(closeBrowser);

describe('the demo project', () => {
  it('opens all season workbooks on the Records stage with their planted problems flagged', async () => {
    const overview = await demoOverview();
    const { planted } = buildDemo(DEFAULT_DEMO_SEED);
    const duplicated = planted.filter((p) => p.kind === 'duplicated-row').length;
    const expected = overview.records + duplicated * overview.species.length;
    const app = await openApp({ height: 860 });
    try {
      await app.command('open-demo');
      const summary = app.page.getByTestId('records-summary');
      await summary.filter({ hasText: `from ${overview.sourceFiles.length} workbooks` }).waitFor();
      const text = (await summary.textContent()) ?? '';
      expect(text).toContain(`${new Intl.NumberFormat('en-GB').format(expected)} records`);
      const open = Number(/(\d+) findings? still open/.exec(text)?.[1]);
      expect(open).toBeGreaterThanOrEqual(planted.length);
      await expect.poll(() => app.page.getByTestId('programme-title').textContent()).toBe(overview.programme);
      await app.screenshot('records-demo-project');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});

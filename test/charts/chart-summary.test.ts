/** A chart in words (src-shared/charts/chart-summary.ts), read from options built on MASS's quine fits. */
import { describe, expect, it } from 'vitest';
import { chartSummary, qqChart, QQ_TITLE, residualsVsFittedChart, RESIDUALS_FITTED_TITLE, zerosChart, ZEROS_TITLE } from '@shared/charts';
import { qqEnvelope, quantileResiduals, zeroCounts } from '@shared/diagnostics';
import { quineFit } from '../diagnostics/quine-reference';

describe('chart summary', () => {
  const res = quantileResiduals(quineFit('negbin'), { seed: 4 });
  it('title, subtitle, both axes and the points drawn', () => {
    const o = residualsVsFittedChart(res, 'Negative binomial');
    const s = chartSummary(o);
    expect(s.startsWith(`${RESIDUALS_FITTED_TITLE}.`)).toBe(true);
    expect(s).toContain((o.title as { subtext: string }).subtext);
    expect(s).toContain('Horizontal axis: Fitted count per record (log scale).');
    expect(s).toContain('Vertical axis: Randomized quantile residual (standard normal scale).');
    expect(s).toContain('Drawn: Negative binomial (146 points).');
  });
  it('leaves out the band\'s hidden lower edge and counts points inside and outside', () => {
    const env = qqEnvelope(quineFit('negbin'), res, { simulations: 19 });
    const s = chartSummary(qqChart(env, 'Negative binomial'));
    const outside = env.points.filter((p) => p.outside).length;
    expect(s.startsWith(QQ_TITLE)).toBe(true);
    expect(s).not.toContain('envelope-lower');
    expect(s).toContain(`Residuals (${146 - outside} points); Outside the envelope (${outside} point${outside === 1 ? '' : 's'})`);
    expect(s).toContain('95% envelope (a line through 146 values)');
  });
  it('bars over categories', () => {
    const s = chartSummary(zerosChart(zeroCounts([{ label: 'Poisson', fit: quineFit('poisson') }, { label: 'Negative binomial', fit: quineFit('negbin') }])));
    expect(s.startsWith(ZEROS_TITLE)).toBe(true);
    expect(s).toContain('Horizontal axis: categories (3 categories).');
    expect(s).toContain('Zero counts (3 bars)');
  });
});

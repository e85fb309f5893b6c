/**
 * Which coefficient the influence-by-site chart follows, checked against the
 * names the engine gives a real fit (seeded invented data, 6 sites x 5
 * seasons): the slope for a linear trend, the last season against the base
 * for an annual one, never a site effect.
 */
import { describe, expect, it } from 'vitest';
import { influenceCoefficient } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { parseModelSpec, type ModelSpecInput } from '@shared/model/spec';
import { simulateSites } from './simulated-sites';

const table = simulateSites(4, { sites: 6, seasons: 5, slope: -0.1, siteSd: 0.4, baseMean: 5 });

function chosen(input: Partial<ModelSpecInput>) {
  const spec = parseModelSpec({ response: 'count', distribution: 'poisson', offsets: [{ column: 'effort_h', log: true }], ...input });
  return influenceCoefficient(spec, fitModel(table, spec).betaNames);
}

describe('influenceCoefficient', () => {
  it('follows the slope of a linear trend', () => {
    expect(chosen({ time: { column: 'season', trend: 'linear' }, site: { column: 'site', effect: 'fixed' } })).toEqual({ name: 'season', meaning: 'the trend per season' });
  });

  it('follows the last season against the base for an annual trend', () => {
    // simulateSites numbers the seasons 2015.. (5 seasons): the last is 2019, the base 2015.
    const c = chosen({ time: { column: 'season', trend: 'annual' }, site: { column: 'site', effect: 'fixed' } });
    expect(c?.name).toBe('season=2019');
    expect(c?.meaning).toBe('the change from the base season to 2019');
  });

  it('without a time term takes the first predictor, skipping site effects', () => {
    expect(chosen({ predictors: [{ column: 'season', type: 'numeric' }], site: { column: 'site', effect: 'fixed' } })?.name).toBe('season');
  });

  it('gives null when there is nothing but the intercept and site effects', () => {
    expect(chosen({ site: { column: 'site', effect: 'fixed' } })).toBeNull();
    expect(chosen({})).toBeNull();
  });
});

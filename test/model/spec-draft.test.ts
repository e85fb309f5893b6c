/**
 * The builder's form to the engine's spec (src-renderer/src/views/models/spec-draft.ts):
 * the smooth season curve is written as the trend module writes it
 * (src-shared/trend/trend-specs.ts splineTrendSpec: a spline on the time
 * column plus a linear time entry), interactions as interaction terms, and
 * numbers out of range are refused in plain words before the schema sees them.
 */
import { describe, expect, it } from 'vitest';
import { initialDraft, specLabel, specOf, type SpecDraft, type TableRoles } from '../../src-renderer/src/views/models/spec-draft';
import { splineTrendSpec } from '@shared/trend/trend-specs';

const roles: TableRoles = { response: 'count', site: 'site', season: 'season', species: 'species', effort: { column: 'effort_h', unit: 'hours' } };
const draft = (change: Partial<SpecDraft>): SpecDraft => ({ ...initialDraft, species: ['Common toad'], ...change });

describe('specOf', () => {
  it('writes the smooth season curve as the trend module does', () => {
    const predictors = [{ column: 'visits', type: 'numeric' as const, reference: '' }];
    const smooth = specOf(draft({ time: 'smooth', seasonDf: 5, predictors }), roles);
    const linear = specOf(draft({ time: 'linear', predictors }), roles);
    expect(smooth).toEqual(splineTrendSpec(linear, 5));
    expect(specLabel(smooth)).toBe('Poisson, visits + smooth season (5 df), site fixed');
  });

  it('adds interactions between chosen predictors as interaction terms, named with ×', () => {
    const spec = specOf(draft({ predictors: [{ column: 'habitat', type: 'factor', reference: 'reed' }, { column: 'visits', type: 'numeric', reference: '' }], interactions: [['habitat', 'visits']] }), roles);
    expect(spec.predictors).toEqual([{ column: 'habitat', type: 'factor', reference: 'reed' }, { column: 'visits', type: 'numeric' }, { type: 'interaction', columns: ['habitat', 'visits'] }]);
    expect(specLabel(spec)).toBe('Poisson, habitat + visits + habitat × visits, site fixed, season annual');
  });

  it('refuses degrees of freedom and quadrature points out of range in plain words', () => {
    expect(() => specOf(draft({ time: 'smooth', seasonDf: 0 }), roles)).toThrow('The season curve needs a whole number of degrees of freedom from 1 to 20');
    expect(() => specOf(draft({ time: 'smooth', seasonDf: 2.5 }), roles)).toThrow('whole number');
    expect(() => specOf(draft({ site: 'random', quadraturePoints: 0 }), roles)).toThrow('The number of quadrature points must be a whole number from 1');
    // A df out of range does not matter when the season term is not a curve.
    expect(() => specOf(draft({ time: 'annual', seasonDf: 0 }), roles)).not.toThrow();
  });
});

/** The dispatcher routes each kind of spec to its fitter (the others are stood in for here). */
import { describe, expect, it, vi } from 'vitest';
import { tableFromTexts } from '@shared/data/table';
import { parseModelSpec } from '@shared/model/spec';

vi.mock('@shared/engine/zero/fit-zero', () => ({ fitZeroModel: vi.fn(() => ({ marker: 'zero' })) }));
vi.mock('@shared/engine/sites/random', () => ({ fitRandomSite: vi.fn(() => ({ marker: 'random' })) }));

const { fitModel } = await import('@shared/engine/fit');

const table = tableFromTexts(
  ['count', 'site', 'x'],
  Array.from({ length: 12 }, (_, i) => [String((i * 7) % 5), `s${i % 4}`, String(i / 3)]),
);

describe('fitModel routing', () => {
  it.each(['zip', 'zinb', 'hurdle-poisson', 'hurdle-negbin'] as const)('%s goes to the zero-part fitter', (distribution) => {
    const out = fitModel(table, parseModelSpec({ response: 'count', distribution }));
    expect((out as unknown as { marker: string }).marker).toBe('zero');
  });
  it('a random site effect goes to the random-site fitter', () => {
    const out = fitModel(table, parseModelSpec({ response: 'count', distribution: 'negbin', site: { column: 'site', effect: 'random' } }));
    expect((out as unknown as { marker: string }).marker).toBe('random');
  });
  it.each(['poisson', 'quasipoisson', 'negbin'] as const)('%s (fixed or no site) is fitted here', (distribution) => {
    const out = fitModel(table, parseModelSpec({ response: 'count', distribution, predictors: [{ column: 'x', type: 'numeric' }], site: { column: 'site', effect: 'fixed' } }));
    expect(out.summary.distribution).toBe(distribution);
    expect(out.summary.coefficients.map((c) => c.term)).toEqual(['x']);
  });
});

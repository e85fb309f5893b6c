import { describe, expect, it } from 'vitest';
import { decisionFlags, DEFAULT_THRESHOLDS } from '@shared/trend/flags';

// Thresholds 30%, 50%, 80%: the reductions of IUCN Red List criterion A
// (IUCN 2012, Categories and Criteria v3.1; from memory). Projections are
// (1 + r)^h - 1 applied to the estimate and both limits (arithmetic).
describe('decision flags', () => {
  it('uses the criterion A thresholds by default and projects the limits over 10 seasons', () => {
    expect(DEFAULT_THRESHOLDS).toEqual([0.3, 0.5, 0.8]);
    const f = decisionFlags({ perYear: -0.05, lower: -0.08, upper: -0.03 });
    expect(f.horizon).toBe(10);
    expect(f.projected.change).toBeCloseTo(0.95 ** 10 - 1, 12);
    expect(f.projected.lower).toBeCloseTo(0.92 ** 10 - 1, 12);
    expect(f.projected.upper).toBeCloseTo(0.97 ** 10 - 1, 12);
    expect(f.direction).toBe('decline');
    // -56.6% .. -26.3%: reaches 30% and 50%, stops short of 80%.
    expect(f.thresholds.map((t) => t.status)).toEqual(['reaches', 'reaches', 'excludes']);
    expect(f.caution).toMatch(/not a Red List assessment/);
  });
  it('an interval wholly beyond a threshold says so', () => {
    const f = decisionFlags({ perYear: -0.1, lower: -0.12, upper: -0.08 });
    expect(f.thresholds[0]).toMatchObject({ status: 'beyond' });
    expect(f.thresholds[0].sentence).toBe('The whole 95% interval lies beyond a 30% decline over 10 seasons.');
    expect(f.thresholds[2].status).toBe('excludes');
  });
  it('an interval spanning no change says the data cannot tell decline from increase', () => {
    const f = decisionFlags({ perYear: -0.01, lower: -0.04, upper: 0.02 }, 5, [0.3]);
    expect(f.direction).toBe('unclear');
    expect(f.summary).toBe('The 95% interval spans no change: the data cannot tell decline from increase.');
    expect(f.thresholds[0].status).toBe('excludes');
  });
  it('an increase is named as such', () => {
    expect(decisionFlags({ perYear: 0.05, lower: 0.02, upper: 0.08 }).direction).toBe('increase');
  });
});

describe('no NaN reaches an output', () => {
  it('a non-finite index or slope is refused with the season named', async () => {
    const { checkFinite } = await import('@shared/trend/finite-check');
    expect(() => checkFinite('index', [{ time: 2014, index: 90, lower: Number.NaN, upper: 120 }])).toThrow(/season 2014/);
    expect(() => checkFinite('index', [], { perYear: 0.1, lower: -Infinity, upper: 0.2 })).toThrow(/slope/);
    expect(() => checkFinite('index', [{ time: 1, index: 100, lower: 100, upper: 100 }], { perYear: 0, lower: -0.1, upper: 0.1 })).not.toThrow();
  });
});

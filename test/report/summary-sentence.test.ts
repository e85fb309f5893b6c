import { describe, expect, it } from 'vitest';
import { cellText, formatNumber, spreadsheetFormat } from '@shared/report/number-format';
import { changeOverSpan, summarySentence } from '@shared/report/summary-sentence';

// Compounding a constant per-season change r over n seasons, (1 + r)^n - 1,
// and carrying its limits through the same monotone map: common practice.
describe('summary sentence', () => {
  it('compounds the per-season change and its limits over the span', () => {
    const c = changeOverSpan({ perYear: -0.0185, lower: -0.0312, upper: -0.0058 }, 14);
    expect(c.perYear).toBeCloseTo(Math.pow(0.9815, 14) - 1, 12);
    expect(c.lower).toBeCloseTo(Math.pow(0.9688, 14) - 1, 12);
    expect(c.upper).toBeCloseTo(Math.pow(0.9942, 14) - 1, 12);
  });

  it('says "declined" only when the whole interval lies below no change, with the limits as sizes of decline', () => {
    const s = summarySentence({ subject: 'common toad', slope: { perYear: -0.0186, lower: -0.0312, upper: -0.0058 }, first: 2012, last: 2026, span: 14 });
    const pc = (r: number) => `${Math.round(Math.abs(100 * (Math.pow(1 + r, 14) - 1)))}%`;
    expect(s).toContain(`declined by ${pc(-0.0186)} (95% limits ${pc(-0.0058)} to ${pc(-0.0312)}) over 2012–2026`);
    expect(s).toContain('-1.9% a season, limits -3.1% to -0.6%');
    expect(s).not.toMatch(/increase|cannot tell/);
  });

  it('says "increased" only when the whole interval lies above no change', () => {
    const s = summarySentence({ subject: 'common frog', slope: { perYear: 0.02, lower: 0.005, upper: 0.035 }, first: 2012, last: 2026, span: 14 });
    expect(s).toMatch(/^Counts of common frog increased by 32% \(95% limits 7% to 62%\)/);
  });

  it('says the data cannot tell decline from increase when the interval spans no change', () => {
    const s = summarySentence({ subject: 'natterjack', slope: { perYear: -0.01, lower: -0.03, upper: 0.01 }, first: 2012, last: 2026, span: 14 });
    expect(s).toContain('the data cannot tell decline from increase');
    expect(s).toContain('between a 35% decline and a 15% increase');
    expect(s).not.toMatch(/declined|increased/);
  });

  it('never prints NaN: a non-finite slope is said in words', () => {
    const s = summarySentence({ subject: 'x', slope: { perYear: Number.NaN, lower: Number.NaN, upper: Number.NaN }, first: 1, last: 2, span: 1 });
    expect(s).not.toMatch(/NaN/);
    expect(s).toMatch(/no finite estimate/);
  });
});

describe('number formats', () => {
  it('formats fixed, percent, p and general numbers, with a dash for non-finite values', () => {
    expect(formatNumber(-0.00004, { kind: 'fixed', decimals: 3 })).toBe('0.000');
    expect(formatNumber(0.0314, { kind: 'percent', decimals: 1 })).toBe('3.1%');
    expect(formatNumber(3e-7, { kind: 'p' })).toBe('<0.0001');
    expect(formatNumber(2012, { kind: 'general' })).toBe('2012');
    expect(formatNumber(Number.NaN)).toBe('–');
    expect(cellText(null)).toBe('–');
    expect(cellText('<b>', { kind: 'p' })).toBe('<b>');
  });

  it('gives the matching spreadsheet format codes', () => {
    expect(spreadsheetFormat({ kind: 'fixed', decimals: 2 })).toBe('0.00');
    expect(spreadsheetFormat({ kind: 'percent', decimals: 1 })).toBe('0.0%');
    expect(spreadsheetFormat({ kind: 'fixed', decimals: 0 })).toBe('0');
    expect(spreadsheetFormat(undefined)).toBeUndefined();
  });
});

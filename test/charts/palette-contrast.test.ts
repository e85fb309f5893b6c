/**
 * Every colour a chart needs to be read reaches 3:1 contrast with the chart
 * background: WCAG 2.1 success criterion 1.4.11 "Non-text contrast"
 * (https://www.w3.org/TR/WCAG21/#non-text-contrast), with the contrast
 * ratio and relative luminance as WCAG 2.1 defines them (./wcag-contrast.ts).
 * The charts are those the screen and the report draw from the same options
 * (MASS's quine fits, test/diagnostics/quine-reference.ts), read as drawn:
 * a colour with an opacity counts as blended over the background.
 */
import { describe, expect, it } from 'vitest';
import { attention, frequencyChart, greys, qqChart, residualsByGroupChart, residualsVsFittedChart, rootogramChart, seriesColours, type ChartOption } from '@shared/charts';
import { chartFrame } from '@shared/charts/chart-style';
import { countFrequencies, hangingRootogram, qqEnvelope, quantileResiduals, residualGroups } from '@shared/diagnostics';
import { quineFit, quineTable } from '../diagnostics/quine-reference';
import { contrastRatio, overBackground, relativeLuminance } from './wcag-contrast';

const background = String(chartFrame({ title: '' }).backgroundColor);

describe('the WCAG 2.1 contrast ratio as written here', () => {
  it('gives the ends of its range and a well-known grey', () => {
    // WCAG 2.1, definition of contrast ratio: "Contrast ratios can range from 1 to 21".
    expect(contrastRatio('#000000', '#FFFFFF')).toBeCloseTo(21, 10);
    expect(contrastRatio('#5C6370', '#5C6370')).toBe(1);
    expect(relativeLuminance('#FFFFFF')).toBeCloseTo(1, 12);
    // #767676 is the lightest grey with 4.5:1 on white, and #777777 just misses it (common practice).
    expect(contrastRatio('#767676', '#FFFFFF')).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio('#777777', '#FFFFFF')).toBeLessThan(4.5);
    // The order of the two colours does not matter.
    expect(contrastRatio('#FFFFFF', '#3D3AB0')).toBe(contrastRatio('#3D3AB0', '#FFFFFF'));
  });
});

describe('palette against the chart background (WCAG 2.1 SC 1.4.11: at least 3:1)', () => {
  it('the background is white', () => expect(background.toUpperCase()).toBe('#FFFFFF'));
  it.each(seriesColours.map((c, k) => [k + 1, c]))('series colour %i (%s)', (_k, c) => {
    expect(contrastRatio(c, background)).toBeGreaterThanOrEqual(3);
  });
  it.each([
    ['attention', attention],
    ['observed data', greys.observed],
    ['band edges', greys.bandEdge],
    ['axes and secondary text', greys.axis],
    ['ink', greys.ink],
  ])('%s (%s)', (_name, c) => {
    expect(contrastRatio(c, background)).toBeGreaterThanOrEqual(3);
  });
  it('the old fifth and sixth colours would fail, so the test can tell', () => {
    // Okabe & Ito's orange and sky blue, the fifth and sixth colours before this palette.
    expect(contrastRatio('#E69F00', background)).toBeLessThan(3);
    expect(contrastRatio('#56B4E9', background)).toBeLessThan(3);
  });
});

type Drawn = { where: string; colour: string; opacity: number };

/** The colours of a chart's marks as drawn: points, bars and lines, with their opacity; light fills and hidden helpers left out. */
function drawnColours(o: ChartOption): Drawn[] {
  const out: Drawn[] = [];
  const add = (where: string, style: unknown) => {
    const s = style as { color?: unknown; opacity?: unknown } | undefined;
    if (!s || typeof s.color !== 'string' || s.color === 'transparent') return;
    const opacity = typeof s.opacity === 'number' ? s.opacity : 1;
    if (opacity > 0) out.push({ where, colour: s.color, opacity });
  };
  for (const s of o.series as { id: string; areaStyle?: unknown; itemStyle?: unknown; lineStyle?: unknown; data?: unknown[] }[]) {
    // A band's item colour is its fill (the edges carry the contrast), so only its line is read.
    if (!s.areaStyle) add(`${s.id} item`, s.itemStyle);
    add(`${s.id} line`, s.lineStyle);
    s.data?.forEach((d, i) => d && typeof d === 'object' && !Array.isArray(d) && add(`${s.id}[${i}]`, (d as { itemStyle?: unknown }).itemStyle));
  }
  return out;
}

describe('marks as the charts draw them', () => {
  const fits = [
    { label: 'Poisson', fit: quineFit('poisson') },
    { label: 'Negative binomial', fit: quineFit('negbin') },
    { label: 'Third', fit: quineFit('negbin') },
    { label: 'Fourth', fit: quineFit('poisson') },
    { label: 'Fifth', fit: quineFit('negbin') },
    { label: 'Sixth', fit: quineFit('poisson') },
  ];
  const freq = countFrequencies(fits, { tailFrom: 12 });
  const res = quantileResiduals(quineFit('negbin'), { seed: 4 });
  const charts: [string, ChartOption][] = [
    ['frequencies of six models', frequencyChart(freq)],
    ['rootogram of the sixth model', rootogramChart(hangingRootogram(freq, 'Sixth'), 5)],
    ['residuals against fitted values', residualsVsFittedChart(res, 'Negative binomial')],
    ['residuals by age', residualsByGroupChart(res, residualGroups(res, quineTable(), 'Age'), 'Negative binomial')],
    ['QQ plot', qqChart(qqEnvelope(quineFit('negbin'), res, { simulations: 19 }), 'Negative binomial')],
  ];
  it.each(charts)('%s: every mark reaches 3:1 where it is drawn on the background', (_name, o) => {
    const drawn = drawnColours(o);
    expect(drawn.length).toBeGreaterThan(0);
    const low = drawn.filter((d) => contrastRatio(overBackground(d.colour, d.opacity, background), background) < 3);
    expect(low).toEqual([]);
  });
});

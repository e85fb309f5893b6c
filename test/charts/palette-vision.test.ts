/**
 * The series colours stay apart for the common colour-vision deficiencies,
 * and overlapping model lines differ by more than colour.
 *
 * Dichromat vision is simulated with the severity-1.0 matrices of Machado,
 * Oliveira & Fernandes (2009), "A physiologically-based model for
 * simulation of color vision deficiency", IEEE TVCG 15(6):1291-1298,
 * tabulated in Machado (2010), "A model for simulation of color vision
 * deficiency and a color contrast enhancement technique for dichromats"
 * (thesis, UFRGS, http://www.lume.ufrgs.br/handle/10183/26950), applied to
 * linear sRGB. Distances are CIE 1976 L*a*b* differences (D65 white,
 * sRGB/IEC 61966-2-1 primaries). The least distance asked for, 15, is our
 * own bar for telling chart series apart at a glance (a just-noticeable
 * difference is about 2.3, common practice).
 */
import { describe, expect, it } from 'vitest';
import { frequencyChart, greys, seriesColours, seriesMark, seriesMarks } from '@shared/charts';
import { countFrequencies } from '@shared/diagnostics';
import { quineFit } from '../diagnostics/quine-reference';
import { linearChannel, srgbChannels } from './wcag-contrast';

type Matrix = readonly [readonly number[], readonly number[], readonly number[]];

const simulations: Record<string, Matrix> = {
  normal: [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ],
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

/** CIE L*a*b* (D65) of linear sRGB, clipped to the gamut. */
function lab(rgb: readonly number[]): [number, number, number] {
  const [r, g, b] = rgb.map((v) => Math.min(1, Math.max(0, v)));
  const x = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047;
  const y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
  const z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}

function seen(hex: string, m: Matrix): [number, number, number] {
  const v = srgbChannels(hex).map(linearChannel);
  return lab(m.map((row) => row[0] * v[0] + row[1] * v[1] + row[2] * v[2]));
}

function distance(a: string, b: string, m: Matrix): number {
  const [p, q] = [seen(a, m), seen(b, m)];
  return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}

function closest(colours: readonly string[], m: Matrix): { pair: string; distance: number } {
  let best = { pair: '', distance: Infinity };
  for (let i = 0; i < colours.length; i++)
    for (let j = i + 1; j < colours.length; j++) {
      const d = distance(colours[i], colours[j], m);
      if (d < best.distance) best = { pair: `${colours[i]} ${colours[j]}`, distance: d };
    }
  return best;
}

describe('series colours under simulated colour-vision deficiency', () => {
  it('the simulation itself: white stays white, and red and green meet for a deuteranope', () => {
    // Each matrix row sums to 1 (Machado et al. 2009 keep white), so white is unchanged.
    for (const m of Object.values(simulations)) expect(distance('#FFFFFF', '#FFFFFF', m)).toBe(0);
    for (const m of Object.values(simulations)) expect(seen('#FFFFFF', m)[0]).toBeCloseTo(100, 2);
    // A red and a green of like lightness, far apart for normal vision, come close for a deuteranope.
    expect(distance('#D0312D', '#3F8F29', simulations.normal)).toBeGreaterThan(80);
    expect(distance('#D0312D', '#3F8F29', simulations.deuteranopia)).toBeLessThan(20);
  });
  it.each(Object.keys(simulations))('%s: every two colours (and the observed grey) at least 15 apart', (name) => {
    const c = closest([...seriesColours, greys.observed], simulations[name]);
    expect(c.distance, c.pair).toBeGreaterThanOrEqual(15);
  });
});

describe('model lines differ by more than colour', () => {
  it('six symbols and six dashes, all different, in the order of the colours', () => {
    expect(seriesMarks).toHaveLength(seriesColours.length);
    expect(new Set(seriesMarks.map((m) => m.symbol)).size).toBe(seriesMarks.length);
    expect(new Set(seriesMarks.map((m) => JSON.stringify(m.dash))).size).toBe(seriesMarks.length);
    expect(seriesMark(seriesMarks.length)).toEqual(seriesMark(0));
  });
  it('the frequency chart draws each model with its own symbol and dash', () => {
    const o = frequencyChart(countFrequencies([{ label: 'Poisson', fit: quineFit('poisson') }, { label: 'Negative binomial', fit: quineFit('negbin') }], { tailFrom: 12 }));
    const lines = (o.series as { type: string; symbol?: string; lineStyle?: { type?: unknown } }[]).filter((s) => s.type === 'line');
    expect(lines).toHaveLength(2);
    expect(lines[0].symbol).not.toBe(lines[1].symbol);
    expect(JSON.stringify(lines[0].lineStyle?.type)).not.toBe(JSON.stringify(lines[1].lineStyle?.type));
  });
});

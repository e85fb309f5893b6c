/**
 * The echarts option builders: series ids and names, point counts, axis
 * titles, row indices carried in the data, JSON round trip without NaN or
 * Infinity, and a render by echarts' server-side SVG renderer (echarts 6)
 * whose SVG holds the title and the right number of bars or points.
 * Data: MASS's quine fits (see test/diagnostics/quine-reference.ts) and
 * seeded invented sites.
 */
import { describe, expect, it } from 'vitest';
import type { ChartOption } from '@shared/charts';
import {
  chartNumber,
  attention,
  FREQUENCY_TITLE,
  frequencyChart,
  greys,
  indexChart,
  influenceChart,
  meanVarianceChart,
  MEAN_VARIANCE_TITLE,
  qqChart,
  QQ_TITLE,
  residualsByGroupChart,
  residualsVsFittedChart,
  RESIDUALS_FITTED_TITLE,
  rootogramChart,
  ROOTOGRAM_TITLE,
  seriesColour,
  seriesColours,
  zerosChart,
  ZEROS_TITLE,
} from '@shared/charts';
import { countFrequencies, hangingRootogram, meanVarianceBySite, qqEnvelope, quantileResiduals, residualGroups, siteInfluenceOneStep, zeroCounts } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';
import { quineFit, quineTable } from '../diagnostics/quine-reference';
import { simulateSites } from '../diagnostics/simulated-sites';
import { escapeXml, filled, nonFiniteNumbers, renderSvg } from './render-svg';

type AnySeries = { id: string; name: string; type: string; data: unknown[] };
const seriesOf = (o: ChartOption) => o.series as unknown as AnySeries[];
const titleOf = (o: ChartOption) => (o.title as { text: string }).text;
const axisName = (o: ChartOption, a: 'xAxis' | 'yAxis') => (o[a] as { name: string }).name;

function checkPlain(o: ChartOption): void {
  expect(nonFiniteNumbers(o)).toEqual([]);
  expect(JSON.parse(JSON.stringify(o))).toEqual(o);
}

const fits = [
  { label: 'Poisson', fit: quineFit('poisson') },
  { label: 'Negative binomial', fit: quineFit('negbin') },
];

describe('palette (our own; contrast and colour vision in palette-contrast and palette-vision tests)', () => {
  it('six distinct series colours, cycling; greys apart; none taken from a published set', () => {
    // Okabe & Ito (2008), "Color Universal Design", J*Fly: the set the charts used before.
    const okabeIto = ['#E69F00', '#56B4E9', '#009E73', '#F0E442', '#0072B2', '#D55E00', '#CC79A7', '#000000'];
    expect(new Set(seriesColours).size).toBe(6);
    for (const c of seriesColours) expect(okabeIto).not.toContain(c);
    expect(seriesColour(6)).toBe(seriesColour(0));
    expect(seriesColour(-1)).toBe(seriesColour(5));
    expect(Object.values(greys)).not.toContain(seriesColour(0));
  });
});

describe('observed and expected frequencies', () => {
  const freq = countFrequencies(fits, { tailFrom: 12 });
  const o = frequencyChart(freq);
  it('one bar series and a line per model, with rows in the bar data', () => {
    expect(titleOf(o)).toBe(FREQUENCY_TITLE);
    const s = seriesOf(o);
    expect(s.map((x) => x.id)).toEqual(['observed', 'expected:Poisson', 'expected:Negative binomial']);
    expect(s.map((x) => x.name)).toEqual(['Observed', 'Expected: Poisson', 'Expected: Negative binomial']);
    s.forEach((x) => expect(x.data).toHaveLength(13));
    expect((s[0].data[0] as { rows: number[] }).rows).toEqual(freq.rowsByBin[0]);
    expect(axisName(o, 'xAxis')).toBe('Count per record');
    expect(axisName(o, 'yAxis')).toBe('Records');
    checkPlain(o);
  });
  it('renders: title and 13 grey bars (plus the legend icon)', () => {
    const svg = renderSvg(o);
    expect(svg).toContain(escapeXml(FREQUENCY_TITLE));
    expect(filled(svg, greys.observed)).toBe(13 + 1);
  });
});

describe('hanging rootogram', () => {
  const freq = countFrequencies(fits, { tailFrom: 12 });
  const root = hangingRootogram(freq, 'Negative binomial');
  const o = rootogramChart(root, 1);
  it('bases at sqrt(e) - sqrt(o), bars of sqrt(o) stacked on them, the curve sqrt(e)', () => {
    expect(titleOf(o)).toBe(ROOTOGRAM_TITLE);
    const [base, bars, curve] = seriesOf(o);
    expect([base.id, bars.id, curve.id]).toEqual(['hanging-base', 'observed', 'expected:Negative binomial']);
    base.data.forEach((b, k) => {
      const top = (b as number) + ((bars.data[k] as { value: number }).value);
      expect(top).toBeCloseTo(curve.data[k] as number, 4);
    });
    expect((o.legend as { data: string[] }).data).not.toContain('hanging-base');
    checkPlain(o);
  });
  it('renders: title and 13 hanging bars', () => {
    const svg = renderSvg(o);
    expect(svg).toContain(escapeXml(ROOTOGRAM_TITLE));
    expect(filled(svg, greys.observed)).toBe(13 + 1);
  });
});

describe('residual charts', () => {
  const res = quantileResiduals(quineFit('negbin'), { seed: 4 });
  it('against fitted values: 146 points [fitted, residual, row], log x axis', () => {
    const o = residualsVsFittedChart(res, 'Negative binomial');
    expect(titleOf(o)).toBe(RESIDUALS_FITTED_TITLE);
    const [s] = seriesOf(o);
    expect(s.id).toBe('residuals');
    expect(s.data).toHaveLength(146);
    expect(s.data[5]).toEqual([expect.any(Number), expect.any(Number), 5]);
    expect(axisName(o, 'xAxis')).toBe('Fitted count per record (log scale)');
    expect(axisName(o, 'yAxis')).toMatch(/standard normal scale/);
    checkPlain(o);
    const svg = renderSvg(o);
    expect(svg).toContain(escapeXml(RESIDUALS_FITTED_TITLE));
    expect(filled(svg, seriesColour(0))).toBe(146 + 1);
  });
  it('by a column: levels sorted, a median per level, points keep their rows', () => {
    const groups = residualGroups(res, quineTable(), 'Age');
    expect(groups.levels).toEqual(['F0', 'F1', 'F2', 'F3']);
    expect(groups.count.reduce((a, v) => a + v, 0)).toBe(146);
    const o = residualsByGroupChart(res, groups, 'Negative binomial');
    expect(titleOf(o)).toBe('Is anything left over? Residuals by Age');
    const [points, median] = seriesOf(o);
    expect(points.data).toHaveLength(146);
    // Each point sits at its record's level, by name (the tooltip shows it), and keeps its table row.
    (points.data as [string, number, number][]).forEach((p, i) => expect([p[0], p[2]]).toEqual([groups.levels[groups.levelOf[i]], res.rows[i]]));
    expect(median.id).toBe('median');
    expect(median.data).toHaveLength(4);
    expect(axisName(o, 'xAxis')).toBe('Age');
    checkPlain(o);
    const svg = renderSvg(o);
    expect(filled(svg, seriesColour(0))).toBe(146 + 1);
    expect(filled(svg, greys.ink)).toBeGreaterThanOrEqual(4);
    expect(() => residualGroups(res, quineTable(), 'Season')).toThrow(/no column "Season".*"Eth"/);
  });
});

describe('QQ plot with envelope', () => {
  const fit = quineFit('negbin');
  const env = qqEnvelope(fit, quantileResiduals(fit, { seed: 4 }), { simulations: 19 });
  const o = qqChart(env, 'Negative binomial');
  it('band, identity line, inside and outside points that add up to every record', () => {
    expect(titleOf(o)).toBe(QQ_TITLE);
    const s = seriesOf(o);
    expect(s.map((x) => x.id)).toEqual(['envelope-lower', 'envelope', 'identity', 'inside', 'outside']);
    const inside = s[3].data.length;
    const outside = s[4].data.length;
    expect(inside + outside).toBe(146);
    expect(outside).toBe(env.points.filter((p) => p.outside).length);
    const rows = [...s[3].data, ...s[4].data].map((d) => (d as number[])[2]).sort((a, b) => a - b);
    expect(rows).toEqual(Array.from({ length: 146 }, (_, i) => i));
    expect(axisName(o, 'xAxis')).toBe('Standard normal quantile');
    checkPlain(o);
    const svg = renderSvg(o);
    expect(svg).toContain(escapeXml(QQ_TITLE));
    expect(filled(svg, seriesColour(0))).toBe(inside + 1);
    expect(filled(svg, attention)).toBe(outside + 1);
  });
});

describe('site charts on invented data', () => {
  const table = simulateSites(5, { sites: 12, seasons: 6, slope: -0.04, theta: 2, siteSd: 0.7, baseMean: 3 });
  const spec = parseModelSpec({ response: 'count', distribution: 'negbin', predictors: [{ column: 'season', type: 'numeric' }], offsets: [{ column: 'effort_h', log: true }] });
  const fit = fitModel(table, spec);

  it('mean-variance: a point per site with its rows, Poisson and NB curves, log axes with units', () => {
    const mv = meanVarianceBySite(table, fit, { siteColumn: 'site', effortColumn: 'effort_h' });
    const o = meanVarianceChart(mv);
    expect(titleOf(o)).toBe(MEAN_VARIANCE_TITLE);
    const s = seriesOf(o);
    expect(s.map((x) => x.id)).toEqual(['sites', 'poisson', 'negbin']);
    expect(s[0].data).toHaveLength(mv.sites.filter((x) => x.mean > 0 && x.variance > 0).length);
    expect((s[0].data[0] as { site: string; rows: number[] }).rows).toEqual(mv.sites[0].rows);
    expect(axisName(o, 'xAxis')).toBe('Mean count per unit of effort_h (log scale)');
    expect((o.xAxis as { type: string }).type).toBe('log');
    checkPlain(o);
    const svg = renderSvg(o);
    expect(svg).toContain(escapeXml(MEAN_VARIANCE_TITLE));
    expect(filled(svg, greys.observed)).toBe(s[0].data.length + 1);
  });

  it('mean-variance: names the model the NB curve comes from, and asks for one when there is none', () => {
    const mv = meanVarianceBySite(table, fit, { siteColumn: 'site' });
    expect((meanVarianceChart(mv, 'Negative binomial, season linear').title as { subtext: string }).subtext).toContain('Negative-binomial curve from Negative binomial, season linear.');
    const poisson = meanVarianceChart(meanVarianceBySite(table, { ...fit, theta: null }, { siteColumn: 'site' }));
    expect(seriesOf(poisson).map((x) => x.id)).toEqual(['sites', 'poisson']);
    expect((poisson.title as { subtext: string }).subtext).toContain('Fit a negative binomial to see its curve.');
  });

  it('influence: a bar per site, the SE lines, the method said', () => {
    const infl = siteInfluenceOneStep(table, spec, fit, { coefficient: 'season', siteColumn: 'site' });
    const o = influenceChart(infl);
    expect(titleOf(o)).toBe('Does one site drive the result? Change in season without each site');
    expect((o.title as { subtext: string }).subtext).toContain(infl.methodNote);
    const [bars] = seriesOf(o);
    expect(bars.id).toBe('change');
    expect(bars.data).toHaveLength(12);
    expect((bars.data[2] as { site: string; rows: number[] }).rows).toEqual(infl.sites[2].rows);
    expect(axisName(o, 'xAxis')).toBe('site');
    checkPlain(o);
    const svg = renderSvg(o);
    expect(filled(svg, seriesColour(0)) + filled(svg, attention)).toBe(12);
  });

  it('influence: says in words what the coefficient measures when told', () => {
    const infl = siteInfluenceOneStep(table, spec, fit, { coefficient: 'season', siteColumn: 'site' });
    const sub = (influenceChart(infl, 'the trend per season').title as { subtext: string }).subtext;
    expect(sub.startsWith('season is the trend per season. ')).toBe(true);
    // The site that moves the estimate most, and by how much of a standard error.
    const top = infl.sites.reduce((a, x) => (Math.abs(x.change ?? 0) > Math.abs(a.change ?? 0) ? x : a));
    expect(sub).toContain(`Largest change: ${top.site}, ${chartNumber(top.change)} (${Math.round((100 * Math.abs(top.change!)) / infl.se)}% of a standard error).`);
  });

  it('zeros per model: observed and one bar per model', () => {
    const z = zeroCounts([
      { label: 'Poisson', fit: fitModel(table, { ...spec, distribution: 'poisson' }) },
      { label: 'Negative binomial', fit },
    ]);
    const o = zerosChart(z);
    expect(titleOf(o)).toBe(ZEROS_TITLE);
    const [bars] = seriesOf(o);
    expect(bars.data).toHaveLength(3);
    expect((bars.data[0] as { value: number; rows: number[] }).rows).toEqual(z.zeroRows);
    expect((o.xAxis as { data: string[] }).data).toEqual(['Observed', 'Poisson', 'Negative binomial']);
    checkPlain(o);
    const svg = renderSvg(o);
    expect(svg).toContain(escapeXml(ZEROS_TITLE));
    expect(filled(svg, greys.observed)).toBe(1);
    expect(filled(svg, seriesColour(0))).toBe(1);
    expect(filled(svg, seriesColour(1))).toBe(1);
  });
});

describe('annual index', () => {
  const points = [
    { time: 2012, index: 100, lower: 100, upper: 100 },
    { time: 2013, index: 91.2, lower: 80.1, upper: 103.8 },
    { time: 2014, index: 84, lower: 71, upper: 99.5 },
    { time: 2015, index: 88, lower: 73, upper: 106 },
  ];
  it('a limits band, the index line with its points, the base line at 100', () => {
    const o = indexChart(points, { subject: 'the reed warbler count', timeName: 'Season (year)' });
    expect(titleOf(o)).toBe('How has the reed warbler count changed? Annual index (base year = 100)');
    const s = seriesOf(o);
    expect(s.map((x) => x.id)).toEqual(['limits-lower', 'limits', 'index']);
    expect(s[1].data).toEqual([0, 23.7, 28.5, 33]);
    expect((s[2] as unknown as { markLine: { data: { yAxis: number }[] } }).markLine.data[0].yAxis).toBe(100);
    expect(axisName(o, 'yAxis')).toBe('Index (base year = 100)');
    expect(axisName(o, 'xAxis')).toBe('Season (year)');
    checkPlain(o);
    const svg = renderSvg(o);
    expect(svg).toContain('reed warbler');
    expect(svg).toContain('base = 100');
    expect(filled(svg, seriesColour(0))).toBeGreaterThanOrEqual(4);
  });
  it('a limit that is not a number becomes a gap, never NaN', () => {
    const o = indexChart([...points, { time: 2016, index: Number.NaN, lower: Number.NEGATIVE_INFINITY, upper: 120 }]);
    checkPlain(o);
    expect(seriesOf(o)[0].data[4]).toBeNull();
  });
});

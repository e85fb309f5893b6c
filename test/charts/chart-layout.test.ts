/**
 * The layout rules of chart-layout.ts and text-width.ts on the built
 * options: the legend wraps onto rows counted from its items and the plot
 * starts below them (1 to 6 models, at the report's width and a narrow
 * screen's), titles wrap at the chart's width, and every chart's vertical
 * axis title sits on its own line above the plot with room left for it.
 * How the result looks in a real font: chart-layout-look.test.ts.
 * Data: MASS's quine fits (test/diagnostics/quine-reference.ts) and seeded
 * invented sites; model labels invented.
 */
import { describe, expect, it } from 'vitest';
import type { ChartOption } from '@shared/charts';
import { indexChart, influenceChart, meanVarianceChart, qqChart, residualsByGroupChart, residualsVsFittedChart, rootogramChart, zerosChart } from '@shared/charts';
import { chartLayout, CHART_WIDTH, FRAME, layoutChart, legendNames, legendRows, USUAL_GRID_TOP } from '@shared/charts/chart-layout';
import { estimatedWidth, measureCssFont, wrappedLines, type MeasureText } from '@shared/charts/text-width';
import { countFrequencies, hangingRootogram, meanVarianceBySite, qqEnvelope, quantileResiduals, residualGroups, siteInfluenceOneStep, zeroCounts } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';
import { frequenciesOf, labelledFits, LONG_LABELS } from './long-labels';
import { quineFit, quineTable } from '../diagnostics/quine-reference';
import { simulateSites } from '../diagnostics/simulated-sites';

/** 6 px per character whatever the font: sums that can be done by hand. */
const sixEach: MeasureText = (text) => 6 * [...text].length;



const gridTop = (o: ChartOption) => (o.grid as { top: number }).top;
const legendTop = (o: ChartOption) => (o.legend as { top: number }).top;

describe('text widths and wrapping', () => {
  it('estimates DejaVu Sans widths', () => {
    // Measured with a canvas in Chromium (12px "DejaVu Sans"): 330.0 px, and 175.8 px for the alphabet.
    expect(estimatedWidth('Expected: Negative binomial, site fixed, season annual', 12, false)).toBeCloseTo(330, -1);
    expect(estimatedWidth('abcdefghijklmnopqrstuvwxyz', 12, false)).toBeCloseTo(175.8, -1);
    expect(estimatedWidth('Title', 15, true)).toBeGreaterThan(estimatedWidth('Title', 15, false));
    expect(measureCssFont('Title', 'bold 15px sans-serif').width).toBe(estimatedWidth('Title', 15, true));
    expect(measureCssFont('Title', '12px sans-serif').width).toBe(estimatedWidth('Title', 12, false));
  });

  it('breaks between words, cuts a word longer than the line, starts a line at each newline', () => {
    // "aaa bbb ccc": 18 px a word, 6 px a space.
    expect(wrappedLines('aaa bbb ccc', 66, 12, false, sixEach)).toBe(1);
    expect(wrappedLines('aaa bbb ccc', 42, 12, false, sixEach)).toBe(2);
    expect(wrappedLines('aaa bbb ccc', 41, 12, false, sixEach)).toBe(3);
    expect(wrappedLines('aaaaaaaaaa', 24, 12, false, sixEach)).toBe(3);
    expect(wrappedLines('aaa\nbbb', 200, 12, false, sixEach)).toBe(2);
    expect(wrappedLines('  ', 200, 12, false, sixEach)).toBe(0);
  });
});

describe('the legend and the plot below it', () => {
  it('packs legend items left to right and wraps them as echarts does', () => {
    // An item is 1 + 16 + 5 px of icon and gap plus its text; 10 px between items.
    const item = (chars: number) => 22 + 6 * chars;
    expect(legendRows([], 300, sixEach)).toBe(0);
    expect(legendRows(['abcd'], 300, sixEach)).toBe(1);
    // Two items of 82 px and the gap: 174 px in one row when 174 fit, two rows when not.
    expect(legendRows(['a'.repeat(10), 'b'.repeat(10)], 2 * item(10) + 10, sixEach)).toBe(1);
    expect(legendRows(['a'.repeat(10), 'b'.repeat(10)], 2 * item(10) + 9, sixEach)).toBe(2);
    // An item wider than the row still takes one row of its own.
    expect(legendRows(['a'.repeat(100), 'b'], 200, sixEach)).toBe(2);
  });

  it('takes the legend names from the legend data, else the series, once each', () => {
    expect(legendNames(frequenciesOf(2))).toEqual(['Observed', `Expected: ${LONG_LABELS[0]}`, `Expected: ${LONG_LABELS[1]}`]);
    expect(legendNames({ legend: { show: false }, series: [{ name: 'a', type: 'line' }] })).toEqual([]);
    expect(legendNames({ legend: { data: ['x', { name: 'y' }, 'x'] }, series: [{ name: 'a', type: 'line' }] })).toEqual(['x', 'y']);
  });

  it('with 1 to 6 models the plot starts below the last legend row and the axis title', () => {
    let before = 0;
    for (const models of [1, 2, 3, 4, 5, 6]) {
      const o = frequenciesOf(models);
      const at = chartLayout(o, CHART_WIDTH);
      // The built option is laid out for the report's width.
      expect(gridTop(o)).toBe(at.gridTop);
      expect(legendTop(o)).toBe(at.legendTop);
      const legendBottom = at.legendTop + at.legendRows * FRAME.legendLine + (at.legendRows - 1) * FRAME.legendItemGap;
      expect(at.gridTop).toBe(legendBottom + FRAME.plotGap + FRAME.axisNameLine + FRAME.axisNameGap);
      expect(at.legendRows).toBeGreaterThanOrEqual(models === 1 ? 1 : 2);
      expect(at.gridTop).toBeGreaterThanOrEqual(before);
      before = at.gridTop;
    }
    // One model: everything on the usual lines.
    expect(gridTop(frequenciesOf(1))).toBe(USUAL_GRID_TOP);
    // Long labels take more rows on a narrow chart than at the report's width; at 560 px "Observed" and the first model share a row, the other five take one each.
    const three = frequenciesOf(3);
    expect(chartLayout(three, 400).legendRows).toBeGreaterThan(chartLayout(three, CHART_WIDTH).legendRows);
    const six = frequenciesOf(6);
    expect(chartLayout(six, 560).legendRows).toBe(6);
    const narrow = layoutChart(six, 560);
    expect(gridTop(narrow)).toBe(chartLayout(six, 560).gridTop);
    expect((narrow.legend as { width: number }).width).toBe(560 - 2 * FRAME.side);
  });

  it('a title and subtitle that wrap push the legend and the plot down', () => {
    const table = simulateSites(5, { sites: 12, seasons: 6, slope: -0.04, theta: 2, siteSd: 0.7, baseMean: 3 });
    const spec = parseModelSpec({ response: 'count', distribution: 'negbin', predictors: [{ column: 'season', type: 'numeric' }], offsets: [{ column: 'effort_h', log: true }] });
    const o = influenceChart(siteInfluenceOneStep(table, spec, fitModel(table, spec), { coefficient: 'season', siteColumn: 'site' }), 'the trend per season');
    const wide = chartLayout(o, CHART_WIDTH);
    const narrow = chartLayout(o, 560);
    expect(wide.subtitleLines).toBeGreaterThanOrEqual(2);
    expect(narrow.titleLines).toBe(2);
    expect(narrow.subtitleLines).toBeGreaterThan(wide.subtitleLines);
    expect(narrow.gridTop).toBe(FRAME.titleTop + 2 * FRAME.titleLine + FRAME.titleGap + narrow.subtitleLines * FRAME.subtitleLine + FRAME.plotGap + FRAME.axisNameLine + FRAME.axisNameGap);
    const laid = layoutChart(o, 560) as { title: { textStyle: { width: number }; subtextStyle: { width: number } } };
    expect(laid.title.textStyle.width).toBe(536);
    expect(laid.title.subtextStyle.width).toBe(536);
  });
});

describe('axis titles, the same rule on every chart', () => {
  const res = quantileResiduals(quineFit('negbin'), { seed: 4 });
  const table = simulateSites(5, { sites: 12, seasons: 6, slope: -0.04, theta: 2, siteSd: 0.7, baseMean: 3 });
  const spec = parseModelSpec({ response: 'count', distribution: 'negbin', predictors: [{ column: 'season', type: 'numeric' }], offsets: [{ column: 'effort_h', log: true }] });
  const fit = fitModel(table, spec);
  const charts: [string, ChartOption][] = [
    ['frequencies', frequenciesOf(2)],
    ['rootogram', rootogramChart(hangingRootogram(countFrequencies([{ label: 'Negative binomial', fit: quineFit('negbin') }], { tailFrom: 12 })))],
    ['residuals', residualsVsFittedChart(res, 'Negative binomial')],
    ['residuals by group', residualsByGroupChart(res, residualGroups(res, quineTable(), 'Age'), 'Negative binomial')],
    ['qq', qqChart(qqEnvelope(quineFit('negbin'), res, { simulations: 19, seed: 2 }), 'Negative binomial')],
    ['mean-variance', meanVarianceChart(meanVarianceBySite(table, fit, { siteColumn: 'site', effortColumn: 'effort_h' }))],
    ['influence', influenceChart(siteInfluenceOneStep(table, spec, fit, { coefficient: 'season', siteColumn: 'site' }))],
    ['zeros', zerosChart(zeroCounts([{ label: 'Negative binomial', fit: quineFit('negbin') }]))],
    ['index', indexChart([{ time: 2020, index: 100, lower: 100, upper: 100 }, { time: 2021, index: 90, lower: 70, upper: 115 }])],
  ];
  for (const [name, o] of charts)
    it(`${name}: vertical axis title above the plot, left-aligned at the axis; horizontal one centred below`, () => {
      const y = o.yAxis as { name: string; nameLocation: string; nameGap: number; nameTextStyle: { align: string; verticalAlign: string; lineHeight: number } };
      const x = o.xAxis as { nameLocation: string };
      expect(y.nameLocation).toBe('end');
      expect(y.nameTextStyle.align).toBe('left');
      expect(y.nameTextStyle.verticalAlign).toBe('bottom');
      expect(x.nameLocation).toBe('middle');
      // The name's lines and gap fit between the legend (or the title block) and the plot.
      const at = chartLayout(o, CHART_WIDTH);
      expect(at.axisNameLines).toBeGreaterThanOrEqual(1);
      const above = at.legendRows ? at.legendTop + at.legendRows * FRAME.legendLine + (at.legendRows - 1) * FRAME.legendItemGap : at.legendTop - FRAME.legendGap;
      expect(gridTop(o) - above).toBe(FRAME.plotGap + at.axisNameLines * y.nameTextStyle.lineHeight + y.nameGap);
    });

  it('zeros: model names under the bars break at the width of a bar\'s band', () => {
    const o = zerosChart(zeroCounts(labelledFits(6)));
    const label = (c: ChartOption) => (c.xAxis as { axisLabel: { width: number; overflow: string; interval: number } }).axisLabel;
    // Seven bands (observed and six models) across the plot: 760 - 64 - 24 = 672 px, 96 a band.
    expect(label(o)).toMatchObject({ width: 90, overflow: 'break', interval: 0 });
    expect(label(layoutChart(o, 560)).width).toBe(Math.floor((560 - FRAME.gridLeft - FRAME.gridRight) / 7 - 6));
    // Axes that do not ask for it keep echarts' own labels.
    expect((frequenciesOf(1).xAxis as { axisLabel: { width?: number } }).axisLabel.width).toBeUndefined();
  });

  it('a long vertical axis title wraps onto two lines on a narrow chart, and the plot moves down for it', () => {
    const o = residualsVsFittedChart(res, 'Negative binomial');
    const name = (o.yAxis as { name: string }).name;
    // Wide enough for the title on one line at 560 px; at 300 px it takes two.
    expect(chartLayout(o, 560).axisNameLines).toBe(1);
    const tight = chartLayout(o, 300);
    expect(tight.axisNameLines).toBe(wrappedLines(name, 300 - FRAME.gridLeft - FRAME.side, FRAME.axisNameSize));
    expect(tight.axisNameLines).toBe(2);
    expect(((layoutChart(o, 300).yAxis as { nameTextStyle: { width: number } }).nameTextStyle.width)).toBe(300 - FRAME.gridLeft - FRAME.side);
  });
});

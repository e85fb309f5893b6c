/**
 * The hanging rootogram: sqrt(expected) as a line, sqrt(observed) as a bar
 * hanging from it, drawn as a transparent bar up to each bar's bottom with
 * the visible bar stacked on it (stackStrategy 'all', so a bottom below zero
 * works), and the zero line to read the misfit against.
 */
import type { HangingRootogram } from '../diagnostics/rootogram';
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { categoryAxis, chartFrame, chartNumber, horizontalLine, valueAxis } from './chart-style';
import { greys, seriesColour, seriesMark } from './palette';

export const ROOTOGRAM_TITLE = 'Where does the model miss? Hanging rootogram';

export function rootogramChart(root: HangingRootogram, modelIndex = 0): ChartOption {
  const labels = root.bins.map((b) => b.label);
  const colour = seriesColour(modelIndex);
  const mark = seriesMark(modelIndex);
  return layoutChart({
    ...chartFrame({
      title: ROOTOGRAM_TITLE,
      subtitle: `${root.model}. Bars (square root of the records observed) hang from the curve (square root of those expected); a bar ending below zero means the model expects too few of that count, above zero too many.`,
      legendNames: ['Observed (hanging)', `Expected: ${root.model}`],
    }),
    xAxis: categoryAxis('Count per record', labels),
    yAxis: valueAxis({ name: 'Square root of records' }, 'y'),
    series: [
      {
        id: 'hanging-base',
        name: 'hanging-base',
        type: 'bar',
        stack: 'hanging',
        stackStrategy: 'all',
        silent: true,
        tooltip: { show: false },
        itemStyle: { color: 'transparent' },
        data: root.bins.map((b) => chartNumber(b.bottom)),
        barCategoryGap: '20%',
      },
      {
        id: 'observed',
        name: 'Observed (hanging)',
        type: 'bar',
        stack: 'hanging',
        stackStrategy: 'all',
        itemStyle: { color: greys.observed },
        data: root.bins.map((b, k) => ({ value: chartNumber(b.sqrtObserved), count: b.label, rows: root.rowsByBin[k] })),
      },
      {
        id: `expected:${root.model}`,
        name: `Expected: ${root.model}`,
        type: 'line',
        data: root.bins.map((b) => chartNumber(b.sqrtExpected)),
        symbol: mark.symbol,
        symbolSize: 7,
        itemStyle: { color: colour },
        lineStyle: { color: colour, width: 2, type: mark.dash },
        z: 3,
        markLine: horizontalLine(0, 'zero'),
      },
    ],
  });
}

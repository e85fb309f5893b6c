/** Observed and expected count frequencies, several models overlaid. */
import type { CountFrequencies } from '../diagnostics/count-frequencies';
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { categoryAxis, chartFrame, chartNumber, valueAxis } from './chart-style';
import { greys, seriesColour, seriesMark } from './palette';

export const FREQUENCY_TITLE = 'Do the counts fit? Observed and expected frequencies';

export function frequencyChart(freq: CountFrequencies): ChartOption {
  const notes = [...new Set(freq.models.map((m) => m.note).filter((n): n is string => n !== null))];
  const observed = freq.observed.map((value, k) => ({ value, count: freq.labels[k], rows: freq.rowsByBin[k] }));
  return layoutChart({
    ...chartFrame({ title: FREQUENCY_TITLE, subtitle: [`${freq.nobs} records; the last bar holds every count of ${freq.tailFrom} or more.`, ...notes].join(' ') }),
    xAxis: categoryAxis('Count per record', freq.labels),
    yAxis: valueAxis({ name: 'Records', min: 0 }, 'y'),
    series: [
      { id: 'observed', name: 'Observed', type: 'bar', data: observed, itemStyle: { color: greys.observed }, barCategoryGap: '20%' },
      ...freq.models.map((m, k) => ({
        id: `expected:${m.label}`,
        name: `Expected: ${m.label}`,
        type: 'line' as const,
        data: m.expected.map(chartNumber),
        // Model lines cross: each has its own symbol and dash as well as its colour.
        symbol: seriesMark(k).symbol,
        symbolSize: 7,
        itemStyle: { color: seriesColour(k) },
        lineStyle: { color: seriesColour(k), width: 2, type: seriesMark(k).dash },
      })),
    ],
  });
}

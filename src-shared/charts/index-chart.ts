/**
 * The annual index for the trend report: the index per time value with its
 * limits as a band (a transparent line at the lower limit with the band's
 * width stacked on it) and the base line at 100. Takes the `indices` of the
 * trend output (shared/cli-contract.md).
 */
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { bandSeries, categoryAxis, chartFrame, chartNumber, horizontalLine, valueAxis } from './chart-style';
import { seriesColour } from './palette';

export interface IndexPoint {
  readonly time: number | string;
  readonly index: number;
  readonly lower: number;
  readonly upper: number;
}

export interface IndexChartParts {
  /** What was counted, for the title ("Reed warbler"). */
  readonly subject?: string;
  /** Name of the time axis with its unit ("Season (year)"). */
  readonly timeName?: string;
  /** A plain sentence for under the title (the model, the limits). */
  readonly note?: string;
}

export function indexTitle(subject?: string): string {
  return subject ? `How has ${subject} changed? Annual index (base year = 100)` : 'How have the counts changed? Annual index (base year = 100)';
}

export function indexChart(points: readonly IndexPoint[], parts: IndexChartParts = {}): ChartOption {
  const times = points.map((p) => String(p.time));
  return layoutChart({
    ...chartFrame({ title: indexTitle(parts.subject), subtitle: parts.note ?? 'Shaded: 95% limits of the index.', legendNames: ['95% limits', 'Index'] }),
    xAxis: { ...categoryAxis(parts.timeName ?? 'Season', times), boundaryGap: false },
    yAxis: valueAxis({ name: 'Index (base year = 100)', min: 0 }, 'y'),
    series: [
      ...bandSeries({ id: 'limits', label: '95% limits', lower: points.map((p) => chartNumber(p.lower)), width: points.map((p) => chartNumber(p.upper - p.lower)) }),
      {
        id: 'index',
        name: 'Index',
        type: 'line',
        symbol: 'circle',
        symbolSize: 6,
        itemStyle: { color: seriesColour(0) },
        lineStyle: { color: seriesColour(0), width: 2 },
        data: points.map((p) => ({ value: chartNumber(p.index), time: p.time, lower: chartNumber(p.lower), upper: chartNumber(p.upper) })),
        markLine: horizontalLine(100, 'base = 100'),
        z: 3,
      },
    ],
  });
}

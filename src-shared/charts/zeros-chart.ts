/** Observed zeros beside the zeros each model expects (bars; value = records, share in the data). */
import type { ZeroCounts } from '../diagnostics/zero-counts';
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { categoryAxis, chartFrame, chartNumber, valueAxis } from './chart-style';
import { greys, seriesColour } from './palette';

export const ZEROS_TITLE = 'Are there more zeros than the models expect?';

export function zerosChart(z: ZeroCounts): ChartOption {
  const labels = ['Observed', ...z.models.map((m) => m.label)];
  const data = [
    { value: z.observed, share: chartNumber(z.observedShare), rows: z.zeroRows, itemStyle: { color: greys.observed } },
    ...z.models.map((m, k) => ({ value: chartNumber(m.expected), share: chartNumber(m.expectedShare), itemStyle: { color: seriesColour(k) } })),
  ];
  const pct = (v: number) => `${Math.round(v * 1000) / 10}%`;
  return layoutChart({
    ...chartFrame({
      title: ZEROS_TITLE,
      subtitle: `${z.observed} of ${z.nobs} records (${pct(z.observedShare)}) are zero; ${z.models.map((m) => `${m.label} expects ${chartNumber(m.expected)} (${pct(m.expectedShare)})`).join('; ')}.`,
      legend: false,
    }),
    // Every model's name under its bar, broken onto lines as wide as the bar's band (chart-layout.ts sets the width).
    xAxis: (() => {
      const axis = categoryAxis('', labels);
      return { ...axis, axisLabel: { ...axis.axisLabel, interval: 0, overflow: 'break' as const, lineHeight: 14 } };
    })(),
    yAxis: valueAxis({ name: 'Records with a count of 0', min: 0 }, 'y'),
    series: [{ id: 'zeros', name: 'Zero counts', type: 'bar', data, barMaxWidth: 48 }],
  });
}

/**
 * Normal QQ plot of the residuals with the simulation envelope as a band
 * (a transparent line at the lower limit with the band's width stacked on it),
 * the line y = x, and points outside the envelope in the attention colour.
 * Point data: [normal quantile, residual, table row].
 */
import type { QqEnvelope } from '../diagnostics/qq-envelope';
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { bandSeries, chartFrame, chartNumber, pickedEmphasis, valueAxis } from './chart-style';
import { attention, attentionSymbol, greys, seriesColour } from './palette';
import { POINT_ENCODE } from './residual-charts';

export const QQ_TITLE = 'Are the residuals normal? QQ plot with simulation envelope';

export function qqChart(env: QqEnvelope, modelLabel: string): ChartOption {
  const pts = env.points;
  const point = (p: (typeof pts)[number]) => [chartNumber(p.theoretical), chartNumber(p.residual), p.row];
  const lo = pts.length ? pts[0].theoretical : -3;
  const hi = pts.length ? pts[pts.length - 1].theoretical : 3;
  const share = Math.round(env.outsideShare * 1000) / 10;
  return layoutChart({
    ...chartFrame({
      title: QQ_TITLE,
      subtitle: `${modelLabel}: ${share}% of ${pts.length} points outside the ${Math.round(env.level * 100)}% envelope (${env.simulations} simulations). ${env.method}`,
      legendNames: [`${Math.round(env.level * 100)}% envelope`, 'y = x', 'Residuals', 'Outside the envelope'],
    }),
    xAxis: valueAxis({ name: 'Standard normal quantile' }, 'x'),
    yAxis: valueAxis({ name: 'Randomized quantile residual' }, 'y'),
    series: [
      ...bandSeries({
        id: 'envelope',
        label: `${Math.round(env.level * 100)}% envelope`,
        lower: pts.map((p) => [chartNumber(p.theoretical), chartNumber(p.lower)]),
        width: pts.map((p) => [chartNumber(p.theoretical), chartNumber(p.upper - p.lower)]),
        stackAll: true,
      }),
      {
        id: 'identity',
        name: 'y = x',
        type: 'line',
        silent: true,
        symbol: 'none',
        lineStyle: { color: greys.axis, type: 'dashed', width: 1 },
        itemStyle: { color: greys.axis },
        data: [
          [chartNumber(lo), chartNumber(lo)],
          [chartNumber(hi), chartNumber(hi)],
        ],
      },
      { id: 'inside', name: 'Residuals', type: 'scatter', symbolSize: 5, itemStyle: { color: seriesColour(0) }, encode: POINT_ENCODE, emphasis: pickedEmphasis, data: pts.filter((p) => !p.outside).map(point), z: 3 },
      { id: 'outside', name: 'Outside the envelope', type: 'scatter', symbol: attentionSymbol, symbolSize: 8, itemStyle: { color: attention }, encode: POINT_ENCODE, emphasis: pickedEmphasis, data: pts.filter((p) => p.outside).map(point), z: 4 },
    ],
  });
}

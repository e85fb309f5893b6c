/**
 * Mean against variance by site on log-log axes, with the Poisson line
 * (variance = mean) and the fitted negative-binomial curve. Sites whose mean
 * or variance is 0 cannot sit on a log axis; the subtitle says how many.
 * Point data: [mean, variance, site, records].
 */
import type { MeanVariance } from '../diagnostics/mean-variance';
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { chartFrame, chartNumber, pickedEmphasis, valueAxis } from './chart-style';
import { greys, seriesColour } from './palette';

export const MEAN_VARIANCE_TITLE = 'Are the counts overdispersed? Variance against mean by site';

/** `negbinFrom` names the model the curve's theta comes from when it is not the model of the other charts. */
export function meanVarianceChart(mv: MeanVariance, negbinFrom?: string): ChartOption {
  const shown = mv.sites.filter((s) => s.mean > 0 && s.variance > 0);
  const hidden = mv.sites.length - shown.length;
  const unit = mv.effortColumn ? ` per unit of ${mv.effortColumn}` : ' per record';
  const notes = [
    `${shown.length} sites (${mv.siteColumn}).`,
    hidden ? `${hidden} site${hidden > 1 ? 's' : ''} with a mean or variance of 0 not shown on the log scale.` : '',
    mv.singleRecordSites.length ? `${mv.singleRecordSites.length} site${mv.singleRecordSites.length > 1 ? 's' : ''} with one record left out.` : '',
    mv.effortColumn ? `Curves drawn for the mean effort per record (${chartNumber(mv.meanEffort)}).` : '',
    mv.negbin && negbinFrom ? `Negative-binomial curve from ${negbinFrom}.` : '',
    mv.negbin ? '' : 'Fit a negative binomial to see its curve.',
  ];
  const curve = (pts: { mean: number; variance: number }[]) => pts.map((p) => [chartNumber(p.mean), chartNumber(p.variance)]);
  return layoutChart({
    ...chartFrame({ title: MEAN_VARIANCE_TITLE, subtitle: notes.filter(Boolean).join(' ') }),
    xAxis: valueAxis({ name: `Mean count${unit} (log scale)`, log: true }, 'x'),
    yAxis: valueAxis({ name: `Variance${unit} (log scale)`, log: true }, 'y'),
    series: [
      {
        id: 'sites',
        name: 'Sites',
        type: 'scatter',
        symbolSize: 7,
        itemStyle: { color: greys.observed },
        emphasis: pickedEmphasis,
        data: shown.map((s) => ({ value: [chartNumber(s.mean), chartNumber(s.variance)], site: s.site, rows: s.rows })),
      },
      { id: 'poisson', name: 'Poisson: variance = mean', type: 'line', symbol: 'none', lineStyle: { color: seriesColour(0), width: 2, type: 'dashed' }, itemStyle: { color: seriesColour(0) }, data: curve(mv.poisson) },
      ...(mv.negbin
        ? [
            {
              id: 'negbin',
              name: `Negative binomial: variance = mean + mean²/${chartNumber(mv.theta)}`,
              type: 'line' as const,
              symbol: 'none',
              lineStyle: { color: seriesColour(1), width: 2 },
              itemStyle: { color: seriesColour(1) },
              data: curve(mv.negbin),
            },
          ]
        : []),
    ],
  });
}

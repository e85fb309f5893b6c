/**
 * Influence by site: the change in the chosen coefficient when each site is
 * left out, as bars in site order, with dashed lines at +-1 standard error
 * (a site beyond them moves the estimate by more than its uncertainty).
 * Bar data carries the site, its records and its Cook's-style distance.
 */
import type { SiteInfluence } from '../diagnostics/site-influence';
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { categoryAxis, chartFrame, chartNumber, pickedEmphasis, valueAxis } from './chart-style';
import { attention, greys, seriesColour } from './palette';

export function influenceTitle(coefficient: string): string {
  return `Does one site drive the result? Change in ${coefficient} without each site`;
}

/** `meaning` says in words what the coefficient measures (e.g. "the trend per season"). */
export function influenceChart(infl: SiteInfluence, meaning?: string): ChartOption {
  const se = infl.se;
  const missing = infl.sites.filter((s) => s.change === null).length;
  const data = infl.sites.map((s) => ({
    value: chartNumber(s.change),
    site: s.site,
    rows: s.rows,
    cooksDistance: chartNumber(s.cooksDistance),
    itemStyle: { color: s.change !== null && Math.abs(s.change) > se ? attention : seriesColour(0) },
  }));
  const largest = infl.sites.reduce<(typeof infl.sites)[number] | null>((a, s) => (s.change !== null && (!a || Math.abs(s.change) > Math.abs(a.change ?? 0)) ? s : a), null);
  const largestNote = largest && se > 0 ? ` Largest change: ${largest.site}, ${chartNumber(largest.change)} (${Math.round((100 * Math.abs(largest.change ?? 0)) / se)}% of a standard error).` : '';
  const frame = chartFrame({
    title: influenceTitle(infl.coefficient),
    subtitle: `${meaning ? `${infl.coefficient} is ${meaning}. ` : ''}${infl.methodNote} Estimate ${chartNumber(infl.estimate)}, standard error ${chartNumber(se)}.${largestNote}${missing ? ` ${missing} site${missing > 1 ? 's' : ''} without a value.` : ''}`,
    legend: false,
  });
  return layoutChart({
    ...frame,
    xAxis: categoryAxis(infl.siteColumn, infl.sites.map((s) => s.site)),
    yAxis: valueAxis({ name: `Change in ${infl.coefficient} (linear-predictor scale)` }, 'y'),
    series: [
      {
        id: 'change',
        name: `Change in ${infl.coefficient}`,
        type: 'bar',
        data,
        emphasis: { itemStyle: pickedEmphasis.itemStyle },
        markLine: {
          silent: true,
          symbol: ['none', 'none'],
          lineStyle: { color: greys.axis, type: 'dashed', width: 1 },
          label: { formatter: '{b}', color: greys.axis, position: 'insideEndTop' },
          data: [
            { yAxis: chartNumber(se) ?? 0, name: '+1 SE' },
            { yAxis: chartNumber(-se) ?? 0, name: '-1 SE' },
          ],
        },
      },
    ],
  });
}

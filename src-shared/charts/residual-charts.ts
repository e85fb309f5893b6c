/**
 * Randomized quantile residuals against fitted values and against a table
 * column (season, site). Each point's data is [x, residual, table row] so a
 * click leads back to the record; dashed lines at 0 and +-2.
 */
import type { QuantileResiduals } from '../diagnostics/quantile-residuals';
import type { ResidualGroups } from '../diagnostics/residual-groups';
import type { ChartOption } from './chart-style';
import { layoutChart } from './chart-layout';
import { categoryAxis, chartFrame, chartNumber, pickedEmphasis, valueAxis } from './chart-style';
import { greys, seriesColour } from './palette';

export const RESIDUALS_FITTED_TITLE = 'Is anything left over? Residuals against fitted values';

export function residualsTitle(column: string): string {
  return `Is anything left over? Residuals by ${column}`;
}

const RESIDUAL_AXIS = 'Randomized quantile residual (standard normal scale)';

/** The third value of a point is its table row: kept for the link to the records, left out of the tooltip. */
export const POINT_ENCODE = { x: 0, y: 1, tooltip: [0, 1] };

function referenceLines() {
  return {
    silent: true,
    symbol: ['none', 'none'],
    lineStyle: { color: greys.axis, type: 'dashed' as const, width: 1 },
    label: { show: false },
    data: [{ yAxis: -2 }, { yAxis: 0 }, { yAxis: 2 }],
  };
}

function subtitle(res: QuantileResiduals): string {
  return [`${res.residual.length} rows of the fitted table; residuals drawn with seed ${res.seed}. About 95% of them lie between -2 and 2 when the model fits.`, res.note ?? ''].join(' ').trim();
}

export function residualsVsFittedChart(res: QuantileResiduals, modelLabel: string): ChartOption {
  const positive = res.fitted.every((f) => f > 0);
  const data = Array.from(res.residual, (r, i) => [chartNumber(res.fitted[i]), chartNumber(r), res.rows[i]]);
  return layoutChart({
    ...chartFrame({ title: RESIDUALS_FITTED_TITLE, subtitle: subtitle(res) }),
    xAxis: valueAxis({ name: positive ? 'Fitted count per record (log scale)' : 'Fitted count per record', log: positive }, 'x'),
    yAxis: valueAxis({ name: RESIDUAL_AXIS }, 'y'),
    series: [{ id: 'residuals', name: modelLabel, type: 'scatter', symbolSize: 5, itemStyle: { color: seriesColour(0), opacity: 0.7 }, encode: POINT_ENCODE, data, emphasis: pickedEmphasis, markLine: referenceLines() }],
  });
}

export function residualsByGroupChart(res: QuantileResiduals, groups: ResidualGroups, modelLabel: string): ChartOption {
  // x is the level's name (a category axis takes names), so the tooltip names the site or season.
  const data = Array.from(res.residual, (r, i) => [groups.levels[groups.levelOf[i]], chartNumber(r), res.rows[i]]);
  return layoutChart({
    ...chartFrame({ title: residualsTitle(groups.column), subtitle: subtitle(res) }),
    xAxis: categoryAxis(groups.column, groups.levels),
    yAxis: valueAxis({ name: RESIDUAL_AXIS }, 'y'),
    series: [
      { id: 'residuals', name: modelLabel, type: 'scatter', symbolSize: 5, itemStyle: { color: seriesColour(0), opacity: 0.6 }, encode: POINT_ENCODE, data, emphasis: pickedEmphasis, markLine: referenceLines() },
      {
        id: 'median',
        name: `Median per ${groups.column}`,
        type: 'scatter',
        symbol: 'rect',
        symbolSize: [14, 3],
        itemStyle: { color: greys.ink },
        data: groups.median.map((m, k) => [groups.levels[k], chartNumber(m)]),
        z: 3,
      },
    ],
  });
}

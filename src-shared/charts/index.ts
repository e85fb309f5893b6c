/** echarts option builders for the diagnostics and the trend report, and the palette. */
export { seriesColours, seriesColour, seriesMarks, seriesMark, greys, attention, attentionSymbol } from './palette';
export type { SeriesMark, LineDash } from './palette';
export { chartNumber } from './chart-style';
export { chartSummary } from './chart-summary';
export type { ChartOption } from './chart-style';
export { frequencyChart, FREQUENCY_TITLE } from './frequency-chart';
export { rootogramChart, ROOTOGRAM_TITLE } from './rootogram-chart';
export { residualsVsFittedChart, residualsByGroupChart, residualsTitle, RESIDUALS_FITTED_TITLE } from './residual-charts';
export { qqChart, QQ_TITLE } from './qq-chart';
export { meanVarianceChart, MEAN_VARIANCE_TITLE } from './mean-variance-chart';
export { influenceChart, influenceTitle } from './influence-chart';
export { zerosChart, ZEROS_TITLE } from './zeros-chart';
export { indexChart, indexTitle } from './index-chart';
export type { IndexChartParts, IndexPoint } from './index-chart';

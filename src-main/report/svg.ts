/** Draws the report's charts as SVG with echarts' server-side renderer (no DOM needed). */
import * as echarts from 'echarts';
import type { ChartOption } from '@shared/charts/chart-style';
import { layoutChart } from '@shared/charts/chart-layout';
import { measureCssFont } from '@shared/charts/text-width';
import type { ChartSvgs } from '@shared/report/html';
import { chartBlocks, type ReportDocument } from '@shared/report/model';

// Text is measured as the report sets it (DejaVu Sans), so legend items and wrapped lines get the room they take there.
echarts.setPlatformAPI({ measureText: measureCssFont });

/** `option` laid out again for `width` (its title, legend and axis names wrap there), then drawn. */
export function renderChartSvg(option: ChartOption, width: number, height: number): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height });
  try {
    chart.setOption(layoutChart(option, width));
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}

/** Every chart of a document as SVG, by chart id. */
export function renderDocumentCharts(doc: ReportDocument): ChartSvgs {
  return Object.fromEntries(chartBlocks(doc).map((c) => [c.id, renderChartSvg(c.option, c.width, c.height)]));
}

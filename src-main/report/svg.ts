/** Draws the report's charts as SVG with echarts' server-side renderer (no DOM needed). */
import * as echarts from 'echarts';
import type { ChartOption } from '@shared/charts/chart-style';
import type { ChartSvgs } from '@shared/report/html';
import { chartBlocks, type ReportDocument } from '@shared/report/model';

export function renderChartSvg(option: ChartOption, width: number, height: number): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height });
  try {
    chart.setOption(option);
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}

/** Every chart of a document as SVG, by chart id. */
export function renderDocumentCharts(doc: ReportDocument): ChartSvgs {
  return Object.fromEntries(chartBlocks(doc).map((c) => [c.id, renderChartSvg(c.option, c.width, c.height)]));
}

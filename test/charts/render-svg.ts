/** Renders an option with echarts' server-side SVG renderer, as the report does. */
import type { ChartOption } from '@shared/charts';
import { renderChartSvg } from '../../src-main/report/svg';

export function renderSvg(option: ChartOption, width = 800, height = 500): string {
  return renderChartSvg(option, width, height);
}

/** Shapes filled with a colour (echarts writes fill="#rrggbb" in upper case as given). */
export function filled(svg: string, colour: string): number {
  return svg.split(`fill="${colour}"`).length - 1;
}

/** Every number in an option is finite (JSON would turn NaN or Infinity into null silently). */
export function nonFiniteNumbers(value: unknown, path = 'option'): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [path];
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFiniteNumbers(v, `${path}[${i}]`));
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => nonFiniteNumbers(v, `${path}.${k}`));
  return [];
}

export function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/**
 * The vertical layout of a chart at a given width: the title and the
 * sentence under it wrap to the width, the legend wraps onto as many rows
 * as its items need, the vertical axis's name sits in a line of its own
 * above the plot, and the plot (the grid) starts below all of them. echarts
 * wraps text and legends itself but does not move the grid out of their
 * way, so the room is counted here from the option's own text (measured
 * by the caller, or estimated: text-width.ts) and written into the
 * option. The builders lay a chart out for the report's width; the screen
 * lays it out again whenever its box changes width, the report at the
 * width it draws.
 */
import type { ChartOption } from './chart-style';
import { estimatedWidth, wrappedLines, type MeasureText } from './text-width';

/** The width the builders lay a chart out for: the report's (its charts are 760 px wide). */
export const CHART_WIDTH = 760;

/** Sizes in px: each text has an explicit line height, so the count below is what echarts draws. */
export const FRAME = {
  side: 12,
  titleTop: 8,
  titleSize: 15,
  titleLine: 20,
  titleGap: 6,
  subtitleSize: 11,
  subtitleLine: 15,
  legendGap: 10,
  legendSize: 12,
  legendLine: 14,
  /** Between legend items in a row and between rows (echarts uses one gap for both). */
  legendItemGap: 10,
  legendIconWidth: 16,
  legendIconHeight: 10,
  /** echarts puts 5 px between a legend item's icon and its text. */
  legendTextGap: 5,
  axisNameSize: 12,
  axisNameLine: 14,
  /** From the vertical axis's name to the plot's top edge. */
  axisNameGap: 10,
  plotGap: 12,
  gridLeft: 64,
  gridRight: 24,
  gridBottom: 56,
} as const;

export interface ChartLayout {
  /** The width the title and subtitle wrap at. */
  readonly textWidth: number;
  readonly titleLines: number;
  readonly subtitleLines: number;
  readonly legendTop: number;
  readonly legendRows: number;
  /** Lines of the vertical axis's name above the plot (0 without a name). */
  readonly axisNameLines: number;
  readonly gridTop: number;
}

type TitleLike = { text?: unknown; subtext?: unknown };
type LegendLike = { show?: unknown; data?: unknown };
type SeriesLike = { name?: unknown };
type AxisLike = { name?: unknown; nameTextStyle?: object };

function one<T>(v: unknown): T | undefined {
  return (Array.isArray(v) ? v[0] : v) as T | undefined;
}

/** Names the legend shows: its data when given, else every series' name (once each), as echarts does. */
export function legendNames(option: ChartOption): string[] {
  const legend = one<LegendLike>(option.legend);
  if (!legend || legend.show === false) return [];
  const names = Array.isArray(legend.data) ? legend.data.map((d) => (d && typeof d === 'object' ? (d as { name?: unknown }).name : d)) : (Array.isArray(option.series) ? option.series : option.series ? [option.series] : []).map((s) => (s as SeriesLike).name);
  return [...new Set(names.filter((n) => n !== undefined && n !== null && n !== '').map(String))];
}

/** Rows the legend takes when its items are laid left to right and wrapped at `width`. */
export function legendRows(names: readonly string[], width: number, measure: MeasureText = estimatedWidth): number {
  let rows = 0;
  let x = 0;
  for (const name of names) {
    // A line's icon reaches 1 px past its box on the left.
    const w = 1 + FRAME.legendIconWidth + FRAME.legendTextGap + measure(name, FRAME.legendSize, false);
    if (rows === 0 || (x > 0 && x + w > width)) {
      rows++;
      x = 0;
    }
    x += w + FRAME.legendItemGap;
  }
  return rows;
}

/** Where the parts of `option` go at `width` px. */
export function chartLayout(option: ChartOption, width: number, measure: MeasureText = estimatedWidth): ChartLayout {
  const title = one<TitleLike>(option.title) ?? {};
  const text = Math.max(120, width - 2 * FRAME.side);
  const titleLines = Math.max(1, wrappedLines(String(title.text ?? ''), text, FRAME.titleSize, true, measure));
  const subtitleLines = wrappedLines(String(title.subtext ?? ''), text, FRAME.subtitleSize, false, measure);
  const titleBottom = FRAME.titleTop + titleLines * FRAME.titleLine + (subtitleLines ? FRAME.titleGap + subtitleLines * FRAME.subtitleLine : 0);
  const legendTop = titleBottom + FRAME.legendGap;
  const rows = legendRows(legendNames(option), text, measure);
  const legendBottom = rows ? legendTop + rows * FRAME.legendLine + (rows - 1) * FRAME.legendItemGap : titleBottom;
  const axisName = String(one<AxisLike>(option.yAxis)?.name ?? '');
  const axisNameLines = wrappedLines(axisName, axisNameWidth(width), FRAME.axisNameSize, false, measure);
  const gridTop = legendBottom + FRAME.plotGap + (axisNameLines ? axisNameLines * FRAME.axisNameLine + FRAME.axisNameGap : 0);
  return { textWidth: text, titleLines, subtitleLines, legendTop, legendRows: rows, axisNameLines, gridTop };
}

/** The vertical axis's name starts at the axis line and may run to the chart's right edge. */
function axisNameWidth(width: number): number {
  return Math.max(80, width - FRAME.gridLeft - FRAME.side);
}

/**
 * The plot's top edge for the common case (a title and a subtitle of one
 * line each, one legend row, a one-line axis name): a chart whose top is
 * lower needs that much more height to keep its plot the same size.
 */
export const USUAL_GRID_TOP = FRAME.titleTop + FRAME.titleLine + FRAME.titleGap + FRAME.subtitleLine + FRAME.legendGap + FRAME.legendLine + FRAME.plotGap + FRAME.axisNameLine + FRAME.axisNameGap;

/** `option` with its title, legend, grid and vertical axis name placed for `width` px (or as `at` says). */
export function layoutChart(option: ChartOption, width: number = CHART_WIDTH, at: ChartLayout = chartLayout(option, width)): ChartOption {
  const title = one<Record<string, unknown>>(option.title);
  const legend = one<Record<string, unknown>>(option.legend);
  const grid = one<Record<string, unknown>>(option.grid);
  const yAxis = one<AxisLike & Record<string, unknown>>(option.yAxis);
  const style = (v: unknown) => (v && typeof v === 'object' ? (v as Record<string, unknown>) : {});
  return {
    ...option,
    ...(title
      ? {
          title: {
            ...title,
            textStyle: { ...style(title.textStyle), width: at.textWidth, overflow: 'break' },
            subtextStyle: { ...style(title.subtextStyle), width: at.textWidth, overflow: 'break' },
          },
        }
      : {}),
    // A width, not a right edge: echarts keeps only one of a legend's left and right.
    ...(legend && legend.show !== false ? { legend: { ...legend, top: at.legendTop, width: at.textWidth } } : {}),
    grid: { ...grid, top: at.gridTop },
    ...(bandLabels(option.xAxis, width) ?? {}),
    ...(yAxis && at.axisNameLines ? { yAxis: { ...yAxis, nameTextStyle: { ...style(yAxis.nameTextStyle), width: axisNameWidth(width), overflow: 'break' } } } : {}),
  } as ChartOption;
}

/**
 * A category axis whose labels break onto lines (`axisLabel.overflow:
 * 'break'`, as the zeros chart asks for long model names) gets the width of
 * one category's band to break at.
 */
function bandLabels(axis: unknown, width: number): { xAxis: object } | null {
  const x = one<{ type?: unknown; data?: unknown; axisLabel?: { overflow?: unknown } }>(axis);
  if (!x || x.type !== 'category' || x.axisLabel?.overflow !== 'break' || !Array.isArray(x.data) || !x.data.length) return null;
  const band = (width - FRAME.gridLeft - FRAME.gridRight) / x.data.length;
  return { xAxis: { ...x, axisLabel: { ...x.axisLabel, width: Math.max(24, Math.floor(band - 6)) } } };
}

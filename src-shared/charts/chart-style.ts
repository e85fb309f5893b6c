/**
 * The parts every Tallywise chart shares: the title block, axes with their
 * units, the grid and the legend, in one plain style (no shadows, no 3-D, no
 * animation, light grid lines). Options are plain JSON-serialisable data, so
 * the screen and echarts' server-side SVG renderer for the report draw the
 * same picture.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts';
import { FRAME } from './chart-layout';
import { greys } from './palette';

export type ChartOption = EChartsOption;

/** A number for a chart: finite values kept (rounded to 6 significant digits), anything else null (a gap). */
export function chartNumber(v: number | null | undefined): number | null {
  if (v === null || v === undefined || !Number.isFinite(v)) return null;
  return v === 0 ? 0 : Number(v.toPrecision(6));
}

const text = { color: greys.ink, fontFamily: 'sans-serif' };

export interface FrameParts {
  readonly title: string;
  /** One or two plain sentences under the title (method, what is left out). */
  readonly subtitle?: string;
  readonly legend?: boolean;
  /** Series shown in the legend (default all); helper series such as a band's base are left out. */
  readonly legendNames?: readonly string[];
}

/**
 * Title, legend, grid, tooltip and text style. Where the legend and the
 * plot start depends on how the text wraps: chart-layout.ts places them
 * (the builders for the report's width, the screen and the report again
 * for the width they draw at).
 */
export function chartFrame(parts: FrameParts): ChartOption {
  return {
    animation: false,
    backgroundColor: '#FFFFFF',
    textStyle: text,
    title: {
      text: parts.title,
      subtext: parts.subtitle ?? '',
      left: FRAME.side,
      top: FRAME.titleTop,
      itemGap: FRAME.titleGap,
      textStyle: { ...text, fontSize: FRAME.titleSize, lineHeight: FRAME.titleLine, fontWeight: 'bold' },
      subtextStyle: { color: greys.axis, fontSize: FRAME.subtitleSize, lineHeight: FRAME.subtitleLine, overflow: 'break' },
    },
    legend:
      parts.legend === false
        ? { show: false }
        : {
            show: true,
            left: FRAME.side,
            padding: 0,
            itemGap: FRAME.legendItemGap,
            itemWidth: FRAME.legendIconWidth,
            itemHeight: FRAME.legendIconHeight,
            textStyle: { color: greys.axis, fontSize: FRAME.legendSize, lineHeight: FRAME.legendLine },
            ...(parts.legendNames ? { data: [...parts.legendNames] } : {}),
          },
    grid: { left: FRAME.gridLeft, right: FRAME.gridRight, bottom: FRAME.gridBottom, containLabel: false },
    tooltip: { trigger: 'item' },
  };
}

interface AxisParts {
  readonly name: string;
  readonly log?: boolean;
  readonly min?: number;
  readonly max?: number;
}

const axisLine = { lineStyle: { color: greys.axis } };
const splitLine = { lineStyle: { color: greys.grid } };

/**
 * Where an axis's title goes, the same on every chart: the horizontal
 * axis's centred under its labels; the vertical axis's on a line of its
 * own above the plot, starting at the axis line and read left to right,
 * so a long title ("Randomized quantile residual (standard normal scale)")
 * never runs past the plot's ends as a title turned along the axis does
 * on a short plot. chart-layout.ts leaves room for it above the grid.
 */
export function axisNamePlace(position: 'x' | 'y') {
  return position === 'x'
    ? { nameLocation: 'middle' as const, nameGap: 32, nameTextStyle: { color: greys.axis } }
    : { nameLocation: 'end' as const, nameGap: FRAME.axisNameGap, nameTextStyle: { color: greys.axis, fontSize: FRAME.axisNameSize, lineHeight: FRAME.axisNameLine, align: 'left' as const, verticalAlign: 'bottom' as const } };
}

/** A numeric axis with its title (units in the title: "Records", "Count per hour"). */
export function valueAxis(parts: AxisParts, position: 'x' | 'y') {
  return {
    type: parts.log ? ('log' as const) : ('value' as const),
    name: parts.name,
    ...axisNamePlace(position),
    axisLine: { show: true, onZero: false, ...axisLine },
    axisLabel: { color: greys.axis },
    splitLine: position === 'y' ? splitLine : { show: false },
    scale: !parts.log && parts.min === undefined,
    ...(parts.min !== undefined ? { min: parts.min } : {}),
    ...(parts.max !== undefined ? { max: parts.max } : {}),
  };
}

/** A category axis (count bins, seasons, sites, models). */
export function categoryAxis(name: string, data: readonly string[]) {
  return {
    type: 'category' as const,
    name,
    ...axisNamePlace('x'),
    data: [...data],
    axisLine,
    axisTick: { alignWithLabel: true },
    axisLabel: { color: greys.axis },
  };
}

/**
 * How a point or bar that leads to records looks when picked out (under
 * the pointer, or chosen from the keyboard on screen): opaque, larger, with
 * an ink ring, so it stands out among overlapping points.
 */
export const pickedEmphasis = { scale: 1.8, itemStyle: { opacity: 1, borderColor: greys.ink, borderWidth: 1.5 } };

/** A horizontal reference line (0 for residuals, 100 for an index), drawn with a line series' markLine. */
export function horizontalLine(value: number, label: string) {
  return {
    silent: true,
    symbol: ['none', 'none'],
    label: { formatter: label, position: 'insideEndTop' as const, color: greys.axis },
    lineStyle: { color: greys.axis, type: 'dashed' as const, width: 1 },
    data: [{ yAxis: value }],
  };
}

/**
 * A shaded band between two curves, drawn as two stacked line series: an
 * invisible lower edge and the band's width stacked on it. `lower` and
 * `width` are the series' data points (plain values or [x, y] pairs).
 */
export function bandSeries(parts: { id: string; label: string; lower: LineSeriesOption['data']; width: LineSeriesOption['data']; stackAll?: boolean }): LineSeriesOption[] {
  const common = {
    type: 'line' as const,
    stack: parts.id,
    ...(parts.stackAll ? { stackStrategy: 'all' as const } : {}),
    silent: true,
    symbol: 'none',
    // The fill is light; thin edges of 3:1 contrast (WCAG 2.1 SC 1.4.11) show where the band ends.
    lineStyle: { color: greys.bandEdge, width: 1 },
  };
  return [
    { id: `${parts.id}-lower`, name: `${parts.id}-lower`, ...common, tooltip: { show: false }, data: parts.lower },
    { id: parts.id, name: parts.label, ...common, itemStyle: { color: greys.band }, areaStyle: { color: greys.band, opacity: 0.8 }, data: parts.width },
  ];
}

/**
 * The parts every Tallywise chart shares: the title block, axes with their
 * units, the grid and the legend, in one plain style (no shadows, no 3-D, no
 * animation, light grid lines). Options are plain JSON-serialisable data, so
 * the screen and echarts' server-side SVG renderer for the report draw the
 * same picture.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts';
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

/** Title, legend, grid, tooltip and text style. */
export function chartFrame(parts: FrameParts): ChartOption {
  return {
    animation: false,
    backgroundColor: '#FFFFFF',
    textStyle: text,
    title: {
      text: parts.title,
      subtext: parts.subtitle ?? '',
      left: 12,
      top: 8,
      textStyle: { ...text, fontSize: 15, fontWeight: 'bold' },
      subtextStyle: { color: greys.axis, fontSize: 11, width: 640, overflow: 'break' },
    },
    legend:
      parts.legend === false
        ? { show: false }
        : { show: true, top: parts.subtitle ? 66 : 38, left: 12, textStyle: { color: greys.axis }, itemWidth: 16, itemHeight: 10, ...(parts.legendNames ? { data: [...parts.legendNames] } : {}) },
    grid: { left: 64, right: 24, top: parts.subtitle ? 104 : 72, bottom: 56, containLabel: false },
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

/** A numeric axis with its title (units in the title: "Records", "Count per hour"). */
export function valueAxis(parts: AxisParts, position: 'x' | 'y') {
  return {
    type: parts.log ? ('log' as const) : ('value' as const),
    name: parts.name,
    nameLocation: 'middle' as const,
    nameGap: position === 'x' ? 32 : 46,
    nameTextStyle: { color: greys.axis },
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
    nameLocation: 'middle' as const,
    nameGap: 32,
    nameTextStyle: { color: greys.axis },
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

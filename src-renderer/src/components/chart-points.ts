import type { EChartsOption } from 'echarts';

/**
 * The points of a drawn chart that the keyboard can reach: every data item
 * of the named series with a position on both axes, in the series' own
 * order. A point is [x, y, ...] (x a number, or a category name of the x
 * axis), or { value: [x, y] }, or a bar's { value: y } / y at its category
 * index. Items without a finite y (a gap, a site without a value) are left
 * out, as the chart draws nothing there.
 */
export interface ChartPoint {
  /** Index of the series in option.series, as echarts' actions take it. */
  readonly seriesIndex: number;
  readonly seriesId: string;
  /** Index of the item in the series' data. */
  readonly dataIndex: number;
  /** Position along the x axis: the value, or the category's index. */
  readonly x: number;
  readonly y: number;
  /** The category's name when the x axis has categories. */
  readonly category?: string;
  /** The item as the option holds it (what a click hands on). */
  readonly data: unknown;
}

type SeriesLike = { id?: unknown; data?: unknown };

/** The option's series as a list (echarts takes one series or several). */
export function seriesList(option: EChartsOption): SeriesLike[] {
  const s = option.series;
  return Array.isArray(s) ? (s as SeriesLike[]) : s ? [s as SeriesLike] : [];
}

function categories(option: EChartsOption): readonly string[] | null {
  const axis = Array.isArray(option.xAxis) ? option.xAxis[0] : option.xAxis;
  const a = axis as { type?: unknown; data?: unknown } | undefined;
  return a && a.type === 'category' && Array.isArray(a.data) ? a.data.map(String) : null;
}

function num(v: unknown): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

export function chartPoints(option: EChartsOption, seriesIds: readonly string[]): ChartPoint[] {
  const cats = categories(option);
  const out: ChartPoint[] = [];
  seriesList(option).forEach((s, seriesIndex) => {
    const seriesId = String(s.id ?? '');
    if (!seriesIds.includes(seriesId) || !Array.isArray(s.data)) return;
    s.data.forEach((data: unknown, dataIndex: number) => {
      const value = data && typeof data === 'object' && !Array.isArray(data) ? (data as { value?: unknown }).value : data;
      let x: number | null;
      let y: number | null;
      let category: string | undefined;
      if (Array.isArray(value)) {
        const raw = value[0];
        if (typeof raw === 'string' && cats) {
          x = cats.indexOf(raw);
          if (x < 0) x = null;
          category = raw;
        } else x = num(raw);
        y = num(value[1]);
      } else {
        x = dataIndex;
        y = num(value);
        if (cats) category = cats[dataIndex];
      }
      if (x === null || y === null) return;
      out.push({ seriesIndex, seriesId, dataIndex, x, y, ...(category !== undefined ? { category } : {}), data });
    });
  });
  return out;
}

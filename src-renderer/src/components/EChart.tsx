import { useEffect, useId, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import * as echarts from 'echarts';
import type { EChartsOption } from 'echarts';
import { chartSummary } from '@shared/charts/chart-summary';
import { chartLayout, layoutChart, USUAL_GRID_TOP } from '@shared/charts/chart-layout';
import { measureOnCanvas } from './canvas-text';
import { chartPoints, seriesList, type ChartPoint } from './chart-points';
import { nextPoint, pointOrder } from './point-keys';

/**
 * One echarts chart in a div, redrawn when its option changes and resized
 * with its box, with "Save PNG" and "Save SVG" links. The container carries
 * data attributes (series ids, number of points) so tests and assistive
 * tools can read what is drawn without the canvas, and holds the echarts
 * instance as `echartsInstance` (the browser tests read its option).
 * `onPointClick` receives a clicked point's data and its series id.
 *
 * Every chart has the title as its accessible name and a summary in words
 * (chartSummary) as its description. With `keyboard`, the chart is also a
 * stop in the Tab order: the arrow keys (and Home, End, Page Up, Page
 * Down; see point-keys.ts) pick out a point of the named series, which is
 * highlighted with its tooltip and described under the chart, and Enter
 * hands it to `onPointClick` as a click would. Escape or leaving the chart
 * lets it go.
 *
 * The chart is laid out for its box's width (chart-layout.ts: the title
 * and legend wrap, the plot starts below them) and is that much taller
 * when they take more room than usual, so the plot keeps its height. The
 * line under it keeps room for two lines whatever it says, so choosing a
 * point never moves what is below.
 */
export type PointClick = (data: unknown, seriesId: string) => void;

export interface ChartKeyboard {
  /** The series whose points the keys walk through. */
  readonly seriesIds: readonly string[];
  /** What a point is, in words ("Common toad at Hollow Pond, season 2019"). */
  describe?(point: ChartPoint): string | null;
  /** What Enter does, for the description ("shows its records"). */
  readonly action: string;
}
export type ChartBox = HTMLDivElement & { echartsInstance?: echarts.ECharts };

function pointCount(option: EChartsOption): number {
  return seriesList(option).reduce((n, s) => n + (Array.isArray(s.data) ? s.data.length : 0), 0);
}

function saveHref(href: string, fileName: string): void {
  const a = document.createElement('a');
  a.href = href;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
}

/** The chart drawn again with the SVG renderer, off screen, as SVG text. */
function svgOf(option: EChartsOption, width: number, height: number): string {
  const box = document.createElement('div');
  const chart = echarts.init(box, undefined, { renderer: 'svg', width, height });
  try {
    chart.setOption(option);
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}

/** An axis's title without its note in brackets ("Fitted count per record", not "... (log scale)"). */
function axisName(axis: unknown): string {
  const a = (Array.isArray(axis) ? axis[0] : axis) as { name?: unknown } | undefined;
  return String(a?.name ?? '').replace(/\s*\([^)]*\)$/, '');
}

function shortNumber(v: number): string {
  return String(Number(v.toPrecision(3)));
}

/**
 * The chosen point in words: what it is and where it sits on both axes
 * (shown), then its place along the x axis and what Enter does (read out
 * only: the prompt shown on reaching the chart says what Enter does).
 */
function pointText(option: EChartsOption, p: ChartPoint, rank: number, n: number, keyboard: ChartKeyboard): { shown: string; spoken: string } {
  const what = keyboard.describe?.(p);
  const x = p.category ?? shortNumber(p.x);
  const where = `${axisName(option.xAxis) || 'x'} ${x}, ${axisName(option.yAxis) || 'y'} ${shortNumber(p.y)}`;
  return { shown: `${what ? `${what}: ` : ''}${where}.`, spoken: ` Point ${rank + 1} of ${n} from the left; Enter ${keyboard.action}.` };
}

const KEYS_TEXT = 'Arrow keys move between points (left and right along the horizontal axis, up and down by value), Home and End go to the first and last, Page Up and Page Down to the highest and lowest';

export function EChart({ option, fileName, testId, height = 340, onPointClick, hint, keyboard }: { option: EChartsOption; fileName: string; testId?: string; height?: number; onPointClick?: PointClick; hint?: string; keyboard?: ChartKeyboard }) {
  const box = useRef<ChartBox>(null);
  const chart = useRef<echarts.ECharts | null>(null);
  const clicked = useRef<PointClick | undefined>(onPointClick);
  clicked.current = onPointClick;
  const summaryId = useId();
  // The series ids as one string, so a new array of the same ids does not count as a change.
  const walked = keyboard?.seriesIds.join('\u0000') ?? '';
  const points = useMemo(() => (walked ? chartPoints(option, walked.split('\u0000')) : []), [option, walked]);
  const order = useMemo(() => pointOrder(points), [points]);
  const [active, setActive] = useState<number | null>(null);
  const [focused, setFocused] = useState(false);
  const [width, setWidth] = useState(0);
  const summary = useMemo(() => chartSummary(option), [option]);
  const layout = useMemo(() => (width ? chartLayout(option, width, measureOnCanvas) : null), [option, width]);
  const laid = useMemo(() => (layout ? layoutChart(option, width, layout) : null), [option, width, layout]);
  const drawn = useRef<EChartsOption | null>(null);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const c = echarts.init(el, undefined, { renderer: 'canvas' });
    chart.current = c;
    el.echartsInstance = c;
    c.on('click', (p) => clicked.current?.(p.data, String(p.seriesId ?? '')));
    setWidth(el.clientWidth);
    const watcher = new ResizeObserver(() => {
      c.resize();
      setWidth(el.clientWidth);
    });
    watcher.observe(el);
    return () => {
      watcher.disconnect();
      c.dispose();
      chart.current = null;
      delete el.echartsInstance;
    };
  }, []);

  useEffect(() => setActive(null), [option]);

  useEffect(() => {
    const c = chart.current;
    if (!c || !laid) return;
    if (drawn.current !== option) {
      // A new chart is drawn on the next frame, so a stage with several charts shows at once.
      c.setOption(laid, { notMerge: true, lazyUpdate: true });
      drawn.current = option;
    } else {
      // The same chart at a new width: only the parts placed for the width change.
      c.setOption({ title: laid.title, legend: laid.legend, grid: laid.grid, xAxis: laid.xAxis, yAxis: laid.yAxis });
    }
  }, [option, laid]);

  // The chosen point is highlighted with its tooltip, and let go when another is chosen or the chart is left.
  useEffect(() => {
    const c = chart.current;
    const p = active !== null ? points[active] : undefined;
    if (!c || !p) return;
    const at = { seriesIndex: p.seriesIndex, dataIndex: p.dataIndex };
    c.dispatchAction({ type: 'highlight', ...at });
    c.dispatchAction({ type: 'showTip', ...at });
    return () => {
      if (c.isDisposed()) return;
      c.dispatchAction({ type: 'downplay', ...at });
      c.dispatchAction({ type: 'hideTip' });
    };
  }, [active, points, laid]);

  const letGo = () => {
    setActive(null);
    setFocused(false);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    if (!keyboard || !points.length) return;
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      const p = active !== null ? points[active] : undefined;
      if (p) clicked.current?.(p.data, p.seriesId);
      return;
    }
    if (e.key === 'Escape') {
      if (active !== null) e.preventDefault();
      setActive(null);
      return;
    }
    const next = nextPoint(e.key, active, order);
    if (next === undefined) return;
    e.preventDefault();
    setActive(next);
  };

  const savePng = () => {
    const url = chart.current?.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: '#ffffff' });
    if (url) saveHref(url, `${fileName}.png`);
  };
  const saveSvg = () => {
    const el = box.current;
    if (!el) return;
    const url = URL.createObjectURL(new Blob([svgOf(laid ?? option, el.clientWidth || 800, el.clientHeight || height)], { type: 'image/svg+xml' }));
    saveHref(url, `${fileName}.svg`);
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
  };

  const ids = seriesList(option).map((s) => String(s.id ?? ''));
  const title = String((option.title as { text?: string } | undefined)?.text ?? 'Chart');
  const chosen = active !== null ? points[active] : undefined;
  const walking = Boolean(keyboard && points.length);
  // Taller by what the title block and legend take beyond the usual, so the plot keeps its height.
  const boxHeight = height + Math.max(0, (layout?.gridTop ?? USUAL_GRID_TOP) - USUAL_GRID_TOP);
  const status = chosen && keyboard ? pointText(option, chosen, order.rankX[active!], points.length, keyboard) : { shown: focused && keyboard ? `Choose a point with the arrow keys; Enter ${keyboard.action}.` : (hint ?? ''), spoken: '' };
  return (
    <figure className="chart" data-testid={testId}>
      <div
        ref={box}
        className="chart-box"
        style={{ height: boxHeight }}
        data-series={ids.join(' ')}
        data-points={pointCount(option)}
        {...(chosen ? { 'data-active-point': `${chosen.seriesId}:${chosen.dataIndex}` } : {})}
        {...(walking ? { tabIndex: 0, role: 'application', 'aria-roledescription': 'chart', onKeyDown, onFocus: () => setFocused(true), onBlur: letGo } : { role: 'img' })}
        aria-label={title}
        aria-describedby={summaryId}
      />
      <p id={summaryId} className="visually-hidden">
        {summary}
        {walking && keyboard ? ` ${KEYS_TEXT}; Enter ${keyboard.action}.` : ''}
      </p>
      <figcaption className="chart-actions">
        {/* Room for two lines whatever it says; longer text is cut with an ellipsis on screen and read whole by assistive technology. */}
        <span className="chart-hint" {...(walking ? { role: 'status', 'data-testid': 'chart-point' } : {})}>
          <span className="chart-hint-text">{status.shown}</span>
          {status.spoken && <span className="visually-hidden">{status.spoken}</span>}
        </span>
        <button type="button" className="button is-small" onClick={savePng}>
          Save PNG
        </button>
        <button type="button" className="button is-small" onClick={saveSvg}>
          Save SVG
        </button>
      </figcaption>
    </figure>
  );
}

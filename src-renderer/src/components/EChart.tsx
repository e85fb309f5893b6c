import { useEffect, useRef } from 'react';
import * as echarts from 'echarts';
import type { EChartsOption } from 'echarts';

/**
 * One echarts chart in a div, redrawn when its option changes and resized
 * with its box, with "Save PNG" and "Save SVG" links. The container carries
 * data attributes (series ids, number of points) so tests and assistive
 * tools can read what is drawn without the canvas, and holds the echarts
 * instance as `echartsInstance` (the browser tests read its option).
 * `onPointClick` receives a clicked point's data and its series id.
 */
export type PointClick = (data: unknown, seriesId: string) => void;
export type ChartBox = HTMLDivElement & { echartsInstance?: echarts.ECharts };

function seriesOf(option: EChartsOption): { id?: unknown; data?: unknown }[] {
  const s = option.series;
  return Array.isArray(s) ? (s as { id?: unknown; data?: unknown }[]) : s ? [s as { id?: unknown; data?: unknown }] : [];
}

function pointCount(option: EChartsOption): number {
  return seriesOf(option).reduce((n, s) => n + (Array.isArray(s.data) ? s.data.length : 0), 0);
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

export function EChart({ option, fileName, testId, height = 340, onPointClick, hint }: { option: EChartsOption; fileName: string; testId?: string; height?: number; onPointClick?: PointClick; hint?: string }) {
  const box = useRef<ChartBox>(null);
  const chart = useRef<echarts.ECharts | null>(null);
  const clicked = useRef<PointClick | undefined>(onPointClick);
  clicked.current = onPointClick;

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const c = echarts.init(el, undefined, { renderer: 'canvas' });
    chart.current = c;
    el.echartsInstance = c;
    c.on('click', (p) => clicked.current?.(p.data, String(p.seriesId ?? '')));
    const watcher = new ResizeObserver(() => c.resize());
    watcher.observe(el);
    return () => {
      watcher.disconnect();
      c.dispose();
      chart.current = null;
      delete el.echartsInstance;
    };
  }, []);

  useEffect(() => {
    // Drawn on the next frame, so a stage with several charts shows at once.
    chart.current?.setOption(option, { notMerge: true, lazyUpdate: true });
  }, [option]);

  const savePng = () => {
    const url = chart.current?.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: '#ffffff' });
    if (url) saveHref(url, `${fileName}.png`);
  };
  const saveSvg = () => {
    const el = box.current;
    if (!el) return;
    const url = URL.createObjectURL(new Blob([svgOf(option, el.clientWidth || 800, el.clientHeight || height)], { type: 'image/svg+xml' }));
    saveHref(url, `${fileName}.svg`);
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
  };

  const ids = seriesOf(option).map((s) => String(s.id ?? ''));
  return (
    <figure className="chart" data-testid={testId}>
      <div ref={box} className="chart-box" style={{ height }} data-series={ids.join(' ')} data-points={pointCount(option)} role="img" aria-label={String((option.title as { text?: string } | undefined)?.text ?? 'Chart')} />
      <figcaption className="chart-actions">
        {hint && <span className="chart-hint">{hint}</span>}
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

/**
 * A chart in words, for those who cannot see it: the title, the sentence
 * under it, what each axis shows and what is drawn (each series with its
 * number of points or bars). Helper series that show no tooltip (a band's
 * lower edge, the rootogram's hanging base) are left out.
 */
import type { ChartOption } from './chart-style';

type Named = { name?: unknown; type?: unknown; data?: unknown; tooltip?: { show?: unknown } };

function one<T>(v: T | T[] | undefined): T | undefined {
  return Array.isArray(v) ? v[0] : v;
}

function sentence(s: string): string {
  const t = s.trim();
  return !t ? '' : /[.?!]$/.test(t) ? t : `${t}.`;
}

function drawn(s: Named): string {
  const n = Array.isArray(s.data) ? s.data.filter((d) => d !== null && d !== undefined).length : 0;
  const name = String(s.name ?? '');
  if (s.type === 'scatter') return `${name} (${n} point${n === 1 ? '' : 's'})`;
  if (s.type === 'bar') return `${name} (${n} bar${n === 1 ? '' : 's'})`;
  return `${name} (a line through ${n} value${n === 1 ? '' : 's'})`;
}

export function chartSummary(option: ChartOption): string {
  const title = one(option.title as { text?: unknown; subtext?: unknown } | { text?: unknown; subtext?: unknown }[] | undefined);
  const x = one(option.xAxis as { name?: unknown; type?: unknown; data?: unknown } | { name?: unknown }[] | undefined) as { name?: unknown; type?: unknown; data?: unknown } | undefined;
  const y = one(option.yAxis as { name?: unknown } | { name?: unknown }[] | undefined);
  const series = ((Array.isArray(option.series) ? option.series : option.series ? [option.series] : []) as Named[]).filter((s) => s.tooltip?.show !== false);
  const xText = x?.name ? String(x.name) : x?.type === 'category' ? 'categories' : '';
  const cats = x?.type === 'category' && Array.isArray(x.data) ? ` (${x.data.length} categor${x.data.length === 1 ? 'y' : 'ies'})` : '';
  return [
    sentence(String(title?.text ?? 'Chart')),
    sentence(String(title?.subtext ?? '')),
    xText ? `Horizontal axis: ${xText}${cats}.` : '',
    y?.name ? `Vertical axis: ${String(y.name)}.` : '',
    series.length ? `Drawn: ${series.map(drawn).join('; ')}.` : '',
  ]
    .filter(Boolean)
    .join(' ');
}

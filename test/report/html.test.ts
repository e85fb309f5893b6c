import { describe, expect, it } from 'vitest';
import { escapeHtml, unsafeSvgReason } from '@shared/report/escape';
import { renderHtml } from '@shared/report/html';
import { renderDocumentCharts } from '../../src-main/report/svg';
import { MARKUP, reference, shipsReport } from './ships-report';

describe('HTML report', () => {
  it('shows a species and a factor level named as markup as text, never as markup (charts included)', async () => {
    const { doc } = await shipsReport();
    const html = renderHtml(doc, renderDocumentCharts(doc));
    expect(html).not.toMatch(/<img/i);
    expect(html).not.toMatch(/onerror=alert\(1\)>/);
    expect(html).not.toMatch(/<script/i);
    // The heading, the summary, the coefficient term "type=<img ...>" and the input name: all escaped.
    const escaped = escapeHtml(MARKUP);
    expect(html.split(escaped).length - 1).toBeGreaterThanOrEqual(5);
    expect(html).toContain(`<td>type=${escaped}</td>`);
    expect(html).toContain(`<h2>${escaped}</h2>`);
    // The chart is inline SVG, drawn with the species in its title.
    expect(html).toMatch(/<figure role="img" aria-label="[^"<]*"><svg /);
  });

  it('is one self-contained file: no scripts, no outside links, print CSS', async () => {
    const { doc } = await shipsReport();
    const html = renderHtml(doc, renderDocumentCharts(doc));
    expect(html).not.toMatch(/(src|href)="(?!#|data:)/);
    expect(html).toContain('@media print');
    expect(html).toContain("default-src 'none'");
  });

  it('the index table holds the indices of stats::glm on MASS::ships (to the shown decimal)', async () => {
    const { doc } = await shipsReport();
    const html = renderHtml(doc, {});
    for (const r of reference.indices) {
      // One decimal as shown; a rounding edge would need the values 5e-5 apart, far beyond the 1e-4 relative tolerance.
      expect(html).toContain(`<td class="num">${r.time}</td><td class="num">${r.index.toFixed(1)}</td><td class="num">${r.lower.toFixed(1)}</td><td class="num">${r.upper.toFixed(1)}</td>`);
    }
    expect(html).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('refuses an SVG that could run code', () => {
    expect(unsafeSvgReason('<svg><script>alert(1)</script></svg>')).toMatch(/script/);
    expect(unsafeSvgReason('<svg><rect onload="x()"/></svg>')).toMatch(/event-handler/);
    expect(unsafeSvgReason('<svg><image href="http://x/y.png"/></svg>')).toMatch(/outside/);
    expect(unsafeSvgReason('<svg viewBox="0 0 1 1"><text>&lt;b&gt;</text></svg>')).toBeNull();
  });
});

/**
 * The report as one self-contained HTML file: inline CSS (with print rules),
 * charts as inline SVG rendered by the caller, no scripts and no links to
 * anything outside the file. Every string from the document is escaped.
 */
import { escapeHtml as e, unsafeSvgReason } from './escape';
import type { Block, ReportDocument, Section, TableBlock } from './model';
import { cellText } from './number-format';

/** SVG markup per chart id (`ChartBlock.id`). */
export type ChartSvgs = Readonly<Record<string, string>>;

const CSS = `
:root { color-scheme: light; }
body { font-family: "DejaVu Sans", "Segoe UI", Helvetica, Arial, sans-serif; color: #1f2933; max-width: 60rem; margin: 2rem auto; padding: 0 1rem; line-height: 1.45; }
h1 { font-size: 1.7rem; margin-bottom: 0.2rem; }
h2 { font-size: 1.3rem; border-bottom: 1px solid #c8ced6; padding-bottom: 0.2rem; margin-top: 2.2rem; }
.subtitle { color: #52606d; margin-top: 0; }
p.lead { font-weight: bold; }
table { border-collapse: collapse; margin: 0.8rem 0; font-size: 0.85rem; }
caption { text-align: left; font-weight: bold; padding-bottom: 0.3rem; }
th, td { border-bottom: 1px solid #e4e7eb; padding: 0.2rem 0.5rem; }
th { text-align: left; background: #f5f7fa; }
td.num { text-align: right; font-variant-numeric: tabular-nums; }
.notes { font-size: 0.8rem; color: #52606d; margin-top: 0; }
.caution { border-left: 4px solid #b7791f; background: #fffaf0; padding: 0.4rem 0.8rem; margin: 0.8rem 0; }
.caution h3 { font-size: 0.95rem; margin: 0.2rem 0; }
figure { margin: 1rem 0; }
figure svg { max-width: 100%; height: auto; }
figcaption { font-size: 0.8rem; color: #52606d; }
pre { background: #f5f7fa; padding: 0.6rem; overflow-x: auto; font-size: 0.8rem; }
nav ol { columns: 2; }
@media print {
  body { max-width: none; margin: 0; font-size: 10pt; }
  nav { display: none; }
  h2 { break-before: page; }
  h2:first-of-type { break-before: auto; }
  table, figure, .caution { break-inside: avoid; }
  thead { display: table-header-group; }
  a { color: inherit; text-decoration: none; }
}
`;

function table(t: TableBlock): string {
  const head = t.columns.map((c) => `<th scope="col">${e(c.header)}</th>`).join('');
  const body = t.rows
    .map((r) => `<tr>${r.map((cell, j) => `<td${typeof cell === 'number' ? ' class="num"' : ''}>${e(cellText(cell, t.columns[j]?.format))}</td>`).join('')}</tr>`)
    .join('\n');
  const notes = t.notes?.length ? `<p class="notes">${t.notes.map(e).join('<br>')}</p>` : '';
  return `<table id="${e(t.id)}"><caption>${e(t.caption)}</caption><thead><tr>${head}</tr></thead><tbody>\n${body}\n</tbody></table>${notes}`;
}

function block(b: Block, svgs: ChartSvgs, refNumber: (key: string) => number): string {
  switch (b.kind) {
    case 'paragraph': {
      const cites = b.cites?.length ? ` <span class="cites">[${[...new Set(b.cites)].map((k) => `<a href="#ref-${e(k)}">${refNumber(k)}</a>`).join(', ')}]</span>` : '';
      return `<p${b.emphasis ? ' class="lead"' : ''}>${e(b.text)}${cites}</p>`;
    }
    case 'table':
      return table(b);
    case 'chart': {
      const svg = svgs[b.id];
      if (svg === undefined) return `<p class="notes">Chart not drawn. ${e(b.alt)}</p>`;
      const bad = unsafeSvgReason(svg);
      if (bad) throw new Error(`The chart "${b.id}" cannot go into the report: ${bad}.`);
      return `<figure role="img" aria-label="${e(b.alt)}">${svg}<figcaption>${e(b.alt)}</figcaption></figure>`;
    }
    case 'caution':
      return `<div class="caution"><h3>${e(b.title)}</h3><ul>${b.items.map((i) => `<li>${e(i)}</li>`).join('')}</ul></div>`;
    case 'list':
      return `${b.title ? `<h3>${e(b.title)}</h3>` : ''}<ul>${b.items.map((i) => `<li>${e(i)}</li>`).join('')}</ul>`;
    case 'code':
      return `<h3>${e(b.title)}</h3><pre>${e(b.text)}</pre>`;
  }
}

function section(s: Section, svgs: ChartSvgs, refNumber: (key: string) => number): string {
  return `<section id="${e(s.id)}">\n<h2>${e(s.heading)}</h2>\n${s.blocks.map((b) => block(b, svgs, refNumber)).join('\n')}\n</section>`;
}

export function renderHtml(doc: ReportDocument, svgs: ChartSvgs = {}): string {
  const refNumber = (key: string) => doc.references.findIndex((r) => r.key === key) + 1;
  const listed = [...doc.sections, ...(doc.references.length ? [{ id: 'references', heading: 'References' }] : []), doc.appendix];
  const nav = `<nav><ol>${listed.map((s) => `<li><a href="#${e(s.id)}">${e(s.heading)}</a></li>`).join('')}</ol></nav>`;
  const refs = doc.references.length
    ? `<section id="references"><h2>References</h2><ol>${doc.references.map((r) => `<li id="ref-${e(r.key)}">${e(r.text)}</li>`).join('')}</ol></section>`
    : '';
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${e(doc.title)}</title>`,
    `<style>${CSS}</style>`,
    '</head>',
    '<body>',
    `<header><h1>${e(doc.title)}</h1>${doc.subtitle ? `<p class="subtitle">${e(doc.subtitle)}</p>` : ''}<p class="subtitle">Made ${e(doc.createdAt)}</p></header>`,
    nav,
    ...doc.sections.map((s) => section(s, svgs, refNumber)),
    refs,
    section(doc.appendix, svgs, refNumber),
    '</body>',
    '</html>',
    '',
  ].join('\n');
}

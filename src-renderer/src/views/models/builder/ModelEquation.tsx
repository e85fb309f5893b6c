import { useMemo } from 'react';
import katex from 'katex';
import 'katex/dist/katex.min.css';
import type { ModelEquationTex } from '@shared/model/equation-tex';
import { texSegments } from '@shared/model/tex-text';

/**
 * The model typeset by KaTeX from the TeX that src-shared builds. Names from
 * the data are escaped there and KaTeX trusts no commands (no links, no
 * HTML), so the markup it returns is safe to insert. Equations are set
 * inline so a long predictor wraps after a + or = instead of running off
 * the panel; in the list of symbols only the math is typeset and the words
 * are ordinary text, so they wrap too.
 */
const typesetCache = new Map<string, { __html: string }>();

/** KaTeX's markup for a line, kept so that coming back to the stage does not typeset it again. */
function typeset(tex: string): { __html: string } {
  let html = typesetCache.get(tex);
  if (!html) {
    html = { __html: katex.renderToString(tex, { throwOnError: false, trust: false, strict: 'ignore', output: 'htmlAndMathml' }) };
    if (typesetCache.size >= 400) typesetCache.clear();
    typesetCache.set(tex, html);
  }
  return html;
}

export function ModelEquation({ equation }: { equation: ModelEquationTex | null }) {
  const shown = useMemo(() => equation && { lines: equation.lines.map(typeset), where: equation.where.map((w) => texSegments(w).map((s) => ('text' in s ? s : typeset(s.tex)))) }, [equation]);
  if (!shown) return null;
  return (
    <figure className="equation" data-testid="model-equation" aria-label="The model">
      {shown.lines.map((h, i) => (
        <div key={i} className="equation-line" dangerouslySetInnerHTML={h} />
      ))}
      <details className="equation-where">
        <summary>What the symbols mean</summary>
        <ul>
          {shown.where.map((parts, i) => (
            <li key={i}>{parts.map((p, j) => ('text' in p ? <span key={j}>{p.text}</span> : <span key={j} dangerouslySetInnerHTML={p} />))}</li>
          ))}
        </ul>
      </details>
    </figure>
  );
}

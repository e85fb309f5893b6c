/**
 * One term of a linear predictor in TeX, with the sentence that says what its
 * coefficients mean. Terms are coded as the engine codes them
 * (src-shared/engine/design/build.ts): factors in treatment coding against a
 * reference level, interactions as products of their parts, splines as
 * natural cubic splines with `df` basis columns.
 */
import type { Term } from './spec';
import { escapeTexText, texName } from './tex-text';

export interface EquationNames {
  /** How an offset column reads: effort_h -> { name: 'effort', unit: 'hours' }. */
  readonly offsets?: Readonly<Record<string, { readonly name: string; readonly unit: string }>>;
  /** Levels of a column in sorted order, to name a factor's default reference level (the first). */
  readonly levels?: Readonly<Record<string, readonly string[]>>;
  /** Columns holding numbers: how an interaction part that is not a main effect is coded. */
  readonly numericColumns?: readonly string[];
}

export interface TermTex {
  readonly tex: string;
  /** What the term's symbols mean (TeX mixing \text and math); empty when plain. */
  readonly where: readonly string[];
}

/** Words set as text inside math. */
export function words(s: string): string {
  return `\\text{${escapeTexText(s)}}`;
}

/** The value of a column in row i: \text{habitat}_i. */
export function valueOf(column: string): string {
  return `${texName(column)}_i`;
}

interface Part {
  readonly column: string;
  readonly kind: 'numeric' | 'factor';
  readonly reference: string | undefined;
}

/** The reference level of a factor: the one named, else the first in sorted order when known. */
export function referenceOf(column: string, reference: string | undefined, names: EquationNames): string | undefined {
  return reference ?? names.levels?.[column]?.[0];
}

function partOf(column: string, terms: readonly Term[], names: EquationNames): Part {
  const main = terms.find((t) => t.type !== 'interaction' && t.column === column);
  if (main?.type === 'factor') return { column, kind: 'factor', reference: referenceOf(column, main.reference, names) };
  if (main || names.numericColumns?.includes(column)) return { column, kind: 'numeric', reference: undefined };
  return { column, kind: 'factor', reference: referenceOf(column, undefined, names) };
}

function against(coef: string, reference: string | undefined): string {
  return reference === undefined ? `${words(' against the first level (where it is 0)')}` : `${words(` against ${reference} (`)}${coef.replace('\\ell', () => texName(reference))} = 0${words(')')}`;
}

function interaction(letter: string, k: number, a: Part, b: Part): TermTex {
  const both = `${words(`${a.column} and ${b.column}`)}`;
  if (a.kind === 'numeric' && b.kind === 'numeric') {
    return { tex: `${letter}_{${k}}\\,${valueOf(a.column)}\\,${valueOf(b.column)}`, where: [`${letter}_{${k}}${words(': the interaction of ')}${both}${words(' (the effect of their product)')}`] };
  }
  if (a.kind === 'factor' && b.kind === 'factor') {
    const refs = [a.reference, b.reference].every((r) => r !== undefined) ? `${words(' (')}${texName(a.reference!)}${words(', ')}${texName(b.reference!)}${words(')')}` : '';
    return {
      tex: `${letter}_{${k},\\,${valueOf(a.column)},\\,${valueOf(b.column)}}`,
      where: [`${letter}_{${k},\\ell,m}${words(`: the extra effect of level `)}\\ell${words(` of ${a.column} together with level `)}m${words(` of ${b.column}; 0 when either is its reference level`)}${refs}`],
    };
  }
  const [f, x] = a.kind === 'factor' ? [a, b] : [b, a];
  const coef = `${letter}_{${k},\\ell}`;
  return {
    tex: `${letter}_{${k},\\,${valueOf(f.column)}}\\,${valueOf(x.column)}`,
    where: [`${coef}${words(`: how the slope of ${x.column} differs at level `)}\\ell${words(` of ${f.column}`)}${against(coef, f.reference)}`],
  };
}

/** Term k of a linear predictor with coefficient letter `letter` (\beta, \gamma); `terms` are its siblings. */
export function termTex(term: Term, k: number, letter: string, terms: readonly Term[], names: EquationNames): TermTex {
  switch (term.type) {
    case 'numeric':
      return { tex: `${letter}_{${k}}\\,${valueOf(term.column)}`, where: [] };
    case 'factor': {
      const coef = `${letter}_{${k},\\ell}`;
      return {
        tex: `${letter}_{${k},\\,${valueOf(term.column)}}`,
        where: [`${coef}${words(': the effect of level ')}\\ell${words(` of ${term.column}`)}${against(coef, referenceOf(term.column, term.reference, names))}`],
      };
    }
    case 'interaction':
      return interaction(letter, k, partOf(term.columns[0], terms, names), partOf(term.columns[1], terms, names));
    case 'spline': {
      const f = `${letter === '\\beta' ? 'f' : 'g'}_{${k}}`;
      return {
        tex: `${f}(${valueOf(term.column)})`,
        where: [
          `${f}(x) = \\sum_{j=1}^{${term.df}} ${letter}_{${k},j}\\,N_j(x)${words(`: a smooth curve in ${term.column}, a natural cubic spline with ${term.df} degree${term.df === 1 ? '' : 's'} of freedom (`)}N_j${words(' its basis, knots at quantiles of the values)')}`,
        ],
      };
    }
  }
}

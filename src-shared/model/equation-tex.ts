/**
 * The model in ordinary mathematical notation, as TeX for a typesetting
 * library (the renderer only typesets it; the report can use the same
 * strings). For every row i of the analysis table:
 *
 *   the distribution of the count (Poisson, quasi-Poisson, NB2 with
 *   Var = mu + mu^2/theta, the zero-inflated mixture, the hurdle with a
 *   zero-truncated count part),
 *   log of the expected count = intercept or site terms + predictor terms
 *                               + season term + offsets,
 *   the zero part on the logit scale, the random site effect's normal law,
 *
 * and one line per symbol saying what it means. Names from the data are
 * escaped (./tex-text.ts).
 */
import { hasZeroPart, type Distribution, type ModelSpec } from './spec';
import { termTex, valueOf, words, type EquationNames, type TermTex } from './equation-terms';
import { texName } from './tex-text';
import { timeIsPredictor } from './season-term';

export type { EquationNames } from './equation-terms';

export interface ModelEquationTex {
  /** The model, one equation per line. */
  readonly lines: readonly string[];
  /** What the symbols mean, one per line (TeX mixing \text and math). */
  readonly where: readonly string[];
}

const poissonPmf = 'f(k;\\mu) = \\frac{\\mu^k e^{-\\mu}}{k!}';
const negbinPmf = 'f(k;\\mu,\\theta) = \\frac{\\Gamma(k+\\theta)}{\\Gamma(\\theta)\\,k!}\\left(\\frac{\\theta}{\\theta+\\mu}\\right)^{\\theta}\\left(\\frac{\\mu}{\\theta+\\mu}\\right)^{k}';
const thetaWhere = `\\theta${words(': the size (dispersion) parameter; the larger, the closer to Poisson')}`;

function countPmf(d: Distribution): { f: string; where: string[] } {
  return d === 'zinb' || d === 'hurdle-negbin'
    ? { f: 'f(k;\\mu_i,\\theta)', where: [`${negbinPmf}${words(': the negative binomial, variance ')}\\mu + \\mu^2/\\theta`, thetaWhere] }
    : { f: 'f(k;\\mu_i)', where: [`${poissonPmf}${words(': the Poisson')}`] };
}

function distributionTex(d: Distribution, y: string): { line: string; where: string[] } {
  switch (d) {
    case 'poisson':
      return { line: `${y} \\sim \\operatorname{Poisson}(\\mu_i), \\quad \\operatorname{Var}(${y}) = \\mu_i`, where: [] };
    case 'quasipoisson':
      return {
        line: `\\operatorname{E}(${y}) = \\mu_i, \\quad \\operatorname{Var}(${y}) = \\phi\\,\\mu_i`,
        where: [`\\phi${words(': the dispersion, estimated as the Pearson ')}\\chi^2${words(' over the residual degrees of freedom')}`],
      };
    case 'negbin':
      return { line: `${y} \\sim \\operatorname{NB}(\\mu_i, \\theta), \\quad \\operatorname{Var}(${y}) = \\mu_i + \\mu_i^2/\\theta`, where: [thetaWhere] };
    case 'zip':
    case 'zinb': {
      const { f, where } = countPmf(d);
      return {
        line: `\\Pr(${y} = k) = \\begin{cases} \\pi_i + (1-\\pi_i)\\,${f.replace('k;', '0;')} & k = 0 \\\\ (1-\\pi_i)\\,${f} & k \\ge 1 \\end{cases}`,
        where: [`\\pi_i${words(': the chance of an extra zero; ')}\\mu_i${words(': the mean of the count part, so the expected count is ')}(1-\\pi_i)\\,\\mu_i`, ...where],
      };
    }
    case 'hurdle-poisson':
    case 'hurdle-negbin': {
      const { f, where } = countPmf(d);
      return {
        line: `\\Pr(${y} = k) = \\begin{cases} 1 - p_i & k = 0 \\\\ p_i\\,\\dfrac{${f}}{1 - ${f.replace('k;', '0;')}} & k \\ge 1 \\end{cases}`,
        where: [`p_i${words(': the chance of a non-zero count; the non-zero counts follow the count distribution truncated at zero, with ')}\\mu_i${words(' the mean before truncation')}`, ...where],
      };
    }
  }
}

function siteTerms(spec: ModelSpec): { lead: string; lines: string[]; where: string[] } {
  const site = spec.site;
  if (!site) return { lead: '\\beta_0', lines: [], where: [] };
  const s = valueOf(site.column);
  if (site.effect === 'fixed') return { lead: `\\alpha_{${s}}`, lines: [], where: [`\\alpha_s${words(`: one term per ${site.column} `)}s${words(', in place of an intercept')}`] };
  const how = site.quadraturePoints === 1 ? 'the Laplace approximation' : `${site.quadraturePoints}-point adaptive Gauss–Hermite quadrature`;
  return {
    lead: `\\beta_0 + u_{${s}}`,
    lines: [`u_s \\sim \\operatorname{Normal}(0, \\sigma^2)${words(` independently for each ${site.column} `)}s`],
    where: [`\\sigma${words(`: the spread of the ${site.column} effects on the log scale; `)}u_s${words(` is integrated out with ${how}`)}`],
  };
}

function timeTerm(spec: ModelSpec, names: EquationNames): TermTex | null {
  const time = spec.time;
  if (!time || timeIsPredictor(spec)) return null;
  const t = valueOf(time.column);
  if (time.trend === 'linear') return { tex: `\\delta\\,${t}`, where: [`\\delta${words(`: the log-linear trend per ${time.column}; `)}e^{\\delta} - 1${words(` is the change per ${time.column}`)}`] };
  const base = time.base !== undefined ? String(time.base) : names.levels?.[time.column]?.[0];
  const zero = base === undefined ? words(`, the first ${time.column}'s is 0`) : `${words(', ')}\\tau_{${texName(base)}} = 0`;
  return { tex: `\\tau_{${t}}`, where: [`\\tau_t${words(`: one effect per ${time.column} t`)}${zero}`] };
}

function offsetTerms(spec: ModelSpec, names: EquationNames): TermTex[] {
  return spec.offsets.map((o) => {
    const known = names.offsets?.[o.column];
    const name = known?.name ?? o.column;
    const where = `${texName(name)}${words(`${known ? ` in ${known.unit} (column ${o.column})` : ''}: an offset, its coefficient fixed at 1`)}`;
    return { tex: o.log ? `\\log(${valueOf(name)})` : valueOf(name), where: [where] };
  });
}

function sum(lead: string, parts: readonly TermTex[]): string {
  return [lead, ...parts.map((p) => p.tex)].join(' + ');
}

export function modelEquationTex(spec: ModelSpec, names: EquationNames = {}): ModelEquationTex {
  const y = valueOf(spec.response);
  const dist = distributionTex(spec.distribution, y);
  const site = siteTerms(spec);
  const count = spec.predictors.map((t, k) => termTex(t, k + 1, '\\beta', spec.predictors, names));
  const time = timeTerm(spec, names);
  const offsets = offsetTerms(spec, names);
  const zeroPart = hasZeroPart(spec.distribution);
  const left = zeroPart ? '\\log \\mu_i' : `\\log \\operatorname{E}(${y}) = \\log \\mu_i`;
  const lines = [dist.line, `${left} = ${sum(site.lead, [...count, ...(time ? [time] : []), ...offsets])}`];
  let zeroWhere: TermTex[] = [];
  if (zeroPart) {
    zeroWhere = spec.zeroPredictors.map((t, k) => termTex(t, k + 1, '\\gamma', spec.zeroPredictors, names));
    const prob = spec.distribution.startsWith('hurdle') ? 'p_i' : '\\pi_i';
    lines.push(`\\operatorname{logit} ${prob} = \\log\\dfrac{${prob}}{1-${prob}} = ${sum('\\gamma_0', zeroWhere)}`);
  }
  lines.push(...site.lines);
  const where = [
    `i${words(': one row of the analysis table (a site in a season)')}`,
    ...dist.where,
    ...site.where,
    ...[...count, ...(time ? [time] : []), ...zeroWhere, ...offsets].flatMap((p) => p.where),
  ];
  return { lines, where: [...new Set(where)] };
}

/**
 * The model written in ordinary notation (src-shared/model/equation-tex.ts).
 * The forms checked are the textbook ones (common practice): Poisson with
 * Var = mu; quasi-Poisson Var = phi mu; NB2 Var = mu + mu^2/theta; the
 * zero-inflated mixture Pr(0) = pi + (1 - pi) f(0), Pr(k) = (1 - pi) f(k),
 * logit pi linear; the hurdle Pr(0) = 1 - p, Pr(k) = p f(k) / (1 - f(0));
 * offsets as log terms with coefficient 1; a random intercept
 * u ~ Normal(0, sigma^2). Every line must also be accepted by KaTeX in
 * strict mode, so the screen never shows a typesetting error.
 */
import katex from 'katex';
import { describe, expect, it } from 'vitest';
import { modelEquationTex } from '@shared/model/equation-tex';
import { distributions, parseModelSpec, type ModelSpecInput } from '@shared/model/spec';
import { escapeTexText, texName, texSegments } from '@shared/model/tex-text';

const names = { offsets: { effort_h: { name: 'effort', unit: 'hours' }, area_ha: { name: 'area', unit: 'ha' } }, levels: { habitat: ['reed', 'sedge', 'open'] } };

function eq(input: Partial<ModelSpecInput>) {
  return modelEquationTex(parseModelSpec({ response: 'count', distribution: 'poisson', ...input }), names);
}

function typesets(tex: string): boolean {
  katex.renderToString(tex, { throwOnError: true, strict: 'error' });
  return true;
}

/** The text KaTeX sets in \text{...} (MathML <mtext>), unescaped. */
function mtext(tex: string): string {
  const ml = katex.renderToString(tex, { output: 'mathml', throwOnError: true });
  const decode = (s: string) => s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#x27;/g, "'").replace(/&amp;/g, '&');
  return [...ml.matchAll(/<mtext>([^<]*)<\/mtext>/g)].map((m) => decode(m[1]).replace(/\u00a0/g, ' ')).join('');
}

describe('the distribution line', () => {
  it('writes each distribution in its usual form', () => {
    expect(eq({}).lines[0]).toBe('\\text{count}_i \\sim \\operatorname{Poisson}(\\mu_i), \\quad \\operatorname{Var}(\\text{count}_i) = \\mu_i');
    expect(eq({ distribution: 'quasipoisson' }).lines[0]).toContain('\\operatorname{Var}(\\text{count}_i) = \\phi\\,\\mu_i');
    expect(eq({ distribution: 'negbin' }).lines[0]).toContain('\\operatorname{NB}(\\mu_i, \\theta), \\quad \\operatorname{Var}(\\text{count}_i) = \\mu_i + \\mu_i^2/\\theta');
    const zip = eq({ distribution: 'zip' });
    expect(zip.lines[0]).toContain('\\pi_i + (1-\\pi_i)\\,f(0;\\mu_i) & k = 0');
    expect(zip.lines[0]).toContain('(1-\\pi_i)\\,f(k;\\mu_i) & k \\ge 1');
    expect(zip.where.join(' ')).toContain('f(k;\\mu) = \\frac{\\mu^k e^{-\\mu}}{k!}');
    const zinb = eq({ distribution: 'zinb' });
    expect(zinb.lines[0]).toContain('f(0;\\mu_i,\\theta)');
    expect(zinb.where.join(' ')).toContain('\\mu + \\mu^2/\\theta');
    const hurdle = eq({ distribution: 'hurdle-negbin' });
    expect(hurdle.lines[0]).toContain('1 - p_i & k = 0');
    expect(hurdle.lines[0]).toContain('p_i\\,\\dfrac{f(k;\\mu_i,\\theta)}{1 - f(0;\\mu_i,\\theta)} & k \\ge 1');
  });

  it('puts the log of the expected count on the left, or the count part mean where there is a zero part', () => {
    expect(eq({}).lines[1].startsWith('\\log \\operatorname{E}(\\text{count}_i) = \\log \\mu_i = \\beta_0')).toBe(true);
    expect(eq({ distribution: 'zip' }).lines[1].startsWith('\\log \\mu_i = \\beta_0')).toBe(true);
    expect(eq({ distribution: 'zip' }).where.join(' ')).toContain('the expected count is }(1-\\pi_i)\\,\\mu_i');
  });

  it('has a logit zero part for zero-inflated (extra zero) and hurdle (non-zero) models, none otherwise', () => {
    const zeroPredictors = [{ column: 'visits', type: 'numeric' as const }];
    expect(eq({ distribution: 'zinb', zeroPredictors }).lines[2]).toBe('\\operatorname{logit} \\pi_i = \\log\\dfrac{\\pi_i}{1-\\pi_i} = \\gamma_0 + \\gamma_{1}\\,\\text{visits}_i');
    expect(eq({ distribution: 'hurdle-poisson', zeroPredictors }).lines[2]).toContain('\\operatorname{logit} p_i');
    expect(eq({ distribution: 'hurdle-poisson' }).where.join(' ')).toContain('the chance of a non-zero count');
    for (const d of ['poisson', 'quasipoisson', 'negbin'] as const) expect(eq({ distribution: d, zeroPredictors }).lines.some((l) => l.includes('logit'))).toBe(false);
  });
});

describe('the terms of the log mean', () => {
  it('adds offsets as logs with their units, coefficient 1', () => {
    const e = eq({ offsets: [{ column: 'effort_h' }, { column: 'area_ha' }] });
    expect(e.lines[1].endsWith('+ \\log(\\text{effort}_i) + \\log(\\text{area}_i)')).toBe(true);
    expect(mtext(e.where.find((w) => w.includes('effort'))!)).toBe('effort in hours (column effort_h): an offset, its coefficient fixed at 1');
    expect(mtext(e.where.find((w) => w.includes('area'))!)).toContain('area in ha (column area_ha)');
  });

  it('writes a fixed site effect as one term per site in place of the intercept, a random one as a normal intercept', () => {
    const fixed = eq({ site: { column: 'site', effect: 'fixed' } });
    expect(fixed.lines[1]).toContain('= \\alpha_{\\text{site}_i}');
    expect(fixed.lines[1]).not.toContain('\\beta_0');
    const random = eq({ site: { column: 'site', effect: 'random', quadraturePoints: 12 } });
    expect(random.lines[1]).toContain('\\beta_0 + u_{\\text{site}_i}');
    expect(random.lines).toContain('u_s \\sim \\operatorname{Normal}(0, \\sigma^2)\\text{ independently for each site }s');
    expect(mtext(random.where.find((w) => w.startsWith('\\sigma'))!)).toContain('12-point adaptive Gauss–Hermite quadrature');
    const laplace = eq({ site: { column: 'site', effect: 'random', quadraturePoints: 1 } });
    expect(mtext(laplace.where.find((w) => w.startsWith('\\sigma'))!)).toContain('the Laplace approximation');
  });

  it('writes the season term as one effect per season, a log-linear trend, or a smooth curve with its df', () => {
    const annual = eq({ time: { column: 'season', trend: 'annual', base: 2015 } });
    expect(annual.lines[1]).toContain('\\tau_{\\text{season}_i}');
    expect(annual.where.join(' ')).toContain('\\tau_{\\text{2015}} = 0');
    expect(eq({ time: { column: 'season', trend: 'linear' } }).lines[1]).toContain('\\delta\\,\\text{season}_i');
    // A smooth curve is a spline predictor on the season column; the engine then adds no other season term.
    const smooth = eq({ predictors: [{ column: 'season', type: 'spline', df: 5 }], time: { column: 'season', trend: 'linear' } });
    expect(smooth.lines[1]).toBe('\\log \\operatorname{E}(\\text{count}_i) = \\log \\mu_i = \\beta_0 + f_{1}(\\text{season}_i)');
    expect(smooth.where.join(' ')).toContain('f_{1}(x) = \\sum_{j=1}^{5} \\beta_{1,j}\\,N_j(x)');
    expect(mtext(smooth.where.find((w) => w.startsWith('f_'))!)).toContain('natural cubic spline with 5 degrees of freedom');
  });

  it('codes factors against their reference level (the one named, else the first) and interactions by their parts', () => {
    const e = eq({
      predictors: [
        { column: 'habitat', type: 'factor', reference: 'sedge' },
        { column: 'visits', type: 'numeric' },
        { column: 'depth', type: 'numeric' },
        { type: 'interaction', columns: ['habitat', 'visits'] },
        { type: 'interaction', columns: ['visits', 'depth'] },
        { type: 'interaction', columns: ['habitat', 'shade'] },
      ],
    });
    expect(e.lines[1]).toBe(
      '\\log \\operatorname{E}(\\text{count}_i) = \\log \\mu_i = \\beta_0 + \\beta_{1,\\,\\text{habitat}_i} + \\beta_{2}\\,\\text{visits}_i + \\beta_{3}\\,\\text{depth}_i + \\beta_{4,\\,\\text{habitat}_i}\\,\\text{visits}_i + \\beta_{5}\\,\\text{visits}_i\\,\\text{depth}_i + \\beta_{6,\\,\\text{habitat}_i,\\,\\text{shade}_i}',
    );
    const where = e.where.join('\n');
    expect(where).toContain('\\beta_{1,\\text{sedge}} = 0');
    expect(where).toContain('\\beta_{4,\\text{sedge}} = 0');
    expect(mtext(e.where.find((w) => w.startsWith('\\beta_{4'))!)).toContain('how the slope of visits differs at level');
    expect(mtext(e.where.find((w) => w.startsWith('\\beta_{6'))!)).toContain('0 when either is its reference level');
    // Without a named reference the first level in sorted order is the reference.
    expect(eq({ predictors: [{ column: 'habitat', type: 'factor' }] }).where.join(' ')).toContain('\\beta_{1,\\text{reed}} = 0');
  });
});

describe('every line typesets', () => {
  it.each(distributions)('%s with every kind of term', (distribution) => {
    const e = eq({
      distribution,
      predictors: [
        { column: 'habitat', type: 'factor' },
        { column: 'visits', type: 'numeric' },
        { column: 'season', type: 'spline', df: 3 },
        { type: 'interaction', columns: ['habitat', 'visits'] },
      ],
      zeroPredictors: [{ column: 'habitat', type: 'factor' }],
      offsets: [{ column: 'effort_h' }, { column: 'area_ha' }, { column: 'raw_scale', log: false }],
      site: { column: 'site', effect: distribution === 'poisson' || distribution === 'negbin' ? 'random' : 'fixed' },
      time: { column: 'season', trend: 'linear' },
    });
    for (const line of [...e.lines, ...e.where]) expect(typesets(line), line).toBe(true);
  });

  it('keeps names from the data as text, whatever characters they hold', () => {
    const odd = 'pond_{a}$ 50% & #1 ~^\\';
    const e = modelEquationTex(parseModelSpec({ response: 'count', distribution: 'negbin', predictors: [{ column: odd, type: 'numeric' }] }));
    expect(typesets(e.lines[1])).toBe(true);
    expect(mtext(e.lines[1])).toContain(odd);
    expect(escapeTexText('a_b')).toBe('a\\_b');
  });

  it('splits a line into words and math at its top-level text groups, giving back the names as written', () => {
    const odd = 'a_b {c} 50% ~';
    expect(texSegments(`\\beta_{1,\\ell}\\text{: level of }${texName(odd)}\\text{ against }\\beta_{1,\\text{x}} = 0`)).toEqual([
      { tex: '\\beta_{1,\\ell}' },
      { text: `: level of ${odd} against ` },
      { tex: '\\beta_{1,\\text{x}} = 0' },
    ]);
    for (const w of eq({ predictors: [{ column: 'habitat', type: 'factor' }], site: { column: 'site', effect: 'random' } }).where) {
      for (const s of texSegments(w)) if ('tex' in s) expect(typesets(s.tex), s.tex).toBe(true);
    }
  });
});


/** The published methods a report may cite, by key. */
import type { Reference } from './model';

export const REFERENCES = {
  glm: 'McCullagh, P. & Nelder, J.A. (1989) Generalized Linear Models, 2nd edn. Chapman & Hall, London.',
  negbin: 'Venables, W.N. & Ripley, B.D. (2002) Modern Applied Statistics with S, 4th edn. Springer, New York (negative binomial GLM, section 7.4).',
  zeroInflated: 'Lambert, D. (1992) Zero-inflated Poisson regression, with an application to defects in manufacturing. Technometrics 34:1-14.',
  hurdle: 'Mullahy, J. (1986) Specification and testing of some modified count data models. Journal of Econometrics 33:341-365.',
  zeroModels: 'Zeileis, A., Kleiber, C. & Jackman, S. (2008) Regression models for count data in R. Journal of Statistical Software 27(8).',
  quadrature: 'Pinheiro, J.C. & Bates, D.M. (1995) Approximations to the log-likelihood function in the nonlinear mixed-effects model. Journal of Computational and Graphical Statistics 4:12-35.',
  sandwich: 'Liang, K.-Y. & Zeger, S.L. (1986) Longitudinal data analysis using generalized linear models. Biometrika 73:13-22.',
  bootstrap: 'Davison, A.C. & Hinkley, D.V. (1997) Bootstrap Methods and their Application. Cambridge University Press (resampling clusters, section 3.8).',
  delta: 'Casella, G. & Berger, R.L. (2002) Statistical Inference, 2nd edn. Duxbury (the delta method, section 5.5.4).',
  composite: 'Buckland, S.T., Magurran, A.E., Green, R.E. & Fewster, R.M. (2005) Monitoring change in biodiversity through composite indices. Phil. Trans. R. Soc. B 360:243-254.',
  indicators: 'Gregory, R.D. et al. (2005) Developing indicators for European birds. Phil. Trans. R. Soc. B 360:269-288.',
  aic: 'Akaike, H. (1974) A new look at the statistical model identification. IEEE Transactions on Automatic Control 19:716-723.',
  boundaryLr: 'Self, S.G. & Liang, K.-Y. (1987) Asymptotic properties of maximum likelihood estimators and likelihood ratio tests under nonstandard conditions. Journal of the American Statistical Association 82:605-610.',
  vuong: 'Vuong, Q.H. (1989) Likelihood ratio tests for model selection and non-nested hypotheses. Econometrica 57:307-333.',
  vuongZeros: 'Wilson, P. (2015) The misuse of the Vuong test for non-nested models to test for zero-inflation. Economics Letters 127:51-53.',
  rootogram: 'Kleiber, C. & Zeileis, A. (2016) Visualizing count data regressions using rootograms. The American Statistician 70:296-303.',
  quantileResiduals: 'Dunn, P.K. & Smyth, G.K. (1996) Randomized quantile residuals. Journal of Computational and Graphical Statistics 5:236-244.',
  redList: 'IUCN (2012) IUCN Red List Categories and Criteria, version 3.1, 2nd edn. Gland and Cambridge (the 30%, 50% and 80% reductions of criterion A).',
} as const;

export type ReferenceKey = keyof typeof REFERENCES;

/** The references cited anywhere in the given keys, in the catalogue's order, each once. */
export function referenceList(cited: Iterable<string>): Reference[] {
  const used = new Set(cited);
  return (Object.keys(REFERENCES) as ReferenceKey[]).filter((k) => used.has(k)).map((k) => ({ key: k, text: REFERENCES[k] }));
}

/** A link function g with mu = g^{-1}(eta). */
export interface Link {
  readonly name: string;
  /** eta = g(mu). */
  linkfun(mu: number): number;
  /** mu = g^{-1}(eta). */
  linkinv(eta: number): number;
  /** d mu / d eta at eta. */
  muEta(eta: number): number;
  /** out_i = g^{-1}(eta_i) for every i, in one loop (no call per element). */
  linkinvAll(eta: Float64Array, out: Float64Array): void;
}

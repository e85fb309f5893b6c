/** A link function g with mu = g^{-1}(eta). */
export interface Link {
  readonly name: string;
  /** eta = g(mu). */
  linkfun(mu: number): number;
  /** mu = g^{-1}(eta). */
  linkinv(eta: number): number;
  /** d mu / d eta at eta. */
  muEta(eta: number): number;
}

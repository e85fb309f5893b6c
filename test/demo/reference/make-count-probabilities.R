# Reference probabilities for the demo's random-variate samplers
# (src-shared/demo/samplers.ts), from base R's stats package:
#   stats::dpois(k, lambda), stats::dnbinom(k, size = theta, mu = mu),
#   stats::qgamma(p, shape, scale), stats::qnorm(p, mean, sd).
# Run: Rscript test/demo/reference/make-count-probabilities.R
# Writes count-probabilities.json beside this script.

num <- function(x) paste0("[", paste(format(x, digits = 17, scientific = FALSE, trim = TRUE), collapse = ", "), "]")
kmax <- function(q) max(q, 1)

cases <- list()
for (lambda in c(0.3, 3.2, 9.9, 10, 45, 400)) {
  k <- 0:kmax(qpois(0.999, lambda))
  cases[[length(cases) + 1]] <- sprintf('    { "distribution": "poisson", "mean": %s, "firstK": 0, "probabilities": %s }',
    format(lambda), num(dpois(k, lambda)))
}
for (par in list(c(4, 1.5), c(0.8, 0.5), c(30, 3))) {
  mu <- par[1]; theta <- par[2]
  k <- 0:kmax(qnbinom(0.999, size = theta, mu = mu))
  cases[[length(cases) + 1]] <- sprintf('    { "distribution": "negbin", "mean": %s, "theta": %s, "firstK": 0, "probabilities": %s }',
    format(mu), format(theta), num(dnbinom(k, size = theta, mu = mu)))
}
p <- seq(0.1, 0.9, by = 0.1)
quant <- list()
for (par in list(c(0.6, 2), c(3.5, 0.4))) {
  quant[[length(quant) + 1]] <- sprintf('    { "distribution": "gamma", "shape": %s, "scale": %s, "deciles": %s }',
    format(par[1]), format(par[2]), num(qgamma(p, shape = par[1], scale = par[2])))
}
quant[[length(quant) + 1]] <- sprintf('    { "distribution": "normal", "mean": 2, "sd": 3, "deciles": %s }', num(qnorm(p, 2, 3)))

out <- c(
  "{",
  sprintf('  "source": "R %s.%s, package stats: dpois, dnbinom(size = theta, mu = mean), qgamma, qnorm; made by test/demo/reference/make-count-probabilities.R",', R.version$major, R.version$minor),
  '  "tolerance": "exact probabilities; the test compares sampled frequencies by a chi-square goodness-of-fit test at p = 0.001",',
  '  "counts": [',
  paste(unlist(cases), collapse = ",\n"),
  "  ],",
  '  "quantiles": [',
  paste(unlist(quant), collapse = ",\n"),
  "  ]",
  "}"
)
args <- commandArgs(trailingOnly = FALSE)
script <- sub("^--file=", "", args[grep("^--file=", args)])
writeLines(out, file.path(dirname(script), "count-probabilities.json"))

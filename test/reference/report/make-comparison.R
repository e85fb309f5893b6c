# Reference values for the report's model comparison (src-shared/report/comparison-digest.ts).
#
# Run from the repository root:   Rscript test/reference/report/make-comparison.R
#
# Data: pscl's bioChemists (Long 1990), as test/reference/zero/bioChemists.csv
# (written by test/reference/zero/make-zero.R). Four models of
# art ~ fem + mar + kid5 + phd + ment (the same terms in the zero part):
# stats::glm poisson, MASS::glm.nb, pscl::zeroinfl poisson and negbin.
# Per model: log-likelihood, its df, AIC, BIC, Pearson chi-square over the
# residual df, and the expected number of zeros (sum over records of P(Y = 0)).
# Tests: the LR test of NB against Poisson, p = half the chi-square(1) tail
# (theta = infinity on the boundary); the Vuong test, AIC-corrected, of each
# zero-inflated model against its count model, written out by hand with the
# parameter counts pscl::vuong uses (the coefficients, theta not counted),
# z = (sum(m) - (k1 - k2)) / (sd(m) sqrt(n)), one-sided p = pnorm(-|z|).
# Writes comparison-fixtures.json beside this script.
suppressPackageStartupMessages({
  library(MASS)
  library(pscl)
  library(jsonlite)
})

args <- commandArgs(trailingOnly = FALSE)
script <- sub("^--file=", "", args[grep("^--file=", args)])
outDir <- if (length(script)) dirname(normalizePath(script)) else "test/reference/report"
d <- read.csv(file.path(outDir, "..", "zero", "bioChemists.csv"))
d$fem <- relevel(factor(d$fem), "Men")
d$mar <- relevel(factor(d$mar), "Single")

f <- art ~ fem + mar + kid5 + phd + ment
fz <- art ~ fem + mar + kid5 + phd + ment | fem + mar + kid5 + phd + ment
ctrl <- zeroinfl.control(reltol = 1e-14, maxit = 10000)
m <- list(
  poisson = glm(f, family = poisson, data = d, control = glm.control(epsilon = 1e-12, maxit = 100)),
  negbin = glm.nb(f, data = d, control = glm.control(epsilon = 1e-12, maxit = 100)),
  zip = zeroinfl(fz, data = d, dist = "poisson", control = ctrl),
  zinb = zeroinfl(fz, data = d, dist = "negbin", control = ctrl)
)
y <- d$art
n <- length(y)
p0 <- list(
  poisson = dpois(0, fitted(m$poisson)),
  negbin = dnbinom(0, size = m$negbin$theta, mu = fitted(m$negbin)),
  zip = predict(m$zip, type = "prob")[, 1],
  zinb = predict(m$zinb, type = "prob")[, 1]
)
row <- function(id) {
  fit <- m[[id]]
  ll <- logLik(fit)
  list(
    id = id,
    logLik = as.numeric(ll),
    df = attr(ll, "df"),
    aic = AIC(fit),
    bic = BIC(fit),
    pearsonChi2 = sum(residuals(fit, type = "pearson")^2),
    dfResidual = df.residual(fit),
    expectedZeros = sum(p0[[id]])
  )
}
perObs <- function(id) {
  fit <- m[[id]]
  if (id == "poisson") return(dpois(y, fitted(fit), log = TRUE))
  if (id == "negbin") return(dnbinom(y, size = fit$theta, mu = fitted(fit), log = TRUE))
  pr <- predict(fit, type = "prob", at = 0:max(y))
  log(pr[cbind(seq_len(n), y + 1)])
}
vuongAic <- function(a, b) {
  mm <- perObs(a) - perObs(b)
  k1 <- length(coef(m[[a]]))
  k2 <- length(coef(m[[b]]))
  z <- (sum(mm) - (k1 - k2)) / (sd(mm) * sqrt(n))
  list(first = a, second = b, k1 = k1, k2 = k2, statistic = z, p = pnorm(-abs(z)))
}
lr <- 2 * (as.numeric(logLik(m$negbin)) - as.numeric(logLik(m$poisson)))
out <- list(
  source = "pscl::bioChemists (Long 1990); stats::glm, MASS::glm.nb, pscl::zeroinfl of art ~ fem + mar + kid5 + phd + ment",
  r = R.version.string,
  packages = list(MASS = as.character(packageVersion("MASS")), pscl = as.character(packageVersion("pscl"))),
  observedZeros = sum(y == 0),
  nobs = n,
  models = lapply(names(m), row),
  lrNegbinPoisson = list(statistic = lr, p = 0.5 * pchisq(lr, 1, lower.tail = FALSE)),
  vuong = list(vuongAic("zip", "poisson"), vuongAic("zinb", "negbin"))
)
writeLines(toJSON(out, auto_unbox = TRUE, digits = NA, pretty = TRUE), file.path(outDir, "comparison-fixtures.json"))

# Reference values for the model diagnostics (src-shared/diagnostics).
#
# Run from the repository root:   Rscript test/reference/diagnostics/make-diagnostics.R
#
# Data: MASS's `quine` (Aitkin 1978; Venables & Ripley, MASS 4th ed.): days
# absent from school by ethnicity, sex, age group and learner status. The
# only derived column is `cell`, the Eth:Sex:Age:Lrn combination, used as
# the grouping ("site") for the mean-variance check.
#
# Writes, beside this script:
#   quine.csv                 the data as fitted
#   bioChemists.csv           pscl's bioChemists (Long 1990), the columns used
#   zero-fixtures.json        pscl::zeroinfl (ZIP, ZINB) and pscl::hurdle (hurdle
#                             negative binomial) of art ~ fem + mar + kid5 + phd + ment
#                             (the same terms in the zero part): coefficients,
#                             expected frequencies colSums(predict(type = "prob"))
#                             and expected zeros
#   diagnostics-fixtures.json
#     - Poisson glm() and MASS::glm.nb() fits of Days ~ Eth + Sex + Age + Lrn
#       (coefficients and theta, to confirm our engine fits the same model);
#     - expected frequencies: colSums of the n x (K+1) matrices of
#       dpois(k, mu_i) / dnbinom(k, size = theta, mu = mu_i), k = 0..max(Days);
#     - observed frequencies and zeros;
#     - per cell mean and variance (var(), divisor n - 1) of Days;
#     - statmod::qresid for both fits with the uniforms it drew recorded
#       (set.seed before qresid, then the same seed again, since statmod
#       draws runif(n, a, b) = a + (b - a) * U; R's runif takes no draw where
#       a == b, which happens where F(y - 1) rounds to 1, so those rows get
#       no uniform (0.5 stored) and their residual is Inf, stored as null),
#       so a quantile residual computed from the same U can be compared
#       number for number;
#     - qnorm at probabilities down to 1e-300 (the normal quantile's tails);
#     - the CDF bounds F(y - 1), F(y) of every observation (ppois / pnbinom);
#     - `accurate`: the same residuals from the upper tails (lower.tail =
#       FALSE), r = -qnorm(P(Y > y) + (1 - U) P(Y = y)), which keeps its
#       digits where F(y - 1) is within 1e-12 of 1 and qresid's does not.
suppressPackageStartupMessages({
  library(MASS)
  library(pscl)
  library(statmod)
  library(jsonlite)
})

args <- commandArgs(trailingOnly = FALSE)
script <- sub("^--file=", "", args[grep("^--file=", args)])
outDir <- if (length(script)) dirname(normalizePath(script)) else "test/reference/diagnostics"

d <- quine
d$cell <- paste(d$Eth, d$Sex, d$Age, d$Lrn, sep = "-")
write.csv(d, file.path(outDir, "quine.csv"), row.names = FALSE, quote = FALSE)

f_pois <- glm(Days ~ Eth + Sex + Age + Lrn, family = poisson, data = d, control = glm.control(epsilon = 1e-12, maxit = 100))
f_nb <- glm.nb(Days ~ Eth + Sex + Age + Lrn, data = d, control = glm.control(epsilon = 1e-12, maxit = 100))

y <- d$Days
K <- max(y)
ks <- 0:K
mu_p <- fitted(f_pois)
mu_n <- fitted(f_nb)
th <- f_nb$theta
ef_p <- colSums(outer(mu_p, ks, function(m, k) dpois(k, m)))
ef_n <- colSums(outer(mu_n, ks, function(m, k) dnbinom(k, size = th, mu = m)))

qres_with_uniforms <- function(fit, a, b, seed, s0, s1) {
  set.seed(seed)
  r <- qresid(fit)
  set.seed(seed)
  draws <- a != b
  u <- rep(0.5, length(a))
  u[draws] <- runif(sum(draws))
  r <- unname(r)
  accurate <- qnorm(s1 + (1 - u) * (s0 - s1), lower.tail = FALSE)
  list(uniforms = unname(u), residuals = ifelse(is.finite(r), r, NA), infinite = which(!is.finite(r)) - 1L, accurate = unname(accurate))
}

coefs <- function(fit) {
  cf <- coef(fit)
  nm <- names(cf)
  nm[nm == "(Intercept)"] <- "intercept"
  nm <- sub("^Eth", "Eth=", nm); nm <- sub("^Sex", "Sex=", nm); nm <- sub("^Age", "Age=", nm); nm <- sub("^Lrn", "Lrn=", nm)
  setNames(as.list(unname(cf)), nm)
}

mv_mean <- tapply(y, d$cell, mean)
mv_var <- tapply(y, d$cell, var)
mv_n <- tapply(y, d$cell, length)

out <- list(
  R = R.version.string,
  packages = list(MASS = as.character(packageVersion("MASS")), statmod = as.character(packageVersion("statmod"))),
  source = "MASS::quine; glm(poisson) and MASS::glm.nb of Days ~ Eth + Sex + Age + Lrn; statmod::qresid",
  spec = list(response = "Days", predictors = list(
    list(column = "Eth", type = "factor"), list(column = "Sex", type = "factor"),
    list(column = "Age", type = "factor"), list(column = "Lrn", type = "factor"))),
  tolerance = list(coefficients = 1e-5, frequency = 1e-4, quantileResidual = 1e-4, cdf = 1e-5, meanVariance = 1e-12),
  observedFrequency = as.integer(tabulate(y + 1, nbins = K + 1)),
  observedZeros = sum(y == 0),
  poisson = list(
    coefficients = coefs(f_pois),
    expectedFrequency = unname(ef_p),
    cdfLower = unname(ppois(y - 1, mu_p)), cdfUpper = unname(ppois(y, mu_p)),
    qresid = qres_with_uniforms(f_pois, ppois(y - 1, mu_p), ppois(y, mu_p), 20261201,
      ppois(y - 1, mu_p, lower.tail = FALSE), ppois(y, mu_p, lower.tail = FALSE))
  ),
  negbin = list(
    coefficients = coefs(f_nb), theta = th,
    expectedFrequency = unname(ef_n),
    cdfLower = unname(pnbinom(y - 1, size = th, mu = mu_n)), cdfUpper = unname(pnbinom(y, size = th, mu = mu_n)),
    qresid = qres_with_uniforms(f_nb, pnbinom(y - 1, size = th, mu = mu_n), pnbinom(y, size = th, mu = mu_n), 20261202,
      pnbinom(y - 1, size = th, mu = mu_n, lower.tail = FALSE), pnbinom(y, size = th, mu = mu_n, lower.tail = FALSE))
  ),
  normalQuantile = list(p = qp <- c(1e-300, 1e-100, 1e-20, 1e-12, 1e-9, 1e-5, 0.025, 0.3, 0.5, 0.975, 1 - 1e-9),
                        q = qnorm(qp)),
  meanVariance = list(
    group = "cell", cells = names(mv_mean),
    n = as.integer(unname(mv_n)), mean = unname(as.numeric(mv_mean)), variance = unname(as.numeric(mv_var))
  )
)
zd <- bioChemists
write.csv(zd[, c("art", "fem", "mar", "kid5", "phd", "ment")], file.path(outDir, "bioChemists.csv"), row.names = FALSE, quote = FALSE)
zf <- art ~ fem + mar + kid5 + phd + ment | fem + mar + kid5 + phd + ment
zfits <- list(
  zip = zeroinfl(zf, data = zd, dist = "poisson", control = zeroinfl.control(reltol = 1e-14)),
  zinb = zeroinfl(zf, data = zd, dist = "negbin", control = zeroinfl.control(reltol = 1e-14)),
  "hurdle-negbin" = hurdle(zf, data = zd, dist = "negbin", control = hurdle.control(reltol = 1e-14))
)
zy <- zd$art
zout <- list(
  R = R.version.string,
  packages = list(pscl = as.character(packageVersion("pscl"))),
  source = "pscl::bioChemists; pscl::zeroinfl / pscl::hurdle of art ~ fem + mar + kid5 + phd + ment | same; colSums(predict(fit, type = 'prob'))",
  tolerance = list(frequency = 1e-4),
  predictors = c("fem", "mar", "kid5", "phd", "ment"),
  observedFrequency = as.integer(tabulate(zy + 1, nbins = max(zy) + 1)),
  fits = lapply(zfits, function(m) list(
    theta = if (is.null(m$theta)) NULL else unname(m$theta),
    logLik = as.numeric(logLik(m)),
    expectedFrequency = unname(colSums(predict(m, type = "prob", at = 0:max(zy))))
  ))
)
writeLines(toJSON(zout, auto_unbox = TRUE, digits = NA, pretty = FALSE, na = "null", null = "null"), file.path(outDir, "zero-fixtures.json"))

writeLines(toJSON(out, auto_unbox = TRUE, digits = NA, pretty = FALSE, na = "null"), file.path(outDir, "diagnostics-fixtures.json"))
cat("wrote", file.path(outDir, "diagnostics-fixtures.json"), "and zero-fixtures.json\n")

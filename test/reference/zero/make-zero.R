# Reference values for the zero-inflated and hurdle count models.
#
# Run from the repository root:   Rscript test/reference/zero/make-zero.R
#
# Writes, beside this script:
#   bioChemists.csv   pscl's bioChemists data (Long 1990) plus one INVENTED
#                     column `exposure_years` (seeded, runif) used only to
#                     exercise the offset code path, and one INVENTED column
#                     `site_invented` (seeded, 30 groups) for fixed site effects
#                     and site-clustered SEs; neither is part of the data.
#   zero-fits.json    pscl::zeroinfl / pscl::hurdle fits, Vuong statistics,
#                     a numerical-Hessian cross-check of every SE, and the
#                     van den Broek (1995) score test computed by hand.
#
# Every fit is run with a tightened optimiser tolerance (reltol = 1e-14) so
# the reference estimates are the maximum-likelihood values to many digits;
# the gradient of an independent hand-written log-likelihood at the reported
# estimates is stored as `maxAbsGradient` to show it.

suppressPackageStartupMessages({
  library(pscl)
  library(MASS)
  library(jsonlite)
  library(numDeriv)
  library(sandwich)
})

args <- commandArgs(trailingOnly = FALSE)
script <- sub("^--file=", "", args[grep("^--file=", args)])
outDir <- if (length(script)) dirname(normalizePath(script)) else "test/reference/zero"

data("bioChemists", package = "pscl")
d <- bioChemists
set.seed(20261201)
d$exposure_years <- round(runif(nrow(d), 1, 4), 2) # INVENTED offset column
d$site_invented <- sample(sprintf("S%02d", 1:30), nrow(d), replace = TRUE) # INVENTED grouping column
write.csv(d, file.path(outDir, "bioChemists.csv"), row.names = FALSE, quote = FALSE)

# ---- independent log-likelihoods (no pscl internals) --------------------
logf <- function(y, mu, theta) {
  if (is.null(theta)) dpois(y, mu, log = TRUE) else dnbinom(y, size = theta, mu = mu, log = TRUE)
}
make_ll <- function(type, dist, y, X, Z, off) {
  kx <- ncol(X); kz <- ncol(Z)
  function(par) {
    beta <- par[1:kx]; gam <- par[kx + 1:kz]
    theta <- if (dist == "negbin") exp(par[kx + kz + 1]) else NULL
    mu <- exp(drop(X %*% beta) + off)
    eta <- drop(Z %*% gam)
    if (type == "zeroinfl") {
      lpi <- plogis(eta, log.p = TRUE); l1pi <- plogis(-eta, log.p = TRUE)
      l0 <- logf(0, mu, theta)
      ll <- ifelse(y == 0, pmax(lpi, l1pi + l0) + log1p(exp(-abs(lpi - l1pi - l0))),
                   l1pi + logf(y, mu, theta))
    } else {
      lp <- plogis(eta, log.p = TRUE); l1p <- plogis(-eta, log.p = TRUE)
      l0 <- logf(0, mu, theta)
      ll <- ifelse(y == 0, l1p, lp + logf(y, mu, theta) - log(-expm1(l0)))
    }
    sum(ll)
  }
}

coefTable <- function(est, se, names) {
  lapply(seq_along(est), function(i) list(name = names[i], estimate = unname(est[i]), se = unname(se[i])))
}

fitOne <- function(id, type, dist, formula, ourSpec, offsetColumn = NULL, clusterSe = FALSE) {
  ctrl <- if (type == "zeroinfl") zeroinfl.control(reltol = 1e-14) else hurdle.control(reltol = 1e-14)
  m <- if (type == "zeroinfl") zeroinfl(formula, data = d, dist = dist, control = ctrl)
       else hurdle(formula, data = d, dist = dist, zero.dist = "binomial", control = ctrl)
  X <- model.matrix(m, model = "count"); Z <- model.matrix(m, model = "zero")
  message(id)
  off <- if (is.null(offsetColumn)) rep(0, nrow(d)) else log(d[[offsetColumn]])
  y <- m$y
  cc <- m$coefficients$count; zc <- m$coefficients$zero
  par <- c(cc, zc)
  if (dist == "negbin") par <- c(par, log(m$theta))
  ll <- make_ll(type, dist, y, X, Z, off)
  H <- numDeriv::hessian(ll, par)
  seNum <- sqrt(diag(solve(-H)))
  g <- numDeriv::grad(ll, par)
  s <- summary(m)$coefficients
  seCount <- s$count[, 2]; seZero <- s$zero[, 2]
  kx <- length(cc); kz <- length(zc)
  sePscl <- c(seCount[1:kx], seZero)
  if (dist == "negbin") sePscl <- c(sePscl, seCount[kx + 1]) # Log(theta) row
  fitted <- predict(m, type = "response")
  probs <- predict(m, type = "prob", at = 0:6)
  robust <- NULL
  if (clusterSe) {
    V <- sandwich::vcovCL(m, cluster = d$site_invented, type = "HC1", cadjust = TRUE)
    # vcovCL's bread is pscl's vcov (optim's finite-difference Hessian); the same sandwich with
    # the numDeriv Hessian as bread (Poisson: H covers exactly the coefficients) is stored too.
    meat <- sandwich::meatCL(m, cluster = d$site_invented, type = "HC1", cadjust = TRUE)
    Hinv <- solve(-H)
    Vnum <- nrow(d) * Hinv %*% meat %*% Hinv
    robust <- list(source = "sandwich::vcovCL(m, cluster = d$site_invented, type = \"HC1\", cadjust = TRUE)",
                   sandwich = as.character(packageVersion("sandwich")), se = unname(sqrt(diag(V))), names = colnames(V),
                   seNumericalBread = unname(sqrt(diag(Vnum))))
  }
  list(
    id = id, source = sprintf("pscl::%s(%s, dist = \"%s\")", type, deparse(formula, width.cutoff = 200L), dist),
    spec = ourSpec,
    nobs = m$n, df = attr(logLik(m), "df"),
    logLik = as.numeric(logLik(m)), aic = AIC(m), bic = BIC(m),
    converged = m$converged,
    theta = if (dist == "negbin") unname(m$theta) else NULL,
    seLogTheta = if (dist == "negbin") unname(m$SE.logtheta) else NULL,
    count = coefTable(cc, seCount[1:kx], names(cc)),
    zero = coefTable(zc, seZero, names(zc)),
    pearsonChi2 = sum(residuals(m, type = "pearson")^2),
    clusterSe = robust,
    firstRows = list(expected = unname(fitted[1:8]), probZero = unname(probs[1:8, 1]),
                     prob0to6 = unname(lapply(1:8, function(i) unname(probs[i, ])))),
    hessianCheck = list(
      method = "numDeriv::hessian of a hand-written log-likelihood, inverted",
      logLikHandWritten = ll(par),
      maxAbsGradient = max(abs(g)),
      maxRelSeDiff = max(abs(seNum - sePscl) / sePscl),
      seNumerical = unname(seNum)
    )
  )
}

num <- function(col) list(column = col, type = "numeric")
fac <- function(col, ref) list(column = col, type = "factor", reference = ref)
allTerms <- list(fac("fem", "Men"), fac("mar", "Single"), num("kid5"), num("phd"), num("ment"))
spec <- function(distribution, zero = allTerms, offsets = list()) {
  list(response = "art", distribution = distribution, predictors = allTerms, zeroPredictors = zero, offsets = offsets)
}
f <- art ~ fem + mar + kid5 + phd + ment
fits <- list(
  fitOne("zip", "zeroinfl", "poisson", f, spec("zip")),
  fitOne("zinb", "zeroinfl", "negbin", f, spec("zinb")),
  fitOne("hurdle-poisson", "hurdle", "poisson", f, spec("hurdle-poisson")),
  fitOne("hurdle-negbin", "hurdle", "negbin", f, spec("hurdle-negbin")),
  fitOne("zinb-zero-ment", "zeroinfl", "negbin", art ~ fem + mar + kid5 + phd + ment | ment,
         spec("zinb", zero = list(num("ment")))),
  fitOne("zip-offset-invented", "zeroinfl", "poisson",
         art ~ fem + mar + kid5 + phd + ment + offset(log(exposure_years)) | 1,
         spec("zip", zero = list(), offsets = list(list(column = "exposure_years", log = TRUE))),
         offsetColumn = "exposure_years"),
  fitOne("hurdle-negbin-offset-invented", "hurdle", "negbin",
         art ~ fem + mar + kid5 + phd + ment + offset(log(exposure_years)) | fem,
         spec("hurdle-negbin", zero = list(fac("fem", "Men")), offsets = list(list(column = "exposure_years", log = TRUE))),
         offsetColumn = "exposure_years"),
  fitOne("zip-site-fixed-invented", "zeroinfl", "poisson",
         art ~ site_invented + fem + mar + kid5 + phd + ment - 1 | 1,
         c(spec("zip", zero = list()), list(site = list(column = "site_invented", effect = "fixed"), robust = "site")),
         clusterSe = TRUE),
  fitOne("hurdle-negbin-site-fixed-invented", "hurdle", "negbin",
         art ~ site_invented + fem + mar + kid5 + phd + ment - 1 | fem,
         c(spec("hurdle-negbin", zero = list(fac("fem", "Men"))), list(site = list(column = "site_invented", effect = "fixed"))))
)

# ---- Vuong tests as pscl::vuong prints them -----------------------------
# pscl::vuong returns NULL, so the statistics are parsed from its printout
# (7 significant digits) and also recomputed here at full precision with the
# same formula from the per-observation probabilities pscl::predprob gives.
vuongRef <- function(id, m1, m2) {
  printed <- capture.output(vuong(m1, m2))
  rows <- grep("^(Raw|AIC-corrected|BIC-corrected)", printed, value = TRUE)
  z <- as.numeric(sub("^\\S+\\s+(\\S+).*$", "\\1", rows))
  p1 <- predprob(m1); p2 <- predprob(m2)
  col <- match(m1$y, colnames(p1))
  l1 <- log(p1[cbind(seq_along(col), col)]); l2 <- log(p2[cbind(seq_along(col), col)])
  m <- l1 - l2; n <- length(m)
  k1 <- length(coef(m1)); k2 <- length(coef(m2))
  adj <- c(0, (k1 - k2) / n, (k1 - k2) / (2 * n) * log(n))
  stat <- sapply(adj, function(a) sum(m - a) / (sd(m - a) * sqrt(n)))
  p <- ifelse(stat > 0, pnorm(stat, lower.tail = FALSE), pnorm(stat))
  list(id = id, k1 = k1, k2 = k2, n = n,
       logLik1 = l1, logLik2 = l2,
       printedZ = z, stat = stat, p = p)
}
glmPois <- glm(f, data = d, family = poisson)
glmNb <- glm.nb(f, data = d)
zipM <- zeroinfl(f, data = d, dist = "poisson", control = zeroinfl.control(reltol = 1e-14))
zinbM <- zeroinfl(f, data = d, dist = "negbin", control = zeroinfl.control(reltol = 1e-14))
hpM <- hurdle(f, data = d, dist = "poisson", control = hurdle.control(reltol = 1e-14))
hnbM <- hurdle(f, data = d, dist = "negbin", control = hurdle.control(reltol = 1e-14))
vuongs <- list(vuongRef("poisson-vs-zip", glmPois, zipM), vuongRef("negbin-vs-zinb", glmNb, zinbM),
               vuongRef("zip-vs-hurdle-poisson", zipM, hpM), vuongRef("zinb-vs-hurdle-negbin", zinbM, hnbM))

# ---- van den Broek (1995) score test, computed by hand ------------------
# S = [sum (1{y=0} - p0)/p0]^2 / [sum (1 - p0)/p0 - mu' X (X' W X)^-1 X' mu],
# p0 = exp(-mu), W = diag(mu), chi-square with 1 df. With an intercept only
# the subtracted term is n * mean(y).
scoreTest <- function(id, model) {
  y <- model$y; mu <- fitted(model); X <- model.matrix(model)
  p0 <- exp(-mu)
  num <- sum(((y == 0) - p0) / p0)^2
  corr <- drop(t(mu) %*% X %*% solve(t(X) %*% (X * mu)) %*% t(X) %*% mu)
  stat <- num / (sum((1 - p0) / p0) - corr)
  statSimple <- num / (sum((1 - p0) / p0) - length(y) * mean(y))
  list(id = id, source = sprintf("glm(%s, family = poisson) on pscl::bioChemists; hand computation", deparse(formula(model))),
       mu = unname(mu), y = unname(y), withCovariates = list(statistic = stat, p = pchisq(stat, 1, lower.tail = FALSE)),
       interceptFormula = list(statistic = statSimple, p = pchisq(statSimple, 1, lower.tail = FALSE)))
}
scores <- list(scoreTest("bioChemists-full", glmPois),
               scoreTest("bioChemists-intercept", glm(art ~ 1, data = d, family = poisson)))

# ---- base R probability functions for the pmf/cdf tests ----------------
pmfGrid <- expand.grid(mu = c(0.05, 0.3, 2.5, 17), theta = c(0.7, 4, 250))
pmfRef <- lapply(seq_len(nrow(pmfGrid)), function(r) {
  mu <- pmfGrid$mu[r]; th <- pmfGrid$theta[r]; y <- 0:40
  list(mu = mu, theta = th, y = y,
       dpois = dpois(y, mu), ppois = ppois(y, mu),
       dnbinom = dnbinom(y, size = th, mu = mu), pnbinom = pnbinom(y, size = th, mu = mu))
})

out <- list(
  source = list(
    dataset = "bioChemists (Long 1990), shipped with pscl; exposure_years is INVENTED (set.seed(20261201), runif(1, 4))",
    r = R.version.string, pscl = as.character(packageVersion("pscl")),
    MASS = as.character(packageVersion("MASS")), numDeriv = as.character(packageVersion("numDeriv")),
    optimiser = "BFGS via pscl, reltol = 1e-14"
  ),
  tolerance = list(coefficientRel = 1e-4, coefficientAbsNearZero = 1e-4, seRel = 1e-4, logLikAbs = 1e-6,
                   vuongStatAbs = 1e-6, vuongPrintedAbs = 1e-6, scoreRel = 1e-8),
  fits = fits, vuong = vuongs, scoreTests = scores,
  pmf = list(source = "stats::dpois, ppois, dnbinom(size, mu), pnbinom(size, mu)", tolerance = 1e-12, cases = pmfRef)
)
write(toJSON(out, auto_unbox = TRUE, digits = NA, null = "null", pretty = TRUE), file.path(outDir, "zero-fits.json"))
cat("wrote", file.path(outDir, "zero-fits.json"), "\n")

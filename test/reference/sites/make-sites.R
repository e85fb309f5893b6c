# Reference values for site effects (absorbed fixed sites, random site intercept).
#
# Run from the repository root:   Rscript test/reference/sites/make-sites.R
# Writes JSON fixtures next to this script. Tests read the fixtures only.
#
# Sources: open datasets shipped with R packages (MASS::epil, lme4::grouseticks)
# and one seeded simulated site x season grid (our own invented scenario).
# Fixed sites: stats::glm (poisson) and MASS::glm.nb with a dense site factor.
# Random site intercept: lme4::glmer (poisson, nAGQ = 9 and 1), glmmTMB::glmmTMB
# (poisson and nbinom2, Laplace with the exact curvature) and lme4::glmer.nb
# (Laplace with IRLS weights, for comparison with looser tolerances). Each
# random case also carries the exact marginal log-likelihood at R's
# estimates, every site's integral done by stats::integrate.
# glmmTMB came from Debian's r-cran-glmmtmb (apt).

suppressPackageStartupMessages({
  library(MASS); library(lme4); library(jsonlite)
  has_tmb <- requireNamespace("glmmTMB", quietly = TRUE)
  if (has_tmb) library(glmmTMB)
})

out_dir <- "test/reference/sites"
versions <- list(
  R = R.version.string,
  MASS = as.character(packageVersion("MASS")),
  lme4 = as.character(packageVersion("lme4")),
  glmmTMB = if (has_tmb) as.character(packageVersion("glmmTMB")) else NA
)

write_fixture <- function(obj, name) {
  writeLines(toJSON(obj, auto_unbox = TRUE, digits = NA, pretty = TRUE, na = "null"),
             file.path(out_dir, name))
}

# Columns as cell texts (what a DataTable holds).
as_texts <- function(df) lapply(df, function(v) as.character(v))

# Coefficient rows: our term names beside R's, estimate and SE.
coef_rows <- function(est, se, r_names, our_names) {
  lapply(seq_along(r_names), function(k) list(
    term = our_names[k], rTerm = r_names[k],
    estimate = unname(est[r_names[k]]), se = unname(se[r_names[k]])))
}

## ---------------------------------------------------------------- data sets
data(epil, package = "MASS")
epil_df <- data.frame(y = epil$y, trt = as.character(epil$trt), lbase = epil$lbase,
                      lage = epil$lage, V4 = epil$V4, subject = epil$subject,
                      period = epil$period)

data(grouseticks, package = "lme4")
gt <- grouseticks
gt$HEIGHT_s <- as.numeric(scale(gt$HEIGHT))
gt_df <- data.frame(TICKS = gt$TICKS, YEAR = as.character(gt$YEAR), HEIGHT = gt$HEIGHT,
                    HEIGHT_s = gt$HEIGHT_s, LOCATION = as.character(gt$LOCATION))

# Seeded simulation: 40 sites x 8 seasons, NB counts with an effort offset,
# a within-site covariate, about 15% of site-seasons missing and two sites
# that never had a count above zero.
set.seed(20261201)
S <- 40; Tn <- 8
sim <- expand.grid(season = 1:Tn, site = 1:S)
sim$site <- sprintf("S%02d", sim$site)
a <- rnorm(S, 0.5, 0.9)
sim$cover <- round(runif(nrow(sim), 0, 1), 3)
sim$effort <- round(runif(nrow(sim), 0.5, 3), 2)
eta <- a[as.integer(factor(sim$site))] + 0.08 * (sim$season - 1) - 0.6 * sim$cover + log(sim$effort)
sim$count <- rnbinom(nrow(sim), mu = exp(eta), size = 1.8)
sim$count[sim$site %in% c("S07", "S23")] <- 0
sim <- sim[runif(nrow(sim)) > 0.15, ]
sim_df <- data.frame(count = sim$count, season = sim$season, cover = sim$cover,
                     effort = sim$effort, site = sim$site)

datasets <- list(
  epil = list(source = "MASS::epil (MASS 7.3)", columns = as_texts(epil_df)),
  grouseticks = list(source = "lme4::grouseticks; HEIGHT_s = scale(HEIGHT) computed in R",
                     columns = as_texts(gt_df)),
  sim = list(source = "seeded simulation in this script (set.seed(20261201))",
             columns = as_texts(sim_df))
)
write_fixture(list(versions = versions, datasets = datasets), "sites-data.json")

## ---------------------------------------------------------- fixed, absorbed
ctrl <- glm.control(epsilon = 1e-10, maxit = 100)
# Sites whose counts are all zero have effect -infinity: the dense fit's
# iteration drifts without converging (and with a tight epsilon can break
# down numerically). Its limit is the fit without those sites, which is what
# the fixture holds; the sites left out are listed.
site_column <- function(formula) {
  v <- grep("^factor\\(", attr(terms(formula), "term.labels"), value = TRUE)
  sub("^factor\\((.*)\\)$", "\\1", v[length(v)])
}
fixed_case <- function(name, data, formula, spec, r_names, our_names, family) {
  sc <- site_column(formula)
  resp <- all.vars(formula)[1]
  totals <- tapply(data[[resp]], data[[sc]], sum)
  zero_sites <- names(totals)[totals == 0]
  nobs_all <- nrow(data)
  data <- data[!(as.character(data[[sc]]) %in% zero_sites), ]
  if (family == "poisson") {
    m <- glm(formula, family = poisson, data = data, control = ctrl)
    theta <- NULL
    fn <- "stats::glm(family = poisson)"
  } else {
    m <- glm.nb(formula, data = data, control = ctrl)
    theta <- m$theta
    fn <- "MASS::glm.nb"
  }
  if (!m$converged) stop(name, ": the reference fit did not converge")
  s <- summary(m)$coefficients
  cf <- coef(m)
  aliased <- names(cf)[is.na(cf)]
  list(name = name, dataset = spec$dataset, source = paste(fn, "with a dense site factor"),
       formula = paste(deparse(formula), collapse = " "),
       spec = spec$spec,
       coefficients = coef_rows(s[, 1], s[, 2], r_names, our_names),
       logLikelihood = as.numeric(logLik(m)),
       deviance = deviance(m),
       theta = theta,
       rAliased = aliased,
       zeroSites = I(zero_sites),
       nobsAll = nobs_all,
       tolerance = list(estimate = 1e-5, se = 1e-4, logLikelihood = 1e-6, theta = 1e-4, deviance = 1e-5))
}

fixed <- list()
fixed[[1]] <- fixed_case("epil-poisson-fixed", epil_df,
  y ~ factor(period) + trt + factor(subject),
  list(dataset = "epil", spec = list(response = "y", distribution = "poisson",
       predictors = list(list(column = "period", type = "factor"), list(column = "trt", type = "factor")),
       site = list(column = "subject", effect = "fixed"))),
  c("factor(period)2", "factor(period)3", "factor(period)4"), c("period=2", "period=3", "period=4"), "poisson")
fixed[[2]] <- fixed_case("epil-negbin-fixed", epil_df,
  y ~ factor(period) + trt + factor(subject),
  list(dataset = "epil", spec = list(response = "y", distribution = "negbin",
       predictors = list(list(column = "period", type = "factor"), list(column = "trt", type = "factor")),
       site = list(column = "subject", effect = "fixed"))),
  c("factor(period)2", "factor(period)3", "factor(period)4"), c("period=2", "period=3", "period=4"), "negbin")
fixed[[3]] <- fixed_case("grouseticks-poisson-fixed", gt_df,
  TICKS ~ YEAR + factor(LOCATION),
  list(dataset = "grouseticks", spec = list(response = "TICKS", distribution = "poisson",
       predictors = list(list(column = "YEAR", type = "factor")),
       site = list(column = "LOCATION", effect = "fixed"))),
  c("YEAR96", "YEAR97"), c("YEAR=96", "YEAR=97"), "poisson")
fixed[[4]] <- fixed_case("grouseticks-negbin-fixed", gt_df,
  TICKS ~ YEAR + factor(LOCATION),
  list(dataset = "grouseticks", spec = list(response = "TICKS", distribution = "negbin",
       predictors = list(list(column = "YEAR", type = "factor")),
       site = list(column = "LOCATION", effect = "fixed"))),
  c("YEAR96", "YEAR97"), c("YEAR=96", "YEAR=97"), "negbin")
fixed[[5]] <- fixed_case("sim-poisson-fixed", sim_df,
  count ~ season + cover + offset(log(effort)) + factor(site),
  list(dataset = "sim", spec = list(response = "count", distribution = "poisson",
       predictors = list(list(column = "season", type = "numeric"), list(column = "cover", type = "numeric")),
       offsets = list(list(column = "effort", log = TRUE)),
       site = list(column = "site", effect = "fixed"))),
  c("season", "cover"), c("season", "cover"), "poisson")
fixed[[6]] <- fixed_case("sim-negbin-fixed", sim_df,
  count ~ factor(season) + cover + offset(log(effort)) + factor(site),
  list(dataset = "sim", spec = list(response = "count", distribution = "negbin",
       predictors = list(list(column = "season", type = "factor"), list(column = "cover", type = "numeric")),
       offsets = list(list(column = "effort", log = TRUE)),
       site = list(column = "site", effect = "fixed"))),
  c(paste0("factor(season)", 2:8), "cover"), c(paste0("season=", 2:8), "cover"), "negbin")
write_fixture(list(versions = versions, cases = fixed), "sites-fixed.json")

## ------------------------------------------------------- random intercept
gctrl <- glmerControl(optimizer = "bobyqa", optCtrl = list(maxfun = 1e5))
# The exact marginal log-likelihood at a fit's estimates, each site's integral
# by stats::integrate (adaptive quadrature): an independent check of the
# fixture's log-likelihood and of our quadrature.
integrated_loglik <- function(m, dist, theta) {
  if (inherits(m, "glmmTMB")) {
    X <- getME(m, "X"); beta <- fixef(m)$cond
    sd <- as.numeric(attr(VarCorr(m)$cond[[1]], "stddev"))
    g <- m$frame[[names(ranef(m)$cond)[1]]]
    y <- model.response(m$frame)
  } else {
    X <- getME(m, "X"); beta <- fixef(m)
    sd <- as.numeric(attr(VarCorr(m)[[1]], "stddev"))
    g <- getME(m, "flist")[[1]]
    y <- getME(m, "y")
  }
  eta0 <- as.vector(X %*% beta)
  total <- 0
  for (lev in unique(as.character(g))) {
    idx <- which(as.character(g) == lev)
    logf <- function(b) sapply(b, function(bb) {
      mu <- exp(eta0[idx] + bb)
      ll <- if (dist == "poisson") sum(dpois(y[idx], mu, log = TRUE)) else sum(dnbinom(y[idx], size = theta, mu = mu, log = TRUE))
      ll + dnorm(bb, 0, sd, log = TRUE)
    })
    # integrate on a scale where the integrand is 1 at its peak
    opt <- optimize(logf, c(-10 * sd - 5, 10 * sd + 5), maximum = TRUE, tol = 1e-10)
    peak <- opt$objective
    h <- function(b) exp(logf(b) - peak)
    val <- integrate(h, opt$maximum - 12 * sd - 3, opt$maximum + 12 * sd + 3, rel.tol = 1e-10, subdivisions = 1000L)$value
    total <- total + peak + log(val)
  }
  total
}

random_glmer <- function(name, data, formula, spec, r_names, our_names, nagq) {
  m <- glmer(formula, family = poisson, data = data, nAGQ = nagq, control = gctrl)
  s <- summary(m)$coefficients
  # With nAGQ > 1, lme4 1.1-31 reports logLik relative to the saturated
  # Poisson model (the sum of dpois(y, y, log = TRUE) left out); with
  # nAGQ = 1 it reports the full value. The fixture holds the full value.
  y <- model.response(model.frame(m))
  shift <- if (nagq > 1) sum(dpois(y, y, log = TRUE)) else 0
  list(name = name, dataset = spec$dataset,
       source = sprintf("lme4::glmer(family = poisson, nAGQ = %d)", nagq),
       formula = paste(deparse(formula), collapse = " "), spec = spec$spec,
       coefficients = coef_rows(s[, 1], s[, 2], r_names, our_names),
       rLogLik = as.numeric(logLik(m)),
       logLikelihood = as.numeric(logLik(m)) + shift,
       logLikIntegrate = integrated_loglik(m, "poisson", NULL),
       sd = as.numeric(attr(VarCorr(m)[[1]], "stddev")),
       theta = NULL,
       modes = unname(ranef(m)[[1]][, 1]),
       modeLevels = rownames(ranef(m)[[1]]),
       # lme4's nAGQ = 1 optimum differs from the exact Laplace optimum
       # (glmmTMB) by about 1e-3 in the coefficients and 0.7% in the SEs.
       tolerance = if (nagq > 1) list(estimate = 1e-3, se = 2e-3, logLikelihood = 1e-2, sd = 1e-3, modes = 2e-3)
                   else list(estimate = 3e-3, se = 1e-2, logLikelihood = 1e-2, sd = 3e-3, modes = 5e-3))
}
# glmmTMB's Laplace approximation uses the exact curvature of the
# conditional log-likelihood at the mode (automatic differentiation).
random_tmb <- function(name, data, formula, spec, r_names, our_names, family) {
  m <- glmmTMB(formula, family = family, data = data)
  s <- summary(m)$coefficients$cond
  nb <- family$family == "nbinom2"
  list(name = name, dataset = spec$dataset,
    source = sprintf("glmmTMB::glmmTMB(family = %s) (Laplace)", family$family),
    formula = paste(deparse(formula), collapse = " "), spec = spec$spec,
    coefficients = coef_rows(s[, 1], s[, 2], r_names, our_names),
    logLikelihood = as.numeric(logLik(m)),
    logLikIntegrate = integrated_loglik(m, if (nb) "negbin" else "poisson", if (nb) sigma(m) else NULL),
    sd = as.numeric(attr(VarCorr(m)$cond[[1]], "stddev")),
    theta = if (nb) sigma(m) else NULL,
    modes = unname(ranef(m)$cond[[1]][, 1]),
    modeLevels = rownames(ranef(m)$cond[[1]]),
    tolerance = list(estimate = 1e-3, se = 2e-3, logLikelihood = 1e-2, sd = 1e-3, theta = 2e-3, modes = 2e-3))
}
random_nb <- function(name, data, formula, spec, r_names, our_names) {
  res <- list()
  if (has_tmb) {
    m <- glmmTMB(formula, family = nbinom2, data = data)
    s <- summary(m)$coefficients$cond
    res[[length(res) + 1]] <- list(name = paste0(name, "-tmb"), dataset = spec$dataset,
      source = "glmmTMB::glmmTMB(family = nbinom2) (Laplace)",
      formula = paste(deparse(formula), collapse = " "), spec = spec$spec,
      coefficients = coef_rows(s[, 1], s[, 2], r_names, our_names),
      logLikelihood = as.numeric(logLik(m)),
      logLikIntegrate = integrated_loglik(m, "negbin", sigma(m)),
      sd = as.numeric(attr(VarCorr(m)$cond[[1]], "stddev")),
      theta = sigma(m),
      modes = unname(ranef(m)$cond[[1]][, 1]),
      modeLevels = rownames(ranef(m)$cond[[1]]),
      tolerance = list(estimate = 1e-3, se = 2e-3, logLikelihood = 1e-2, sd = 1e-3, theta = 2e-3, modes = 2e-3))
  }
  m <- glmer.nb(formula, data = data, control = gctrl)
  s <- summary(m)$coefficients
  # glmer.nb's Laplace step uses the expected (IRLS) weights, not the observed
  # curvature of the negative-binomial log-likelihood, and its SEs treat theta
  # as known: looser tolerances.
  res[[length(res) + 1]] <- list(name = paste0(name, "-glmer.nb"), dataset = spec$dataset,
    source = "lme4::glmer.nb (Laplace with IRLS weights)",
    formula = paste(deparse(formula), collapse = " "), spec = spec$spec,
    coefficients = coef_rows(s[, 1], s[, 2], r_names, our_names),
    logLikelihood = as.numeric(logLik(m)),
    sd = as.numeric(attr(VarCorr(m)[[1]], "stddev")),
    theta = getME(m, "glmer.nb.theta"),
    modes = unname(ranef(m)[[1]][, 1]),
    modeLevels = rownames(ranef(m)[[1]]),
    tolerance = list(estimate = 2e-2, se = 5e-2, logLikelihood = 0.5, sd = 5e-2, theta = 5e-2, modes = 5e-2))
  res
}

gt_spec <- function(dist, q) list(dataset = "grouseticks", spec = list(response = "TICKS", distribution = dist,
  predictors = list(list(column = "YEAR", type = "factor"), list(column = "HEIGHT_s", type = "numeric")),
  site = list(column = "LOCATION", effect = "random", quadraturePoints = q)))
epil_spec <- function(dist, q) list(dataset = "epil", spec = list(response = "y", distribution = dist,
  predictors = list(list(column = "lbase", type = "numeric"), list(column = "trt", type = "factor"),
                    list(columns = c("lbase", "trt"), type = "interaction"),
                    list(column = "lage", type = "numeric"), list(column = "V4", type = "numeric")),
  site = list(column = "subject", effect = "random", quadraturePoints = q)))
gt_r <- c("(Intercept)", "YEAR96", "YEAR97", "HEIGHT_s")
gt_our <- c("intercept", "YEAR=96", "YEAR=97", "HEIGHT_s")
ep_r <- c("(Intercept)", "lbase", "trtprogabide", "lage", "V4", "lbase:trtprogabide")
ep_our <- c("intercept", "lbase", "trt=progabide", "lage", "V4", "lbase & trt=progabide")
gt_f <- TICKS ~ YEAR + HEIGHT_s + (1 | LOCATION)
ep_f <- y ~ lbase * trt + lage + V4 + (1 | subject)

random <- list(
  random_glmer("grouseticks-poisson-agq9", gt_df, gt_f, gt_spec("poisson", 9), gt_r, gt_our, 9),
  random_glmer("grouseticks-poisson-laplace", gt_df, gt_f, gt_spec("poisson", 1), gt_r, gt_our, 1),
  random_glmer("epil-poisson-agq9", epil_df, ep_f, epil_spec("poisson", 9), ep_r, ep_our, 9),
  random_glmer("epil-poisson-laplace", epil_df, ep_f, epil_spec("poisson", 1), ep_r, ep_our, 1)
)
if (has_tmb) random <- c(random, list(
  random_tmb("grouseticks-poisson-laplace-tmb", gt_df, gt_f, gt_spec("poisson", 1), gt_r, gt_our, poisson()),
  random_tmb("epil-poisson-laplace-tmb", epil_df, ep_f, epil_spec("poisson", 1), ep_r, ep_our, poisson())))
random <- c(random,
  random_nb("grouseticks-negbin-laplace", gt_df, gt_f, gt_spec("negbin", 1), gt_r, gt_our),
  random_nb("epil-negbin-laplace", epil_df, ep_f, epil_spec("negbin", 1), ep_r, ep_our))
write_fixture(list(versions = versions, cases = random), "sites-random.json")
cat("wrote fixtures to", out_dir, "\n")

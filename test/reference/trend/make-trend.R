# Reference values for trend indices, slopes, period change and smooth trends.
#
# Run from the repository root:   Rscript test/reference/trend/make-trend.R
# Writes test/reference/trend/trend-fixtures.json. Tests read the fixture only.
#
# Sources:
#  - a seeded simulated site x season grid (our own invented scenario; R's
#    set.seed(4711), Mersenne-Twister), negative-binomial counts with site
#    effects and an effort offset; fitted with MASS::glm.nb and stats::glm
#    (poisson), site as a fixed factor, season as a factor (annual indices)
#    and as a number (log-linear slope); lme4::glmer (poisson, random site
#    intercept, nAGQ = 9); splines::ns for a natural-spline trend;
#  - MASS::ships (open dataset shipped with MASS): incidents ~ type +
#    year of construction + offset(log(service)), service > 0, stats::glm
#    poisson and quasipoisson.
# Indices: 100 * exp(g_t - g_base); limits exp of Wald limits of
# g_t - g_base (variance V_tt + V_bb - 2 V_tb from vcov()), times 100.

suppressPackageStartupMessages({ library(MASS); library(lme4); library(splines); library(jsonlite); library(sandwich); library(pscl) })
out_dir <- "test/reference/trend"
z <- qnorm(0.975)
versions <- list(R = R.version.string, MASS = as.character(packageVersion("MASS")),
                 lme4 = as.character(packageVersion("lme4")),
                 sandwich = as.character(packageVersion("sandwich")),
                 pscl = as.character(packageVersion("pscl")))

# Indices of every level of `fac` against `base` from coefficients named prefix+level.
indices_of <- function(b, V, prefix, levels, base) {
  g <- setNames(rep(0, length(levels)), levels)
  nm <- paste0(prefix, levels)
  has <- nm %in% names(b)
  g[has] <- b[nm[has]]
  cvec <- function(l) { v <- setNames(rep(0, length(b)), names(b)); if (paste0(prefix, l) %in% names(b)) v[paste0(prefix, l)] <- 1; v }
  cb <- cvec(base)
  do.call(rbind, lapply(levels, function(l) {
    cc <- cvec(l) - cb
    est <- g[[l]] - g[[base]]
    se <- sqrt(as.numeric(t(cc) %*% V %*% cc))
    data.frame(time = as.numeric(l), index = 100 * exp(est),
               lower = 100 * exp(est - z * se), upper = 100 * exp(est + z * se), logSe = se)
  }))
}
slope_of <- function(fit, name) {
  b <- coef(fit)[[name]]; se <- sqrt(vcov(fit)[name, name])
  list(b = b, se = se, perYear = exp(b) - 1, lower = exp(b - z * se) - 1, upper = exp(b + z * se) - 1)
}
# Change between periods A and B: mean log index of B minus that of A.
period_change <- function(b, V, prefix, levels, A, B) {
  cv <- setNames(rep(0, length(b)), names(b))
  for (l in A) if (paste0(prefix, l) %in% names(b)) cv[paste0(prefix, l)] <- cv[paste0(prefix, l)] - 1 / length(A)
  for (l in B) if (paste0(prefix, l) %in% names(b)) cv[paste0(prefix, l)] <- cv[paste0(prefix, l)] + 1 / length(B)
  est <- sum(cv * b); se <- sqrt(as.numeric(t(cv) %*% V %*% cv))
  list(A = as.numeric(A), B = as.numeric(B), logRatio = est, se = se, ratio = exp(est),
       lower = exp(est - z * se), upper = exp(est + z * se))
}

# ---- simulated grid -------------------------------------------------------
set.seed(4711)
nsite <- 18; seasons <- 2010:2018
d <- expand.grid(site = sprintf("s%02d", 1:nsite), season = seasons, stringsAsFactors = FALSE)
u <- rnorm(nsite, 0, 0.6); names(u) <- sprintf("s%02d", 1:nsite)
d$effort <- round(runif(nrow(d), 2, 6), 1)
mu <- exp(0.8 + u[d$site] + log(0.96) * (d$season - 2010) + 0.25 * sin(d$season - 2010) + log(d$effort))
d$count <- rnbinom(nrow(d), size = 2.2, mu = mu)
# a few site-seasons not surveyed
drop <- c(5, 40, 41, 77, 130)
d <- d[-drop, ]
d$fseason <- factor(d$season); d$fsite <- factor(d$site)
levels_s <- as.character(seasons)

nb_a <- glm.nb(count ~ fsite + fseason + offset(log(effort)), data = d)
nb_l <- glm.nb(count ~ fsite + season + offset(log(effort)), data = d)
po_a <- glm(count ~ fsite + fseason + offset(log(effort)), family = poisson, data = d)
po_l <- glm(count ~ fsite + season + offset(log(effort)), family = poisson, data = d)
re_a <- glmer(count ~ fseason + (1 | fsite) + offset(log(effort)), family = poisson, data = d, nAGQ = 9)
d$sc <- d$season - 2014  # centred for the optimiser; same slope
re_l <- glmer(count ~ sc + (1 | fsite) + offset(log(effort)), family = poisson, data = d, nAGQ = 9)
re_slope <- { b <- fixef(re_l)[["sc"]]; se <- sqrt(as.matrix(vcov(re_l))["sc", "sc"])
  list(b = b, se = se, perYear = exp(b) - 1, lower = exp(b - z * se) - 1, upper = exp(b + z * se) - 1) }

# natural spline trend, df 3: index at each season against 2010, pointwise limits
nb_s <- glm.nb(count ~ fsite + ns(season, df = 3) + offset(log(effort)), data = d)
basis <- ns(d$season, df = 3)
B <- predict(basis, seasons)
bs <- coef(nb_s)[grep("^ns", names(coef(nb_s)))]; Vs <- vcov(nb_s)[names(bs), names(bs)]
smooth <- do.call(rbind, lapply(seq_along(seasons), function(i) {
  cc <- B[i, ] - B[1, ]; est <- sum(cc * bs); se <- sqrt(as.numeric(t(cc) %*% Vs %*% cc))
  data.frame(time = seasons[i], index = 100 * exp(est), lower = 100 * exp(est - z * se), upper = 100 * exp(est + z * se))
}))

# Model-based totals per season (Poisson fit): observed counts where surveyed;
# for a site-season not surveyed, predict() at that site and season with the
# site's mean effort over the seasons it was surveyed.
grid <- expand.grid(site = sprintf("s%02d", 1:nsite), season = seasons, stringsAsFactors = FALSE)
key <- paste(d$site, d$season)
miss <- grid[!(paste(grid$site, grid$season) %in% key), ]
miss$effort <- tapply(d$effort, d$site, mean)[miss$site]
miss$fsite <- factor(miss$site, levels = levels(d$fsite)); miss$fseason <- factor(miss$season, levels = levels(d$fseason))
miss$pred <- predict(po_a, newdata = miss, type = "response")
totals <- data.frame(time = seasons,
  total = sapply(seasons, function(t) sum(d$count[d$season == t]) + sum(miss$pred[miss$season == t])),
  surveyedSites = sapply(seasons, function(t) sum(d$season == t)))

# Two-part models (pscl): zero-inflated NB and hurdle Poisson, intercept-only zero
# part, on `countzi`: the same counts with a quarter of them set to an extra zero
# (drawn after everything above, so the other references are unchanged).
d$countzi <- ifelse(rbinom(nrow(d), 1, 0.25) == 1, 0L, d$count)
zi_a <- zeroinfl(countzi ~ fsite + fseason + offset(log(effort)) | 1, dist = "negbin", data = d)
zi_l <- zeroinfl(countzi ~ fsite + sc + offset(log(effort)) | 1, dist = "negbin", data = d)
hu_a <- hurdle(countzi ~ fsite + fseason + offset(log(effort)) | 1, dist = "poisson", data = d)
hu_l <- hurdle(countzi ~ fsite + sc + offset(log(effort)) | 1, dist = "poisson", data = d)
count_part <- function(fit) { b <- coef(fit, model = "count"); V <- vcov(fit, model = "count"); list(b = b, V = V) }
# (season centred as sc for the optimiser's Hessian; the slope is the same)
slope_part <- function(fit) { cp <- count_part(fit); b <- cp$b[["sc"]]; se <- sqrt(cp$V["sc", "sc"])
  list(b = b, se = se, perYear = exp(b) - 1, lower = exp(b - z * se) - 1, upper = exp(b + z * se) - 1) }
zi_cp <- count_part(zi_a); hu_cp <- count_part(hu_a)

sim <- list(
  source = "simulated grid (set.seed(4711)); MASS::glm.nb, stats::glm, lme4::glmer nAGQ=9, splines::ns",
  data = list(site = d$site, season = d$season, effort = d$effort, count = d$count, countzi = d$countzi),
  negbin = list(theta = nb_a$theta,
                indices = indices_of(coef(nb_a), vcov(nb_a), "fseason", levels_s, "2010"),
                indicesBase2014 = indices_of(coef(nb_a), vcov(nb_a), "fseason", levels_s, "2014"),
                slope = slope_of(nb_l, "season"), thetaLinear = nb_l$theta,
                change = period_change(coef(nb_a), vcov(nb_a), "fseason", levels_s, c("2010", "2011"), c("2016", "2017", "2018")),
                smooth = smooth),
  poisson = list(indices = indices_of(coef(po_a), vcov(po_a), "fseason", levels_s, "2010"),
                 slope = slope_of(po_l, "season"), totals = totals,
                 # site-clustered sandwich (sandwich::vcovCL, HC1 with the G/(G-1) cluster adjustment)
                 robustIndices = indices_of(coef(po_a), vcovCL(po_a, cluster = ~fsite, type = "HC1"), "fseason", levels_s, "2010"),
                 robustSlope = { V <- vcovCL(po_l, cluster = ~fsite, type = "HC1"); b <- coef(po_l)[["season"]]; se <- sqrt(V["season", "season"])
                   list(b = b, se = se, perYear = exp(b) - 1, lower = exp(b - z * se) - 1, upper = exp(b + z * se) - 1) }),
  zinb = list(indices = indices_of(zi_cp$b, zi_cp$V, "fseason", levels_s, "2010"), slope = slope_part(zi_l), theta = zi_a$theta),
  hurdlePoisson = list(indices = indices_of(hu_cp$b, hu_cp$V, "fseason", levels_s, "2010"), slope = slope_part(hu_l)),
  randomPoisson = list(indices = indices_of(fixef(re_a), as.matrix(vcov(re_a)), "fseason", levels_s, "2010"),
                       slope = re_slope, sd = attr(VarCorr(re_a)$fsite, "stddev")[[1]])
)

# ---- MASS::ships ----------------------------------------------------------
s <- subset(ships, service > 0)
s$fyear <- factor(s$year); s$ftype <- factor(s$type)
sp_a <- glm(incidents ~ ftype + fyear + offset(log(service)), family = poisson, data = s)
sp_l <- glm(incidents ~ ftype + year + offset(log(service)), family = poisson, data = s)
sq_a <- glm(incidents ~ ftype + fyear + offset(log(service)), family = quasipoisson, data = s)
sq_l <- glm(incidents ~ ftype + year + offset(log(service)), family = quasipoisson, data = s)
ylev <- levels(s$fyear)
ships_ref <- list(
  source = "MASS::ships (service > 0); stats::glm poisson and quasipoisson, type + year of construction + offset(log(service))",
  data = list(type = as.character(s$type), year = s$year, period = s$period, service = s$service, incidents = s$incidents),
  poisson = list(indices = indices_of(coef(sp_a), vcov(sp_a), "fyear", ylev, "60"), slope = slope_of(sp_l, "year")),
  quasipoisson = list(indices = indices_of(coef(sq_a), vcov(sq_a), "fyear", ylev, "60"), slope = slope_of(sq_l, "year"),
                      dispersion = summary(sq_a)$dispersion)
)

fixture <- list(
  versions = versions,
  tolerance = list(index = 1e-4, limit = 1e-4, slope = 1e-5, theta = 1e-3,
                   randomIndex = 2e-3, randomLimit = 5e-3, randomSlope = 1e-3,
                   twoPartIndex = 1e-3, twoPartLimit = 3e-3, twoPartSlope = 2e-4),
  toleranceNote = "two-part: pscl fits by optim (BFGS, reltol 1e-8) with a numerical Hessian, hence looser; relative |a - b| / max(1, |b|) for indices and limits (index scale 100: so relative to the value); slope absolute on perYear",
  simulated = sim, ships = ships_ref
)
writeLines(toJSON(fixture, auto_unbox = TRUE, digits = NA, pretty = TRUE, dataframe = "rows"), file.path(out_dir, "trend-fixtures.json"))
cat("wrote", file.path(out_dir, "trend-fixtures.json"), "\n")

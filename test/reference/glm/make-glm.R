# Reference fits for the GLM / negative binomial engine.
#
# Run from the repository root:  Rscript test/reference/glm/make-glm.R
# Writes test/reference/glm/glm-fixtures.json. Each fixture carries its data
# (as cell texts), the Tallywise model spec that describes the same model,
# the R call, and the quantities R reports. Factor levels are put in the
# order Tallywise sorts them (numeric order when every level is a number,
# else by code point) so that both use the same reference level.
suppressPackageStartupMessages({
  library(MASS)
  library(splines)
  library(sandwich)
  library(jsonlite)
})

sort_levels <- function(v) {
  u <- unique(as.character(v))
  num <- suppressWarnings(as.numeric(u))
  if (all(!is.na(num))) u[order(num)] else sort(u, method = "radix")
}

# Data frame in the model's terms: factors with Tallywise's level order.
prepare <- function(d, spec) {
  for (t in spec$predictors) {
    cols <- if (t$type == "interaction") t$columns else t$column
    if (t$type == "factor") {
      d[[t$column]] <- factor(as.character(d[[t$column]]), levels = sort_levels(d[[t$column]]))
      if (!is.null(t$reference)) d[[t$column]] <- relevel(d[[t$column]], ref = t$reference)
    }
  }
  if (!is.null(spec$site) && spec$site$effect == "fixed") {
    d[[spec$site$column]] <- factor(as.character(d[[spec$site$column]]), levels = sort_levels(d[[spec$site$column]]))
  }
  d
}

term_r <- function(t) switch(t$type,
  numeric = t$column, factor = t$column,
  interaction = paste(t$columns, collapse = ":"),
  spline = sprintf("ns(%s, df = %d)", t$column, t$df))

spec_formula <- function(spec) {
  rhs <- vapply(spec$predictors, term_r, "")
  # Fixed site effects: one per site and no intercept (the site comes first so that it gets every level).
  if (!is.null(spec$site) && spec$site$effect == "fixed") rhs <- c(spec$site$column, rhs)
  for (o in spec$offsets) rhs <- c(rhs, if (isTRUE(o$log)) sprintf("offset(log(%s))", o$column) else sprintf("offset(%s)", o$column))
  f <- paste(spec$response, "~", paste(rhs, collapse = " + "))
  if (!is.null(spec$site) && spec$site$effect == "fixed") f <- paste(f, "- 1")
  as.formula(f)
}

# Tallywise's column names for R's model-matrix columns (same order).
our_names <- function(fit, spec, d) {
  mm <- model.matrix(fit)
  asg <- attr(mm, "assign")
  out <- character(ncol(mm))
  part <- function(col) if (is.factor(d[[col]])) paste0(col, "=", levels(d[[col]])[-1]) else col
  fixed_site <- !is.null(spec$site) && spec$site$effect == "fixed"
  for (k in unique(asg)) {
    idx <- which(asg == k)
    if (k == 0) { out[idx] <- "intercept"; next }
    if (fixed_site && k == 1) { # site dummies (no intercept): every level
      col <- spec$site$column
      out[idx] <- paste0(col, "=", levels(d[[col]]))
      next
    }
    t <- spec$predictors[[k - fixed_site]]
    out[idx] <- switch(t$type,
      numeric = t$column,
      factor = paste0(t$column, "=", levels(d[[t$column]])[-1]),
      spline = paste0(t$column, "[ns", seq_len(t$df), "]"),
      interaction = {
        g <- expand.grid(a = part(t$columns[1]), b = part(t$columns[2]), stringsAsFactors = FALSE)
        paste(g$a, g$b, sep = " & ")
      })
  }
  out
}

as_texts <- function(d, cols) {
  out <- list()
  for (c in cols) out[[c]] <- as.character(d[[c]])
  out
}

fixtures <- list()

# r_subset: rows R fits (default all); the fixture keeps every row of raw.
add_fit <- function(name, source, raw, spec, family, cluster = NULL, extra = list(), r_subset = NULL) {
  d <- prepare(raw, spec)
  if (!is.null(r_subset)) d <- droplevels(d[r_subset, ])
  f <- spec_formula(spec)
  fit <- switch(family,
    poisson = glm(f, family = poisson, data = d, control = glm.control(epsilon = 1e-12, maxit = 100)),
    quasipoisson = glm(f, family = quasipoisson, data = d, control = glm.control(epsilon = 1e-12, maxit = 100)),
    negbin = glm.nb(f, data = d, control = glm.control(epsilon = 1e-12, maxit = 100)))
  s <- summary(fit)
  cf <- s$coefficients
  nm <- our_names(fit, spec, d)
  pear <- sum(residuals(fit, type = "pearson")^2)
  ll <- if (family == "quasipoisson") NULL else as.numeric(logLik(fit))
  exp <- list(
    coefficients = lapply(seq_len(nrow(cf)), function(i) list(term = nm[i], estimate = unname(cf[i, 1]), se = unname(cf[i, 2]), z = unname(cf[i, 3]), p = unname(cf[i, 4]))),
    nobs = nobs(fit), dfResidual = fit$df.residual,
    deviance = deviance(fit), nullDeviance = fit$null.deviance, pearsonChi2 = pear,
    logLik = ll,
    aic = if (is.null(ll)) NULL else AIC(fit), bic = if (is.null(ll)) NULL else BIC(fit),
    df = if (is.null(ll)) NULL else attr(logLik(fit), "df"),
    dispersion = if (family == "quasipoisson") s$dispersion else NULL,
    theta = if (family == "negbin") fit$theta else NULL,
    thetaSe = if (family == "negbin") fit$SE.theta else NULL
  )
  if (!is.null(cluster)) {
    v <- vcovCL(fit, cluster = d[[cluster]], type = "HC1", cadjust = TRUE)
    exp$robust <- list(cluster = cluster, type = "HC1 with G/(G-1)", se = lapply(seq_len(nrow(cf)), function(i) list(term = nm[i], se = sqrt(v[i, i]))))
  }
  cols <- unique(c(spec$response, all.vars(f), cluster))
  fixtures[[name]] <<- c(list(
    name = name, source = source,
    call = paste0(switch(family, poisson = "stats::glm(family = poisson): ", quasipoisson = "stats::glm(family = quasipoisson): ", negbin = "MASS::glm.nb: "), paste(deparse(f), collapse = " ")),
    data = as_texts(raw, intersect(names(raw), cols)),
    spec = spec, expected = exp), extra)
  invisible(fit)
}

tf <- function(col, ref = NULL) { t <- list(column = col, type = "factor"); if (!is.null(ref)) t$reference <- ref; t }
tn <- function(col) list(column = col, type = "numeric")

# 1. ships (MASS): Poisson with log(service) offset, rows with service > 0.
ships <- MASS::ships[MASS::ships$service > 0, ]
spec_ships <- list(response = "incidents", distribution = "poisson",
  predictors = list(tf("type"), tf("year"), tf("period")),
  offsets = list(list(column = "service", log = TRUE)))
add_fit("ships-poisson", "MASS::ships (rows with service > 0), stats::glm poisson", ships, spec_ships, "poisson")
spec_ships_q <- spec_ships; spec_ships_q$distribution <- "quasipoisson"
add_fit("ships-quasipoisson", "MASS::ships (rows with service > 0), stats::glm quasipoisson", ships, spec_ships_q, "quasipoisson")

# 2. Insurance (MASS): Poisson with log(Holders) offset; Group and Age as unordered factors.
ins <- MASS::Insurance
ins$Group <- as.character(ins$Group); ins$Age <- as.character(ins$Age); ins$District <- as.character(ins$District)
spec_ins <- list(response = "Claims", distribution = "poisson",
  predictors = list(tf("District"), tf("Group"), tf("Age")),
  offsets = list(list(column = "Holders", log = TRUE)))
add_fit("insurance-poisson", "MASS::Insurance, stats::glm poisson with offset log(Holders)", ins, spec_ins, "poisson")

# 3. quine (MASS): negative binomial, and the nested and Poisson fits for LR tests.
quine <- MASS::quine
spec_quine <- list(response = "Days", distribution = "negbin", predictors = list(tf("Eth"), tf("Sex"), tf("Age"), tf("Lrn")))
fq <- add_fit("quine-negbin", "MASS::quine, MASS::glm.nb", quine, spec_quine, "negbin")
spec_quine0 <- list(response = "Days", distribution = "negbin", predictors = list(tf("Eth"), tf("Sex"), tf("Age")))
fq0 <- add_fit("quine-negbin-small", "MASS::quine, MASS::glm.nb without Lrn", quine, spec_quine0, "negbin")
spec_quineP <- spec_quine; spec_quineP$distribution <- "poisson"
fqp <- add_fit("quine-poisson", "MASS::quine, stats::glm poisson", quine, spec_quineP, "poisson")
a <- anova(fq0, fq)
lr_nested <- list(source = "MASS::anova.negbin (quine, Days ~ Eth+Sex+Age vs + Lrn)",
  statistic = unname(a[["LR stat."]][2]), df = unname(a[["   df"]][2]), p = unname(a[["Pr(Chi)"]][2]))
stat_np <- 2 * (as.numeric(logLik(fq)) - as.numeric(logLik(fqp)))
lr_nb <- list(source = "quine: 2 (logLik glm.nb - logLik glm poisson), p = pchisq(stat, 1, lower = FALSE) / 2 (Self & Liang 1987)",
  statistic = stat_np, p = pchisq(stat_np, 1, lower.tail = FALSE) / 2)

# 4. epil (MASS): Poisson with a spline and a factor x numeric interaction.
epil <- MASS::epil
epil$trt <- as.character(epil$trt)
spec_epil <- list(response = "y", distribution = "poisson",
  predictors = list(tf("trt"), list(column = "age", type = "spline", df = 3L), tn("lbase"), list(columns = c("trt", "lbase"), type = "interaction")))
add_fit("epil-poisson-spline", "MASS::epil, stats::glm poisson with splines::ns(age, df = 3) and trt:lbase; sandwich::vcovCL by subject", epil, spec_epil, "poisson", cluster = "subject")
# Negative binomial with an offset: seizures in the period relative to the baseline count.
spec_epil_nb <- list(response = "y", distribution = "negbin", predictors = list(tf("trt"), tn("lage"), tn("V4")),
  offsets = list(list(column = "base", log = TRUE)))
add_fit("epil-negbin-offset", "MASS::epil, MASS::glm.nb with offset log(base); sandwich::vcovCL by subject (theta held fixed)", epil, spec_epil_nb, "negbin", cluster = "subject")
# Fixed subject effects with a period factor, robust by subject (site).
spec_epil_fe <- list(response = "y", distribution = "poisson", predictors = list(tf("period")),
  site = list(column = "subject", effect = "fixed", quadraturePoints = 9L), robust = "site")
# Subjects whose counts are all zero are left out of R's fit: their effect is -Inf, and
# leaving them out is what the Tallywise engine does (with an all-zero-site warning),
# so R's fit without them is the limit the engine must reproduce from all rows.
zero_subj <- names(which(tapply(epil$y, epil$subject, sum) == 0))
add_fit("epil-poisson-site-fixed", paste0("MASS::epil, stats::glm poisson y ~ subject + period - 1 without the all-zero subject(s) ", paste(zero_subj, collapse = ", "), "; sandwich::vcovCL by subject, HC1"),
  epil, spec_epil_fe, "poisson", cluster = "subject", r_subset = !(as.character(epil$subject) %in% zero_subj), extra = list(allZeroSites = I(zero_subj)))

# 5. Insurance with a negative binomial: no overdispersion (theta runs off).
spec_ins_nb <- spec_ins; spec_ins_nb$distribution <- "negbin"
ins_nb <- withCallingHandlers(tryCatch(glm.nb(Claims ~ District + Group + Age + offset(log(Holders)), data = prepare(ins, spec_ins)), error = function(e) NULL),
  warning = function(w) invokeRestart("muffleWarning"))
quiet_nb <- function(f, d) withCallingHandlers(tryCatch(glm.nb(f, data = d), error = function(e) NULL),
  warning = function(w) invokeRestart("muffleWarning"))
ships_nb <- quiet_nb(incidents ~ type + year + period + offset(log(service)), prepare(ships, spec_ships))
boundary <- list(source = "MASS::Insurance, MASS::glm.nb: the Poisson deviance is below its df, theta runs off",
  spec = spec_ins_nb, rTheta = if (is.null(ins_nb)) NULL else ins_nb$theta,
  ships = list(source = "MASS::ships (service > 0), MASS::glm.nb with offset: theta runs off (iteration limit reached)",
    rTheta = ships_nb$theta, rLogLik = as.numeric(logLik(ships_nb))))

# 6. Natural spline basis values (splines::ns).
x_ns <- c(epil$age[seq(1, 236, by = 4)], 15, 45)
knots_fit <- x_ns[1:59]
b4 <- ns(knots_fit, df = 4)
ns_fix <- list(source = "splines::ns(x, df = 4) on MASS::epil ages (one per subject), evaluated by predict() also at 15 and 45 (outside the range)",
  x = knots_fit, xNew = x_ns, knots = unname(attr(b4, "knots")), boundary = attr(b4, "Boundary.knots"),
  basis = unname(predict(b4, x_ns)))
b1 <- ns(knots_fit, df = 1)
ns_fix$basisDf1 <- unname(as.vector(b1))

out <- list(
  generated = format(Sys.time(), "%Y-%m-%d", tz = "UTC"),
  R = R.version.string,
  packages = list(MASS = as.character(packageVersion("MASS")), splines = as.character(packageVersion("splines")),
    sandwich = as.character(packageVersion("sandwich")), jsonlite = as.character(packageVersion("jsonlite"))),
  note = "glm and glm.nb run with epsilon = 1e-12 so that the reference values are converged well past the test tolerances.",
  fixtures = fixtures, lrNested = lr_nested, lrNegbinPoisson = lr_nb, boundary = boundary, ns = ns_fix)
writeLines(toJSON(out, auto_unbox = TRUE, digits = NA, null = "null", pretty = TRUE), "test/reference/glm/glm-fixtures.json")
cat("wrote test/reference/glm/glm-fixtures.json\n")

# Reference values for fitting one spec per group (`fit --by`):
# datasets::warpbreaks split by tension (L, M, H), breaks ~ wool in each
# group, with stats::glm (poisson) and MASS::glm.nb (negative binomial).
# Run from the repository root:
#   Rscript test/reference/batch/make-warpbreaks-by-tension.R
suppressPackageStartupMessages({ library(MASS); library(jsonlite) })

d <- datasets::warpbreaks
ctl <- glm.control(epsilon = 1e-12, maxit = 100)

rows <- function(fit) {
  s <- summary(fit)$coefficients
  terms <- sub("^\\(Intercept\\)$", "intercept", rownames(s))
  terms <- sub("^woolB$", "wool=B", terms)
  lapply(seq_len(nrow(s)), function(i) list(term = terms[i], estimate = s[i, 1], se = s[i, 2]))
}

groups <- list()
for (g in levels(d$tension)) {
  sub <- d[d$tension == g, ]
  p <- glm(breaks ~ wool, family = poisson, data = sub, control = ctl)
  nb <- glm.nb(breaks ~ wool, data = sub, control = ctl)
  groups[[g]] <- list(
    poisson = list(coefficients = rows(p), logLikelihood = as.numeric(logLik(p)), aic = AIC(p),
                   deviance = deviance(p), nobs = nrow(sub)),
    negbin = list(coefficients = rows(nb), logLikelihood = as.numeric(logLik(nb)), aic = AIC(nb),
                  theta = nb$theta, nobs = nrow(sub))
  )
}

out <- list(
  generated = format(Sys.Date()),
  R = R.version.string,
  packages = list(MASS = as.character(packageVersion("MASS")), jsonlite = as.character(packageVersion("jsonlite"))),
  source = "datasets::warpbreaks (R), split by tension; stats::glm(family = poisson) and MASS::glm.nb, breaks ~ wool in each group",
  toleranceNote = "each tolerance is on |ours - reference| / max(1, |reference|)",
  tolerance = list(estimate = 1e-6, se = 1e-5, logLikelihood = 1e-6, aic = 1e-6, theta = 1e-4),
  data = list(
    breaks = as.character(d$breaks),
    wool = as.character(d$wool),
    tension = as.character(d$tension)
  ),
  groups = groups
)
writeLines(toJSON(out, auto_unbox = TRUE, digits = NA, pretty = TRUE), "test/reference/batch/warpbreaks-by-tension.json")

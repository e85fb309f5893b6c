# Far upper-tail probabilities P(Y >= y) for the outlier flags
# (src-shared/diagnostics/tail-probability.ts, outlier-flags.ts), where
# 1 - F(y - 1) in double precision has no digits left.
#
# Run from the repository root:   Rscript test/reference/diagnostics/make-far-tails.R
# Base R only (stats::ppois, stats::pnbinom with lower.tail = FALSE).
# Writes far-tails.json beside this script. The (y, mu, theta, pi) values
# are chosen to span near and far tails; they are not data.

out <- file.path(dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE))), "far-tails.json")

poisson <- data.frame(y = c(10, 30, 63, 82, 150, 241), mu = c(3, 2, 22, 34.9, 5, 114))
poisson$upper <- ppois(poisson$y - 1, poisson$mu, lower.tail = FALSE)

negbin <- data.frame(y = c(8, 60, 124, 241, 300), mu = c(2, 5, 20, 114, 10), theta = c(1.5, 1.2, 2.5, 3.5, 8))
negbin$upper <- pnbinom(negbin$y - 1, size = negbin$theta, mu = negbin$mu, lower.tail = FALSE)

# Zero-inflated Poisson, extra-zero probability pi: for y >= 1, P(Y >= y) = (1 - pi) P_pois(Y >= y).
zip <- data.frame(y = c(5, 40, 90), mu = c(1.5, 8, 12), pi = c(0.3, 0.3, 0.6))
zip$upper <- (1 - zip$pi) * ppois(zip$y - 1, zip$mu, lower.tail = FALSE)

num <- function(x) trimws(formatC(x, digits = 17, format = "g"))
rows <- function(d) paste0("[", paste(apply(d, 1, function(r) paste0("{", paste0('"', names(d), '": ', num(as.numeric(r)), collapse = ", "), "}")), collapse = ",\n    "), "]")
json <- paste0(
  "{\n  \"R\": \"", R.version.string, "\",\n",
  "  \"source\": \"stats::ppois / stats::pnbinom, lower.tail = FALSE (make-far-tails.R)\",\n",
  "  \"poisson\": ", rows(poisson), ",\n",
  "  \"negbin\": ", rows(negbin), ",\n",
  "  \"zip\": ", rows(zip), "\n}\n"
)
writeLines(json, out)

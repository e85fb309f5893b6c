# Times R's fit of the same model on the same CSV as bench/fit/run.ts.
# Usage: Rscript bench/fit/fit-times.R FILE.csv REPEATS
# Prints one line of JSON: {"poisson": {"wall", "cpu"}, "negbin": {...}} in seconds (median of
# REPEATS runs after one warm-up run, timing only glm() / MASS::glm.nb(), not reading the file).
suppressPackageStartupMessages(library(MASS))
args <- commandArgs(trailingOnly = TRUE)
d <- read.csv(args[1], colClasses = c(f1 = "character", f2 = "character"))
d$f1 <- factor(d$f1); d$f2 <- factor(d$f2)
reps <- as.integer(args[2])
f <- count ~ x1 + x2 + x3 + x4 + x5 + x6 + x7 + x8 + f1 + f2 + offset(log(effort))
time_of <- function(expr) {
  eval(expr) # warm-up, as on our side
  t <- replicate(reps, { s <- system.time(eval(expr)); c(s[["elapsed"]], s[["user.self"]] + s[["sys.self"]]) })
  sprintf('{"wall": %.4f, "cpu": %.4f}', median(t[1, ]), median(t[2, ]))
}
tp <- time_of(quote(glm(f, family = poisson, data = d)))
tn <- time_of(quote(glm.nb(f, data = d)))
cat(sprintf('{"poisson": %s, "negbin": %s, "R": "%s"}\n', tp, tn, R.version.string))

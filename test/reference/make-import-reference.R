# Reference values for the import tests (test/import/*). Run from the
# repository root:  Rscript test/reference/make-import-reference.R
# Writes test/reference/import-reference.json. Needs R with MASS.
suppressMessages(library(MASS))

json_num <- function(x) paste0("[", paste(format(x, digits = 17, scientific = FALSE, trim = TRUE), collapse = ","), "]")
json_str <- function(x) paste0("[", paste0('"', x, '"', collapse = ","), "]")

# 1. Levenshtein distances: utils::adist (generalized Levenshtein, unit costs).
pairs <- list(c("kitten", "sitting"), c("millrace pool", "milrace pool"), c("lapwing hollow pond", "lapwing holow pond"),
              c("pond 12", "pond 13"), c("common toad", "comon toad"), c("flaw", "lawn"), c("", "abc"), c("étang", "etang"))
lev <- sapply(pairs, function(p) adist(p[1], p[2])[1, 1])

# 2. Spreadsheet serial dates (ECMA-376): as.Date(serial, origin = "1899-12-30") (1900 system, serials from 61)
#    and origin "1904-01-01" (1904 system), as documented in ?as.Date.
s1900 <- c(61, 100, 25569, 36526, 43588, 43619, 44197, 45292, 2958465)
s1904 <- c(0, 1, 1462, 42126, 43000)
d1900 <- format(as.Date(s1900, origin = "1899-12-30"))
d1904 <- format(as.Date(s1904, origin = "1904-01-01"))

# 3. Aggregation: MASS::Insurance (claims and policy holders by District, Group, Age).
#    Analysis unit District x Group over the four Age classes; count = Claims, effort = Holders.
ins <- Insurance
key <- interaction(ins$District, ins$Group, drop = TRUE, lex.order = TRUE)
sum_claims <- tapply(ins$Claims, key, sum)
sum_holders <- tapply(ins$Holders, key, sum)
max_claims <- tapply(ins$Claims, key, max)
max_holders <- sapply(split(ins, key), function(d) d$Holders[which.max(d$Claims)])
mean_claims <- tapply(ins$Claims, key, mean)
mean_holders <- tapply(ins$Holders, key, mean)

out <- paste0('{\n',
  '"source": "R ', R.version$major, '.', R.version$minor, '; utils::adist; base::as.Date; MASS ', packageVersion("MASS"), ' Insurance with base::tapply",\n',
  '"levenshtein": {"a": ', json_str(sapply(pairs, `[`, 1)), ', "b": ', json_str(sapply(pairs, `[`, 2)), ', "distance": ', json_num(lev), ', "tolerance": 0},\n',
  '"serial1900": {"serial": ', json_num(s1900), ', "date": ', json_str(d1900), '},\n',
  '"serial1904": {"serial": ', json_num(s1904), ', "date": ', json_str(d1904), '},\n',
  '"insurance": {\n',
  '  "rows": {"District": ', json_str(as.character(ins$District)), ', "Group": ', json_str(as.character(ins$Group)), ', "Age": ', json_str(as.character(ins$Age)),
  ', "Claims": ', json_num(ins$Claims), ', "Holders": ', json_num(ins$Holders), '},\n',
  '  "groups": ', json_str(levels(key)), ',\n',
  '  "sum": {"count": ', json_num(sum_claims), ', "effort": ', json_num(sum_holders), '},\n',
  '  "max": {"count": ', json_num(max_claims), ', "effort": ', json_num(max_holders), '},\n',
  '  "mean": {"count": ', json_num(mean_claims), ', "effort": ', json_num(mean_holders), '},\n',
  '  "tolerance": 1e-12\n',
  '}\n}\n')
writeLines(out, "test/reference/import-reference.json", useBytes = TRUE)

# Reference standard errors of logistic-regression coefficients (src/core/logisticStandardErrors.ts).
# R base only (stats + datasets). Run from the repository root:
#   Rscript test/reference/generators/logistic_standard_errors.R
# Writes test/reference/logistic_standard_errors.json: summary(glm(..., family = binomial))$coefficients
# standard errors (dispersion 1) for the two weighting fixtures.
Sys.setlocale("LC_COLLATE", "C")
num <- function(x) sprintf("%.17g", x)
arr <- function(x) paste0("[", paste(vapply(x, num, ""), collapse = ", "), "]")

# 1. mtcars (R datasets): am ~ hp + wt.
fit1 <- glm(am ~ hp + wt, family = binomial, data = mtcars)
se1 <- unname(summary(fit1)$coefficients[, "Std. Error"])

# 2. The fictional fixture (test/reference/weighting_fictional.csv; invented data), complete cases,
#    site as a factor (reference level "east" in C-locale order).
d <- read.csv("test/reference/weighting_fictional.csv", na.strings = "")
d <- d[complete.cases(d), ]
d$site <- factor(d$site)
fit2 <- glm(treated ~ age + site + smoker, family = binomial, data = d)
se2 <- unname(summary(fit2)$coefficients[, "Std. Error"])

writeLines(paste0("{\n",
  '"generator": "test/reference/generators/logistic_standard_errors.R", "r_version": "', R.version.string, '",\n',
  '"mtcars": {"coefficients": ', arr(unname(coef(fit1))), ', "standard_errors": ', arr(se1), "},\n",
  '"fictional": {"columns": ["(Intercept)", "age", "site=north", "site=west", "smoker"], "coefficients": ', arr(unname(coef(fit2))),
  ', "standard_errors": ', arr(se2), "}\n}"), "test/reference/logistic_standard_errors.json")

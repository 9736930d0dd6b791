# E-values for standardized mean differences with the interval exp(0.91*d -/+ 0.91*z*SE) at any level.
# R base only (Debian r-base-core). Run from test/reference/: Rscript generators/smd_evalues.R
# Conversion: VanderWeele & Ding 2017, Ann Intern Med 167:268-274, Table 2 (RR ~ exp(0.91 d); the printed 95%
# multiplier 1.78 is 0.91 x 1.96 rounded; here 0.91 * qnorm(1 - (1 - level)/2) at every level).
evalue <- function(rr) { r <- ifelse(rr < 1, 1 / rr, rr); r + sqrt(r * (r - 1)) }
cases <- expand.grid(d = c(0.5, 0.2, 0, -0.4), se = c(0.1, 0.15), level = c(0.9, 0.95, 0.9500001, 0.99))
num <- function(x) sprintf("%.17g", x)
rows <- character(0)
for (i in seq_len(nrow(cases))) {
  d <- cases$d[i]; se <- cases$se[i]; level <- cases$level[i]
  z <- qnorm(1 - (1 - level) / 2)
  m <- 0.91 * z
  est <- exp(0.91 * d); lo <- exp(0.91 * d - m * se); hi <- exp(0.91 * d + m * se)
  e_ci <- if (lo <= 1 && hi >= 1) 1 else if (est > 1) evalue(lo) else evalue(hi)
  rows <- c(rows, sprintf('    {"d": %s, "se": %s, "level": %s, "multiplier": %s, "rr_estimate": %s, "rr_lower": %s, "rr_upper": %s, "evalue_point": %s, "evalue_ci": %s}',
    num(d), num(se), num(level), num(m), num(est), num(lo), num(hi), num(evalue(est)), num(e_ci)))
}
out <- c("{",
  sprintf('  "generated_by": "test/reference/generators/smd_evalues.R, %s, base only",', R.version.string),
  '  "description": "SMD E-values: RR = exp(0.91 d), interval exp(0.91 d -/+ 0.91 qnorm(1 - (1 - level)/2) SE); E = r + sqrt(r (r - 1)); interval E-value from the limit nearer 1, 1 when the interval contains 1",',
  '  "cases": [', paste(rows, collapse = ",\n"), "  ]", "}")
writeLines(out, "smd_evalues.json")

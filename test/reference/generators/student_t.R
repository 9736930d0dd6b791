# Student's t upper tail P(T > t) and upper quantiles, R base only (Debian r-base-core).
# Run from test/reference/: Rscript generators/student_t.R
# Tails: pt(t, df, lower.tail = FALSE); as a check, the same tail as
# pbeta(t^2/(df + t^2), 1/2, df/2, lower.tail = FALSE)/2 (Abramowitz & Stegun 26.7.1; R's pbeta is TOMS 708,
# Didonato & Morris 1992) must agree. Quantiles: qt(tail, df, lower.tail = FALSE), which R polishes by Newton
# steps on pt to a relative 1e-14.
num <- function(x) sprintf("%.17g", x)
tail_beta <- function(t, df) pbeta(t^2 / (df + t^2), 0.5, df / 2, lower.tail = FALSE) / 2
dfs <- c(1, 2, 3, 5, 10, 30, 100, 1000, 3000, 1e4, 3e4, 1e5, 2e5, 3e5, 4e5, 5e5, 9e5, 999999, 1e6, 1000001, 2e6, 1e7, 1e9)
ts <- c(0.1, 1, 1.96, 2.5, 4, 8, 15)
rows <- character(0)
for (df in dfs) for (t in ts) {
  p <- pt(t, df, lower.tail = FALSE)
  check <- tail_beta(t, df)
  stopifnot(abs(check - p) <= 1e-13 * p)
  rows <- c(rows, sprintf('    {"t": %s, "df": %s, "upper": %s}', num(t), num(df), num(p)))
}
qrows <- character(0)
for (df in dfs) for (tail in c(0.025, 0.005, 1e-4, 1e-8)) {
  qrows <- c(qrows, sprintf('    {"tail": %s, "df": %s, "quantile": %s}', num(tail), num(df), num(qt(tail, df, lower.tail = FALSE))))
}
out <- c("{",
  sprintf('  "generated_by": "test/reference/generators/student_t.R, %s, base only",', R.version.string),
  '  "description": "Student t upper tails pt(t, df, lower.tail = FALSE) (checked against pbeta(t^2/(df+t^2), 1/2, df/2, lower.tail = FALSE)/2 to 1e-13) and upper quantiles qt(tail, df, lower.tail = FALSE)",',
  '  "tails": [', paste(rows, collapse = ",\n"), "  ],",
  '  "quantiles": [', paste(qrows, collapse = ",\n"), "  ]", "}")
writeLines(out, "student_t.json")

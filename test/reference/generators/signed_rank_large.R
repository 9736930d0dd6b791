# Exact null distribution of Wilcoxon's signed-rank statistic (ranks 1..n, no ties) for many pairs, from R base's
# psignrank/qsignrank (Debian r-base-core), as an outside reference for Lurk's inversion of the bounding
# distribution at Gamma = 1 (p = 1/2). R's counts are doubles, so n stays at or below 1,000 here.
# Thresholds t = round(mean + z * sd) for several z; upper tails P(V >= t) = psignrank(t - 1, n, lower.tail = FALSE).
# Critical values: the smallest c with P(V >= c) <= level is qsignrank(1 - level, n) + 1 when the tail at that
# quantile is <= level (checked below against psignrank).
# Run from test/reference/: Rscript generators/signed_rank_large.R > signed_rank_large.json
num <- function(x) sprintf("%.17g", x)
rows <- character(0)
for (n in c(300, 600, 1000)) {
  mean <- n * (n + 1) / 4
  sd <- sqrt(n * (n + 1) * (2 * n + 1) / 24)
  for (z in c(-1, 0, 0.5, 1.5, 2.5, 4, 6, 9)) {
    t <- round(mean + z * sd)
    rows <- c(rows, sprintf('    {"pairs": %d, "t": %d, "upperTail": %s}', n, t, num(psignrank(t - 1, n, lower.tail = FALSE))))
  }
}
crit <- character(0)
for (n in c(300, 600, 1000)) {
  for (level in c(0.025, 0.005, 0.0005)) {
    c0 <- qsignrank(1 - level, n) + 1
    # smallest c with upper tail <= level
    while (psignrank(c0 - 2, n, lower.tail = FALSE) <= level) c0 <- c0 - 1
    while (psignrank(c0 - 1, n, lower.tail = FALSE) > level) c0 <- c0 + 1
    crit <- c(crit, sprintf('    {"pairs": %d, "level": %s, "critical": %d}', n, num(level), c0))
  }
}
cat('{\n  "source": "R base psignrank/qsignrank (Debian r-base-core), generators/signed_rank_large.R",\n')
cat('  "upperTails": [\n', paste(rows, collapse = ",\n"), '\n  ],\n', sep = "")
cat('  "criticalValues": [\n', paste(crit, collapse = ",\n"), '\n  ]\n}\n', sep = "")

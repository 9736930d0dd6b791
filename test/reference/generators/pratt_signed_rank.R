# Signed-rank statistic with zero differences under Wilcoxon's rule (zeros dropped) and Pratt's rule (all |d|
# ranked together with mid-ranks, zeros score 0), and its exact distribution by full enumeration of the sign
# patterns of the non-zero pairs: at Gamma = 1 (the null) and, for the bounds under hidden bias, with each
# non-zero pair positive with probability p = Gamma/(1 + Gamma) (upper bound) or 1/(1 + Gamma) (lower bound).
# R base only (Debian r-base-core). Run from test/reference/: Rscript generators/pratt_signed_rank.R
# References: Wilcoxon F (1945) Biometrics Bulletin 1(6):80-83; Pratt JW (1959) JASA 54(287):655-667;
# Rosenbaum PR (2002) Observational Studies, 2nd ed., Section 4.3.3 (bounding distributions).
datasets <- list(
  zeros_and_ties = c(1.5, -0.5, 0, 2, 0, 3.5, -1, 2, 0.5, 4, 0, -2.5, 1, 3),
  many_zeros = c(0, 0, 0, 0, 1, 2, 3, -1, 5, 6, -4, 7, 8, 0, 2.5, 9, -0.5, 0, 11, 12),
  no_zeros = c(0.8, -0.3, 1.9, 2.4, -1.1, 0.6, 3.3, 1.2, -0.7, 2.8)
)
gammas <- c(1, 1.5, 2, 3)
num <- function(x) sprintf("%.17g", x)
vec <- function(x) paste0("[", paste(num(x), collapse = ", "), "]")
# P(sum(w * B) >= t) over all 2^m patterns, B_i ~ Bernoulli(p) independent.
tail_enum <- function(w, t, p) {
  m <- length(w)
  patterns <- as.matrix(expand.grid(rep(list(0:1), m)))
  s <- drop(patterns %*% w)
  k <- rowSums(patterns)
  prob <- p^k * (1 - p)^(m - k)
  sum(prob[s >= t - 1e-9])
}
blocks <- character(0)
for (name in names(datasets)) {
  d <- datasets[[name]]
  nz <- d != 0
  rules <- list(
    wilcoxon = rank(abs(d[nz])),
    pratt = rank(abs(d))[nz]
  )
  parts <- character(0)
  for (rule in names(rules)) {
    w <- rules[[rule]]
    dn <- d[nz]
    t_greater <- sum(w[dn > 0])
    t_less <- sum(w[dn < 0])
    rows <- character(0)
    for (g in gammas) {
      pp <- g / (1 + g); pm <- 1 / (1 + g)
      rows <- c(rows, sprintf('{"gamma": %s, "greater_upper": %s, "greater_lower": %s, "less_upper": %s, "less_lower": %s}',
        num(g), num(tail_enum(w, t_greater, pp)), num(tail_enum(w, t_greater, pm)),
        num(tail_enum(w, t_less, pp)), num(tail_enum(w, t_less, pm))))
    }
    parts <- c(parts, sprintf('"%s": {"ranks_of_nonzero": %s, "statistic_greater": %s, "statistic_less": %s, "sum_ranks": %s, "by_gamma": [%s]}',
      rule, vec(w), num(t_greater), num(t_less), num(sum(w)), paste(rows, collapse = ", ")))
  }
  check <- ""
  if (!any(d == 0) && !any(duplicated(abs(d)))) {
    # Without zeros or ties both rules are Wilcoxon's; R's psignrank gives the exact null tail.
    n <- length(d); tg <- sum(rank(abs(d))[d > 0])
    check <- sprintf(', "psignrank_upper": %s', num(psignrank(tg - 1, n, lower.tail = FALSE)))
  }
  blocks <- c(blocks, sprintf('    "%s": {"differences": %s, "zeros": %d%s, %s}', name, vec(d), sum(d == 0), check, paste(parts, collapse = ", ")))
}
out <- c("{",
  sprintf('  "generated_by": "test/reference/generators/pratt_signed_rank.R, %s, base only",', R.version.string),
  '  "description": "Signed-rank statistic and its bounding tails P(sum R_i B_i >= T) by full enumeration of sign patterns, ranks under Wilcoxon (zeros dropped) and Pratt (zeros ranked, score 0) rules; greater: T = sum of ranks of d > 0; less: of d < 0; upper: p = G/(1+G), lower: p = 1/(1+G)",',
  '  "datasets": {', paste(blocks, collapse = ",\n"), "  }", "}")
writeLines(out, "pratt_signed_rank.json")

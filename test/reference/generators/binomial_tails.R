# Reference values for binomialUpperTail and the sign test under hidden bias Γ (test/reference/binomial_tails.json).
# R base only (stats::pbinom, which evaluates the incomplete beta function by TOMS 708).
# Run: Rscript test/reference/generators/binomial_tails.R > test/reference/binomial_tails.json
# P(X >= k), X ~ Binomial(n, p) is pbinom(k - 1, n, p, lower.tail = FALSE).
# Large-n cases use p whose complement 1 - p is exact in binary (p >= 1/2, or p = 1/4, 1/8, ...), so that the
# tail is a function of exactly the p given (at n = 1e9 one unit in the last place of p moves it by ~1e-10).
cases <- list(
  list(k = 9, n = 10, p = 0.5), list(k = 2, n = 10, p = 0.5), list(k = 5, n = 5, p = 0.2),
  list(k = 1, n = 10, p = 1e-10), list(k = 2, n = 1000, p = 5e-4), list(k = 30, n = 40, p = 0.3),
  list(k = 1990, n = 2000, p = 0.75), list(k = 1500, n = 2000, p = 0.25), list(k = 700, n = 1000, p = 0.5),
  list(k = 501, n = 1000, p = 0.5), list(k = 500, n = 1000, p = 0.5), list(k = 10, n = 1000, p = 0.3),
  list(k = 1e5 + 500, n = 2e5, p = 0.5), list(k = 5e6 + 1, n = 1e7, p = 0.5), list(k = 5e6 + 20000, n = 1e7, p = 0.5),
  list(k = 1e9, n = 1.999e9, p = 0.5), list(k = 1e9 - 20000, n = 1.999e9, p = 0.5),
  list(k = 999.5e6, n = 1.999e9, p = 0.5), list(k = 1e9, n = 2e9, p = 0.5),
  list(k = 1e9, n = 1.999e9, p = 0.75), list(k = 1.5e9, n = 1.999e9, p = 0.75),
  list(k = 5e11 + 1e6, n = 1e12, p = 0.5), list(k = 5e11 + 1e7, n = 1e12, p = 0.5),
  list(k = 2.5e11 + 3e6, n = 1e12, p = 0.25), list(k = 7.5e11 - 2e6, n = 1e12, p = 0.75),
  list(k = 5e11 - 1e5, n = 1e12, p = 0.5), list(k = 1.25e11 + 5e6, n = 1e12, p = 0.125)
)
# The sign test at Γ: S favourable pairs of D discordant, p = Γ/(1 + Γ) (upper bound), 1/(1 + Γ) (lower).
signs <- list(c(1e9, 1.999e9), c(60, 100), c(5200, 10000), c(5.1e6, 1e7))
gammas <- c(1, 1.2, 1.5, 2, 3)
fmt <- function(x) formatC(x, digits = 17, format = "g")
out <- c()
for (cs in cases) {
  v <- pbinom(cs$k - 1, cs$n, cs$p, lower.tail = FALSE)
  out <- c(out, sprintf('    {"k": %s, "n": %s, "p": %s, "upper": %s}', fmt(cs$k), fmt(cs$n), fmt(cs$p), fmt(v)))
}
sg <- c()
for (s in signs) for (g in gammas) {
  p <- g / (1 + g)
  up <- pbinom(s[1] - 1, s[2], p, lower.tail = FALSE)
  # the lower bound: success probability 1/(1 + Γ), as P(Y <= D - S) with Y ~ Bin(D, Γ/(1 + Γ))
  lo <- pbinom(s[2] - s[1], s[2], p)
  sg <- c(sg, sprintf('    {"S": %s, "D": %s, "gamma": %s, "p": %s, "upper": %s, "lower": %s}',
    fmt(s[1]), fmt(s[2]), fmt(g), fmt(p), fmt(up), fmt(lo)))
}
cat('{\n  "source": "', R.version.string, ', stats::pbinom (generator: test/reference/generators/binomial_tails.R)",\n', sep = "")
cat('  "tails": [\n', paste(out, collapse = ",\n"), '\n  ],\n', sep = "")
cat('  "signTest": [\n', paste(sg, collapse = ",\n"), '\n  ]\n}\n', sep = "")

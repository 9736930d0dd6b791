# Reference values for the plain-words tests (bottom line, statement, reports): E-values by the closed form of
# VanderWeele & Ding (2017), Annals of Internal Medicine 167(4):268-274 (E = RR + sqrt(RR (RR - 1)), RR >= 1,
# protective ratios inverted first); omitted-variable-bias quantities by Cinelli & Hazlett (2020), JRSS-B
# 82(1):39-67 (partial R2 = t^2/(t^2 + df); RV_q; benchmark bounds, Section 6); the signed-rank p-value and the
# Hodges-Lehmann estimate (median of the Walsh averages) from base R's stats package.
# R base only (Debian r-base-core). Run from test/reference/: Rscript generators/plain_words_cases.R
num <- function(x) ifelse(is.finite(x), sprintf("%.17g", x), ifelse(x > 0, "\"Inf\"", "\"-Inf\""))
e_value <- function(rr) { rr <- ifelse(rr < 1, 1 / rr, rr); rr + sqrt(rr * (rr - 1)) }
out <- list()
# E-value: interval includes the null (RR 1.10, 0.90 to 1.35).
out$evalue_includes_null <- c(eValueEstimate = e_value(1.10), eValueInterval = 1)
# E-value: a protective estimate (RR 0.5, 0.35 to 0.71): the upper limit is the one nearer the null.
out$evalue_protective <- c(eValueEstimate = e_value(0.5), eValueInterval = e_value(0.71))
# E-value: a target beyond the estimate (RR 1.5, target 2): the ratio to explain is 2/1.5.
out$evalue_target_beyond <- c(eValueEstimate = e_value(2 / 1.5))
# A cohort 2x2 table a,b,c,d = 30,70,15,85: its own risk ratio and log-scale Wald interval.
a <- 30; b <- 70; c <- 15; d <- 85
rr <- (a / (a + b)) / (c / (c + d))
se <- sqrt(1 / a - 1 / (a + b) + 1 / c - 1 / (c + d))
lower <- exp(log(rr) - qnorm(0.975) * se)
out$cohort_table <- c(riskRatio = rr, lower = lower, eValueEstimate = e_value(rr), eValueInterval = e_value(lower))
# Regression not significant before adjustment: estimate 0.3, SE 0.2, df 100.
t <- 0.3 / 0.2; df <- 100
f <- t / sqrt(df)
out$ovb_not_significant <- c(t = t, criticalT = qt(0.975, df - 1), partialR2 = t^2 / (t^2 + df), rv = 0.5 * (sqrt(f^4 + 4 * f^2) - f^2))
# Benchmark bound (Cinelli & Hazlett 2020, Section 6.1, with separate multiples kD, kY) and the adjusted estimate.
bound <- function(est, se, df, tY, tD, kD, kY) {
  r2yx <- tY^2 / (tY^2 + df); r2dx <- tD^2 / (tD^2 + df + 1)
  r2dz <- kD * r2dx / (1 - r2dx)
  r2zx <- kD * r2dx^2 / ((1 - kD * r2dx) * (1 - r2dx))
  eta <- (sqrt(kY) + sqrt(r2zx)) / sqrt(1 - r2zx)
  r2yz <- eta^2 * r2yx / (1 - r2yx)
  bias <- se * sqrt(df) * sqrt(min(r2yz, 1) * r2dz / (1 - r2dz))
  adj <- est - sign(est) * bias
  adjSe <- se * sqrt((1 - min(r2yz, 1)) / (1 - r2dz)) * sqrt(df / (df - 1))
  c(r2dz = r2dz, r2yzUncapped = r2yz, adjusted = adj, adjustedT = adj / adjSe)
}
# A bound that keeps a positive estimate but takes away significance: age (t 1.5 outcome, 2 treatment), k = 3.
out$ovb_t_below <- c(bound(0.5, 0.2, 100, 1.5, 2, 3, 3), criticalT = qt(0.975, 99))
# A capped bound: income (t 4 outcome, 1 treatment), kD = 3, kY = 30: the uncapped R2yz exceeds 1.
out$ovb_capped <- bound(0.5, 0.2, 100, 4, 1, 3, 30)
# Separate multiples for the outcome side: age, kD = 1, kY = 2.
out$ovb_times_outcome <- bound(0.5, 0.2, 100, 1.5, 2, 1, 2)
# Matched pairs whose data point the other way (no zeros, no ties: exact signed-rank p).
dneg <- c(-1.2, -0.5, 0.3, -2.1, -0.8, -1.1, 0.2, -0.9, -1.5, -0.65)
walsh <- function(x) { s <- outer(x, x, "+") / 2; s[upper.tri(s, diag = TRUE)] }
out$pairs_other_way <- c(pGreater = wilcox.test(dneg, alternative = "greater", exact = TRUE)$p.value,
                         pLess = wilcox.test(dneg, alternative = "less", exact = TRUE)$p.value,
                         hodgesLehmann = median(walsh(dneg)))
# Matched pairs with a tiny p-value: 30 positive, distinct differences (p = 2^-30).
dpos <- seq(0.5, 15, by = 0.5)
out$pairs_tiny_p <- c(p = wilcox.test(dpos, alternative = "greater", exact = TRUE)$p.value)
# A zero Hodges-Lehmann estimate that floating point computes as 5.55e-17: the Walsh averages' median is 0.
dzero <- c(1.1, 1.3, -0.7, -1.7)
out$pairs_zero_estimate <- c(hodgesLehmann = median(round(walsh(dzero), 12)))
blocks <- vapply(names(out), function(n) {
  v <- out[[n]]
  paste0('  "', n, '": {', paste0('"', names(v), '": ', num(v), collapse = ", "), "}")
}, "")
cat("{\n", paste(blocks, collapse = ",\n"), "\n}\n", sep = "", file = "plain_words_cases.json")

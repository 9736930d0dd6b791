# Reference values for the matched-sets sensitivity analysis (one treated unit, one or more controls per set).
# R base only (stats). Every data set below is invented (fictional) and drawn with R's own generator.
# Run from the repository root:  Rscript test/reference/generators/matched_sets.R
# Writes test/reference/matched_sets.json.
#
# Written from scratch with plain loops, from the conventions the analysis states (recalled from memory of
# Rosenbaum PR 2007, Biometrics 63(2):456-464, and Gastwirth, Krieger & Rosenbaum 2000, JRSS-B 62(3):545-555):
#   sigma = median |treated - control| over all sets and all controls (at no effect)
#   psi(x) = max(-c, min(c, x)), c = trim = 2.5
#   score of unit i in set s = mean over the other units k of psi((y_i - y_k)/sigma); T = sum of treated scores
#   bound under Gamma: per set, sorted scores, split a = 1..n-1 gives weight 1 to the a smallest and Gamma to the
#   rest; keep the largest weighted mean (ties: largest weighted variance, variance = sum w q^2/sum w - mean^2);
#   the lower bound does the same with the scores negated (and the mean negated back)
#   p upper = 1 - pnorm((T - E)/sqrt(V)); alternative "less": negate outcomes first
#   estimates: treated outcome shifted by -tau, sigma fixed; roots by uniroot
#   binary: set with e events of n units (0 < e < n): p = Gamma e/(Gamma e + n - e) (upper),
#           e/(e + Gamma (n - e)) (lower); exact tail by convolving Bernoullis; normal: mean/variance of the sum

options(digits = 17)
trim <- 2.5
alpha <- 0.05
gammas <- c(1, 1.25, 1.5, 2, 3)
tie_tol <- 1e-12

psi <- function(x, c) max(-c, min(c, x))

# Rows -> list of sets (order of first appearance), each list(id, t = treated outcome, c = control outcomes).
# Rows with a missing outcome are dropped; sets left without a treated outcome or without a control are dropped.
make_sets <- function(ids, treated, y) {
  keep <- !is.na(y)
  ids <- ids[keep]; treated <- treated[keep]; y <- y[keep]
  out <- list()
  for (id in unique(ids)) {
    rows <- which(ids == id)
    t <- y[rows[treated[rows] == 1]]
    c <- y[rows[treated[rows] == 0]]
    if (length(t) == 1 && length(c) >= 1) out[[length(out) + 1]] <- list(id = id, t = t, c = c)
  }
  out
}

scale_of <- function(S) {
  d <- c()
  for (s in S) for (ctl in s$c) d <- c(d, abs(s$t - ctl))
  median(d)
}

unit_scores <- function(v, sigma, c) {
  n <- length(v)
  q <- numeric(n)
  for (i in 1:n) {
    total <- 0
    for (k in 1:n) if (k != i) total <- total + psi((v[i] - v[k]) / sigma, c)
    q[i] <- total / (n - 1)
  }
  q
}

# Largest weighted mean over the splits (ties: largest variance) of one set's scores.
upper_split <- function(q, g) {
  qs <- sort(q)
  n <- length(qs)
  best <- -Inf
  best_var <- NA
  for (a in 1:(n - 1)) {
    w <- c(rep(1, a), rep(g, n - a))
    m <- sum(w * qs) / sum(w)
    v <- sum(w * qs^2) / sum(w) - m^2
    if (m > best + tie_tol * trim) {
      best <- m; best_var <- v
    } else if (abs(m - best) <= tie_tol * trim && v > best_var) {
      best_var <- v
    }
  }
  c(best, best_var)
}

# T, and E, V of the upper and lower bounds, with the treated outcome shifted by -tau.
m_state <- function(S, sigma, c, g, tau = 0) {
  T <- 0; Eu <- 0; Vu <- 0; El <- 0; Vl <- 0
  for (s in S) {
    q <- unit_scores(c(s$t - tau, s$c), sigma, c)
    T <- T + q[1]
    up <- upper_split(q, g)
    lo <- upper_split(-q, g)
    Eu <- Eu + up[1]; Vu <- Vu + up[2]
    El <- El - lo[1]; Vl <- Vl + lo[2]
  }
  list(T = T, Eu = Eu, Vu = Vu, El = El, Vl = Vl)
}

p_upper <- function(S, sigma, g) {
  st <- m_state(S, sigma, trim, g)
  pnorm((st$T - st$Eu) / sqrt(st$Vu), lower.tail = FALSE)
}
p_lower <- function(S, sigma, g) {
  st <- m_state(S, sigma, trim, g)
  pnorm((st$T - st$El) / sqrt(st$Vl), lower.tail = FALSE)
}

tipping <- function(pfun) {
  if (pfun(1) > alpha) return(NA)
  f <- function(lg) log(pfun(exp(lg))) - log(alpha)
  exp(uniroot(f, c(0, log(1000)), tol = 1e-13, maxiter = 10000)$root)
}

# Roots in tau; the bracket is where every treated-control difference is beyond +-c*sigma (statistic constant).
tau_root <- function(S, sigma, fn) {
  lo <- Inf; hi <- -Inf
  for (s in S) for (ctl in s$c) { lo <- min(lo, s$t - ctl); hi <- max(hi, s$t - ctl) }
  margin <- trim * sigma + 0.01 * (hi - lo + trim * sigma)
  a <- lo - margin; b <- hi + margin
  fa <- fn(a); fb <- fn(b)
  if (!(fa > 0 && fb < 0)) return(NA)
  uniroot(fn, c(a, b), f.lower = fa, f.upper = fb, tol = 1e-13, maxiter = 10000)$root
}

continuous_case <- function(name, ids, treated, y, alternative = "greater") {
  yy <- if (alternative == "less") -y else y
  S <- make_sets(ids, treated, yy)
  S0 <- make_sets(ids, treated, y)
  sigma <- scale_of(S)
  z <- qnorm(alpha / 2, lower.tail = FALSE)
  rows <- list()
  for (g in gammas) {
    st <- m_state(S, sigma, trim, g)
    est <- function(which) function(tau) {
      x <- m_state(S0, sigma, trim, g, tau)
      switch(which,
        low = x$T - x$Eu,
        high = x$T - x$El,
        ilow = x$T - x$Eu - z * sqrt(x$Vu),
        ihigh = x$T - x$El + z * sqrt(x$Vl))
    }
    rows[[length(rows) + 1]] <- list(
      gamma = g,
      p_upper = pnorm((st$T - st$Eu) / sqrt(st$Vu), lower.tail = FALSE),
      p_lower = pnorm((st$T - st$El) / sqrt(st$Vl), lower.tail = FALSE),
      expectation = st$Eu, variance = st$Vu,
      estimate_low = tau_root(S0, sigma, est("low")),
      estimate_high = tau_root(S0, sigma, est("high")),
      interval_low = tau_root(S0, sigma, est("ilow")),
      interval_high = tau_root(S0, sigma, est("ihigh")))
  }
  point <- tau_root(S0, sigma, function(tau) {
    x <- m_state(S0, sigma, trim, 1, tau)
    x$T - x$Eu
  })
  list(name = name, fictional = TRUE, alternative = alternative,
       setIds = ids, treated = treated, outcomes = y,
       sets_used = length(S), sigma = sigma, statistic = m_state(S, sigma, trim, 1)$T,
       estimate = point, rows = rows,
       sensitivity_value = tipping(function(g) p_upper(S, sigma, g)))
}

# ---- binary ----
convolve_tail <- function(p, t) {
  pmf <- 1
  for (pi in p) pmf <- c(pmf * (1 - pi), 0) + c(0, pmf * pi)
  if (t <= 0) return(1)
  if (t > length(p)) return(0)
  sum(pmf[(t + 1):(length(p) + 1)])
}

binary_case <- function(name, ids, treated, y) {
  S <- make_sets(ids, treated, y)
  e <- c(); n <- c(); tr <- c()
  for (s in S) {
    k <- s$t + sum(s$c); m <- 1 + length(s$c)
    if (k > 0 && k < m) { e <- c(e, k); n <- c(n, m); tr <- c(tr, s$t) }
  }
  T <- sum(tr)
  pu <- function(g) g * e / (g * e + n - e)
  pl <- function(g) e / (e + g * (n - e))
  rows <- list()
  for (g in gammas) {
    p <- pu(g)
    rows[[length(rows) + 1]] <- list(
      gamma = g,
      p_upper_exact = convolve_tail(p, T), p_lower_exact = convolve_tail(pl(g), T),
      p_upper_normal = pnorm((T - sum(p)) / sqrt(sum(p * (1 - p))), lower.tail = FALSE),
      expectation = sum(p), variance = sum(p * (1 - p)))
  }
  list(name = name, fictional = TRUE, setIds = ids, treated = treated, outcomes = y,
       sets_used = length(S), informative_sets = length(e), uninformative_sets = length(S) - length(e),
       statistic = T, rows = rows,
       sensitivity_value_exact = tipping(function(g) convolve_tail(pu(g), T)),
       sensitivity_value_normal = tipping(function(g) {
         p <- pu(g); pnorm((T - sum(p)) / sqrt(sum(p * (1 - p))), lower.tail = FALSE)
       }))
}

# Rows of a data set: sets of 1 treated + k controls, ids "s1", "s2", ..., row order shuffled.
draw_rows <- function(sizes, outcome) {
  ids <- c(); treated <- c(); y <- c()
  for (j in seq_along(sizes)) {
    v <- outcome(sizes[j])
    ids <- c(ids, rep(paste0("s", j), sizes[j] + 1))
    treated <- c(treated, 1, rep(0, sizes[j]))
    y <- c(y, v)
  }
  o <- sample(length(ids))
  list(ids = ids[o], treated = treated[o], y = y[o])
}

set.seed(20240611)
# A: 12 fictional sets with 1-4 controls, a moderate effect, one decimal.
a <- draw_rows(sample(1:4, 12, replace = TRUE), function(k) round(c(rnorm(1, 10.8, 2), rnorm(k, 10, 2)), 1))
# B: 25 fictional sets with 1-4 controls, heavier tails (t, 3 df), two missing outcomes added below.
b <- draw_rows(sample(1:4, 25, replace = TRUE), function(k) round(c(rt(1, 3) + 1.2, rt(k, 3)), 2))
b$y[which(b$ids == "s3" & b$treated == 0)[1]] <- NA   # a control outcome missing: the set stays if it has another
b$y[which(b$ids == "s7" & b$treated == 1)] <- NA       # the treated outcome missing: the set is dropped
# C: 10 fictional sets of 1 treated and 3 controls with whole-number outcomes (ties, saturated psi).
cc <- draw_rows(rep(3, 10), function(k) c(sample(3:9, 1), sample(0:7, k, replace = TRUE)))
# P: 18 fictional pairs (1:1), for the pair-matched formula.
p <- draw_rows(rep(1, 18), function(k) round(c(rnorm(1, 0.6, 1), rnorm(1, 0, 1)), 2))
# D: 14 fictional sets with 1-4 controls and a large effect, so that the interval closes and Gamma* is large.
d <- draw_rows(sample(1:4, 14, replace = TRUE), function(k) round(c(rnorm(1, 14, 1.5), rnorm(k, 10, 1.5)), 1))

# Binary: 40 fictional 1:2 sets; 30 fictional sets with 1-5 controls; 26 fictional 1:1 pairs.
bin_a <- draw_rows(rep(2, 40), function(k) c(rbinom(1, 1, 0.55), rbinom(k, 1, 0.3)))
bin_b <- draw_rows(sample(1:5, 30, replace = TRUE), function(k) c(rbinom(1, 1, 0.6), rbinom(k, 1, 0.35)))
bin_p <- draw_rows(rep(1, 26), function(k) c(rbinom(1, 1, 0.6), rbinom(1, 1, 0.3)))

continuous <- list(
  continuous_case("fictional_a", a$ids, a$treated, a$y),
  continuous_case("fictional_a_less", a$ids, a$treated, a$y, "less"),
  continuous_case("fictional_b_missing", b$ids, b$treated, b$y),
  continuous_case("fictional_c_whole_numbers", cc$ids, cc$treated, cc$y),
  continuous_case("fictional_d_large_effect", d$ids, d$treated, d$y))

# Pairs: the pair-matched m-test written directly from its formula (one control per set):
# d = treated - control, sigma = median |d|, T = sum psi(d/sigma); pair bound under Gamma:
# E = sum |psi| (Gamma - 1)/(Gamma + 1), V = sum psi^2 * 4 Gamma/(1 + Gamma)^2.
pair_case <- function() {
  S <- make_sets(p$ids, p$treated, p$y)
  dd <- sapply(S, function(s) s$t - s$c)
  sigma <- median(abs(dd))
  ps <- sapply(dd, function(x) psi(x / sigma, trim))
  rows <- list()
  for (g in gammas) {
    E <- sum(abs(ps)) * (g - 1) / (g + 1)
    V <- sum(ps^2) * 4 * g / (1 + g)^2
    rows[[length(rows) + 1]] <- list(gamma = g, expectation = E, variance = V,
      p_upper = pnorm((sum(ps) - E) / sqrt(V), lower.tail = FALSE))
  }
  list(name = "fictional_pairs", fictional = TRUE, setIds = p$ids, treated = p$treated, outcomes = p$y,
       sigma = sigma, statistic = sum(ps), rows = rows)
}

# 1:1 binary pairs: every discordant pair has p = Gamma/(1 + Gamma), so the tail is binomial (pbinom).
binary_pairs_check <- function() {
  S <- make_sets(bin_p$ids, bin_p$treated, bin_p$y)
  D <- 0; T <- 0
  for (s in S) if (s$t != s$c) { D <- D + 1; T <- T + s$t }
  lapply(gammas, function(g) list(gamma = g,
    pbinom_upper = pbinom(T - 1, D, g / (1 + g), lower.tail = FALSE),
    pbinom_lower = pbinom(T - 1, D, 1 / (1 + g), lower.tail = FALSE)))
}

binary <- list(binary_case("fictional_binary_1to2", bin_a$ids, bin_a$treated, bin_a$y),
               binary_case("fictional_binary_mixed", bin_b$ids, bin_b$treated, bin_b$y),
               binary_case("fictional_binary_pairs", bin_p$ids, bin_p$treated, bin_p$y))
binary[[3]]$pbinom_check <- binary_pairs_check()

# ---- a small JSON writer (base R has none) ----
to_json <- function(x, indent = "") {
  inner <- paste0(indent, "  ")
  if (is.list(x)) {
    if (is.null(names(x))) {
      if (length(x) == 0) return("[]")
      return(paste0("[\n", paste0(inner, sapply(x, to_json, indent = inner), collapse = ",\n"), "\n", indent, "]"))
    }
    parts <- mapply(function(k, v) paste0(inner, "\"", k, "\": ", to_json(v, inner)), names(x), x)
    return(paste0("{\n", paste(parts, collapse = ",\n"), "\n", indent, "}"))
  }
  atom <- function(v) {
    if (is.na(v)) return("null")
    if (is.logical(v)) return(if (v) "true" else "false")
    if (is.character(v)) return(paste0("\"", v, "\""))
    sprintf("%.17g", v)
  }
  if (length(x) == 1) return(atom(x))  # every data column here has more than one element
  paste0("[", paste(sapply(x, atom), collapse = ", "), "]")
}

out <- list(
  description = "Matched sets (one treated unit, one or more controls): m-statistic bounds (Huber psi, separable approximation) and binary event-count bounds, on invented (fictional) data. Generator: test/reference/generators/matched_sets.R (R base only).",
  r_version = R.version.string,
  trim = trim, alpha = alpha, gammas = gammas,
  continuous = continuous, pairs = pair_case(), binary = binary)
writeLines(to_json(out), "test/reference/matched_sets.json")
cat("wrote test/reference/matched_sets.json\n")

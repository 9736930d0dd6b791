/**
 * The exact upper tail P(Σ vⱼ·Kⱼ ≥ t) of a weighted sum of independent binomials Kⱼ ~ Binomial(mⱼ, p) — the
 * bounding distribution of a signed-rank statistic when the differences take only a few distinct sizes (heavy
 * ties: each size is one mid-rank vⱼ shared by mⱼ pairs).
 *
 * **Method.** Each binomial's point probabilities are built by the ratio recurrence outward from the mode
 * (f(k + 1)/f(k) = (m − k)/(k + 1)·p/q), then divided by their sum, so no factorial or power is formed and
 * nothing underflows near the mode; probabilities below 1e-40 of the mode are dropped at first, and below a cut
 * scaled to the answer when it is smaller than about 1e-20 (the dropped mass is then below 1e-16 of the answer;
 * answers below 1e-280 are declined). The last group, the widest, enters
 * through its upper cumulative sums (added from the top, so small tails keep their digits); the others are
 * summed over every combination of their values: P = Σ Π_{j<d} f_j(k_j) · F̄_d(⌈(t − Σ v_j k_j)/v_d⌉). Work:
 * the product of the other groups' supports — small exactly when the inversion of the generating function is
 * hardest (few distinct weights make the distribution lumpy).
 *
 * **Accuracy.** All terms are positive; the error is that of the recurrences (about one rounding per step
 * from the mode, so ≲ 1e-13 relative at the far tails) — checked against exact rational arithmetic in
 * test/core/fewWeightsBernoulliTail.test.ts.
 *
 * **References.** Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer, §4.3.3 (the bounding
 * distribution Σ Rᵢ Bᵢ, here grouped by tied ranks); Johnson NL, Kemp AW, Kotz S (2005) Univariate Discrete
 * Distributions, 3rd ed., Wiley, §3.2 (the binomial ratio recurrence; recalled from memory).
 *
 * **Special cases.** null when the work would exceed `maxWork` combinations or the answer is below 1e-280;
 * t ≤ 0 → 1; t > Σ vⱼmⱼ → 0.
 *
 * @param values distinct positive whole weights
 * @param counts how often each occurs (whole numbers ≥ 1)
 * @param t threshold on the weights' scale
 * @param p success probability in (0, 1); q = 1 − p passed separately to keep its digits
 */
export function fewWeightsUpperTail(
  values: ArrayLike<number>,
  counts: ArrayLike<number>,
  t: number,
  p: number,
  q: number,
  maxWork = 4e6,
): number | null {
  const d = values.length;
  if (d === 0 || !(p > 0 && q > 0)) return null;
  let total = 0;
  for (let j = 0; j < d; j++) total += values[j] * counts[j];
  const need = Math.ceil(t);
  if (need <= 0) return 1;
  if (need > total) return 0;
  // First with the far tails of each binomial cut at 1e-40 of its mode. Each group drops at most (m + 1)·cut of
  // its mass, so the answer is right to 1e-16 once it exceeds 1e16·n·cut (n = Σ m); otherwise once more with
  // the cut scaled to the rough answer (which is below the true one, so that bound then holds).
  let n = 0;
  for (let j = 0; j < counts.length; j++) n += counts[j] + 1;
  const rough = groupedTail(values, counts, need, p, q, 1e-40, maxWork);
  if (rough === null || rough >= 1e16 * n * 1e-40) return rough;
  return groupedTail(values, counts, need, p, q, Math.max(1e-300, (rough * 1e-24) / n), maxWork);
}

function groupedTail(values: ArrayLike<number>, counts: ArrayLike<number>, need: number, p: number, q: number, cut: number, maxWork: number): number | null {
  const d = values.length;
  const groups = Array.from({ length: d }, (_, j) => ({ value: values[j], pmf: binomialPoints(counts[j], p, q, cut) }));
  // The widest group last: it costs nothing (a lookup of its upper sums); the others multiply the work.
  groups.sort((a, b) => a.pmf.probabilities.length - b.pmf.probabilities.length);
  let work = 1;
  for (let j = 0; j < d - 1; j++) work *= groups[j].pmf.probabilities.length;
  if (work > maxWork) return null;
  const last = groups[d - 1];
  const lastSupport = last.pmf.probabilities;
  const upper = new Float64Array(lastSupport.length + 1);
  for (let i = lastSupport.length - 1; i >= 0; i--) upper[i] = upper[i + 1] + lastSupport[i];
  const lastFrom = last.pmf.from;
  const lastValue = last.value;
  const lastUpper = (partial: number): number => {
    const index = Math.ceil((need - partial) / lastValue) - lastFrom;
    if (index <= 0) return upper[0];
    return index >= upper.length ? 0 : upper[index];
  };
  let sum = 0;
  if (d === 1) sum = lastUpper(0);
  else if (d === 2) {
    const { from, probabilities } = groups[0].pmf;
    const v = groups[0].value;
    for (let i = 0; i < probabilities.length; i++) sum += probabilities[i] * lastUpper(v * (from + i));
  } else {
    // Odometer over the first d − 1 groups.
    const index = new Array<number>(d - 1).fill(0);
    for (;;) {
      let partial = 0;
      let weight = 1;
      for (let j = 0; j < d - 1; j++) {
        const g = groups[j];
        partial += g.value * (g.pmf.from + index[j]);
        weight *= g.pmf.probabilities[index[j]];
      }
      sum += weight * lastUpper(partial);
      let j = 0;
      while (j < d - 1 && ++index[j] === groups[j].pmf.probabilities.length) index[j++] = 0;
      if (j === d - 1) break;
    }
  }
  if (!(sum >= 1e-280)) return null;
  return Math.min(1, sum);
}

/**
 * Binomial(m, p) point probabilities k = from … from + length − 1, by the ratio recurrence from the mode,
 * normalised by their sum; values below `cut` times the mode's left out.
 */
function binomialPoints(m: number, p: number, q: number, cut: number): { from: number; probabilities: Float64Array } {
  const mode = Math.min(m, Math.max(0, Math.floor((m + 1) * p)));
  const odds = p / q;
  const up: number[] = [];
  let r = 1;
  for (let k = mode; k < m; k++) {
    r *= ((m - k) / (k + 1)) * odds;
    if (r < cut) break;
    up.push(r);
  }
  const down: number[] = [];
  r = 1;
  for (let k = mode; k > 0; k--) {
    r *= (k / (m - k + 1)) / odds;
    if (r < cut) break;
    down.push(r);
  }
  const from = mode - down.length;
  const probabilities = new Float64Array(down.length + 1 + up.length);
  for (let i = 0; i < down.length; i++) probabilities[down.length - 1 - i] = down[i];
  probabilities[down.length] = 1;
  for (let i = 0; i < up.length; i++) probabilities[down.length + 1 + i] = up[i];
  // Sum from the smallest terms up, then normalise.
  const sorted = Float64Array.from(probabilities).sort();
  let total = 0;
  for (let i = 0; i < sorted.length; i++) total += sorted[i];
  for (let i = 0; i < probabilities.length; i++) probabilities[i] /= total;
  return { from, probabilities };
}

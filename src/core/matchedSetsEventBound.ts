import type { MatchedSetsLayout } from './matchedSetsGrouping';
import { poissonBinomialUpperTail } from './matchedSetsPoissonBinomialTail';
import { upperNormalTail } from './upperNormalTail';

/** A binary outcome in matched sets, reduced to what the test uses. */
export interface MatchedSetsEventCounts {
  /** T: treated units with the event, over the informative sets. */
  readonly statistic: number;
  /** Events e in each informative set (0 < e < n). */
  readonly events: Int32Array;
  /** Units n in each informative set. */
  readonly units: Int32Array;
  /** Sets in which some but not all units had the event. */
  readonly informativeSets: number;
  /** Sets in which no unit or every unit had the event (they carry no information). */
  readonly uninformativeSets: number;
}

/** Bounds on the one-sided p-value of the treated event count under bias at most Γ. */
export interface MatchedSetsEventBound {
  readonly gamma: number;
  /** P(T_Γ ≥ T) with each set's largest probability Γe/(Γe + n − e): the worst case. */
  readonly pUpper: number;
  /** The same with the smallest probability e/(e + Γ(n − e)): the best case. */
  readonly pLower: number;
  /** Σ p of the worst-case distribution. */
  readonly expectation: number;
  /** Σ p(1 − p) of the worst-case distribution. */
  readonly variance: number;
}

/**
 * Counts events per matched set for a binary (0/1) outcome: the treated events T over informative sets, and
 * each informative set's events e and size n.
 *
 * **Method.** A set with e events among its n units is informative when 0 < e < n; sets with no or all events
 * add a constant to T and to its null distribution and are left out (and counted).
 *
 * **References.** Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer, ch. 4 (recalled from memory).
 *
 * **Special cases.** No informative set → statistic 0 and empty arrays.
 *
 * @param layout the matched sets with outcomes 0 or 1 (treated first in each set)
 */
export function matchedSetsEventCounts(layout: MatchedSetsLayout): MatchedSetsEventCounts {
  const { start, values } = layout;
  const events: number[] = [];
  const units: number[] = [];
  let statistic = 0;
  for (let s = 0; s < layout.sets; s++) {
    let e = 0;
    for (let j = start[s]; j < start[s + 1]; j++) e += values[j] === 1 ? 1 : 0;
    const n = start[s + 1] - start[s];
    if (e === 0 || e === n) continue;
    events.push(e);
    units.push(n);
    statistic += values[start[s]] === 1 ? 1 : 0;
  }
  return Object.freeze({
    statistic,
    events: Int32Array.from(events),
    units: Int32Array.from(units),
    informativeSets: events.length,
    uninformativeSets: layout.sets - events.length,
  });
}

/**
 * Sensitivity bounds for the count of treated events in matched sets (one treated unit per set) under hidden
 * bias at most Γ.
 *
 * **Method.** Under bias at most Γ the treated unit of a set with e events among n units had the event with
 * probability between e/(e + Γ(n − e)) and Γe/(Γe + n − e), independently across sets; T is then bounded by
 * sums of independent Bernoullis with these probabilities (the complements (n − e)/(Γe + n − e) and
 * Γ(n − e)/(e + Γ(n − e)) are formed directly, not by subtraction). `exact`: the Poisson-binomial tail
 * (`poissonBinomialUpperTail`); `normal`: 1 − Φ((T − Σp)/√Σp(1 − p)), no continuity correction.
 *
 * **References.** Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer, ch. 4 (matched sets with a
 * binary outcome under bias Γ; recalled from memory). Hong Y (2013) Comput Stat Data Anal 59:41–51
 * (Poisson-binomial tail; recalled from memory).
 *
 * **Special cases.** Γ = 1: both bounds are the exact randomization p-value (for 1:1 pairs, McNemar's exact
 * test, R's `binom.test`); no informative sets → p = 1; NaN Γ → NaN.
 *
 * @param counts from `matchedSetsEventCounts`
 * @param gamma Γ ≥ 1
 * @param tail `exact` or `normal`
 */
export function matchedSetsEventBound(counts: MatchedSetsEventCounts, gamma: number, tail: 'exact' | 'normal'): MatchedSetsEventBound {
  const K = counts.informativeSets;
  const pUp = new Float64Array(K);
  const qUp = new Float64Array(K);
  const pLow = new Float64Array(K);
  const qLow = new Float64Array(K);
  let expectation = 0;
  let variance = 0;
  let lowMean = 0;
  let lowVariance = 0;
  for (let i = 0; i < K; i++) {
    const e = counts.events[i];
    const rest = counts.units[i] - e;
    const up = gamma * e + rest;
    pUp[i] = (gamma * e) / up;
    qUp[i] = rest / up;
    const low = e + gamma * rest;
    pLow[i] = e / low;
    qLow[i] = (gamma * rest) / low;
    expectation += pUp[i];
    variance += pUp[i] * qUp[i];
    lowMean += pLow[i];
    lowVariance += pLow[i] * qLow[i];
  }
  const T = counts.statistic;
  let pUpper: number;
  let pLower: number;
  if (Number.isNaN(gamma)) pUpper = pLower = NaN;
  else if (tail === 'exact') {
    pUpper = poissonBinomialUpperTail(pUp, T, qUp);
    pLower = poissonBinomialUpperTail(pLow, T, qLow);
  } else {
    pUpper = normalTail(T, expectation, variance);
    pLower = normalTail(T, lowMean, lowVariance);
  }
  return Object.freeze({ gamma, pUpper, pLower, expectation, variance });
}

function normalTail(t: number, mean: number, variance: number): number {
  if (!(variance > 0)) return t <= mean ? 1 : 0;
  return upperNormalTail((t - mean) / Math.sqrt(variance));
}

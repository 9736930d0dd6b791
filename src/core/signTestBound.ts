import { binomialUpperTail } from './binomialUpperTail';
import { biasProbabilities, type TailMethod } from './signedRankBound';
import { upperNormalTail } from './upperNormalTail';

/** Bounds on the one-sided p-value of the sign test under hidden bias at most Γ. */
export interface SignTestBound {
  readonly gamma: number;
  /** P(Binomial(D, Γ/(1 + Γ)) ≥ S): the largest p-value a bias of at most Γ allows. */
  readonly pUpper: number;
  /** P(Binomial(D, 1/(1 + Γ)) ≥ S): the smallest. */
  readonly pLower: number;
  readonly method: TailMethod;
}

/**
 * Sensitivity bounds for the sign test in matched pairs (McNemar's test for a binary outcome): S pairs in
 * which the treated unit did better, out of D pairs that differ.
 *
 * **Method.** Under bias at most Γ each non-tied pair favours the treated unit with probability between
 * 1/(1 + Γ) and Γ/(1 + Γ), so S is bounded by binomial distributions with these probabilities; `exact`
 * sums binomial terms (`binomialUpperTail`), `normal` uses mean D·p, variance D·p(1 − p),
 * z = (S − c − mean)/sd with c = ½ under a continuity correction.
 *
 * **References.** Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer, §4.3.2 (the sign test and
 * McNemar's test under bias Γ). Rosenbaum PR (1987) Biometrika 74(1):13–26.
 *
 * **Special cases.** Γ = 1 gives the usual binomial test (R's `binom.test(S, D, alternative = "greater")`);
 * D = 0 gives p = 1; NaN Γ → NaN.
 *
 * @param positive S, the number of pairs with a positive difference (or where only the treated unit had the event)
 * @param nonTied D, the number of pairs with a non-zero difference (discordant pairs)
 * @param gamma Γ ≥ 1
 */
export function signTestBound(
  positive: number,
  nonTied: number,
  gamma: number,
  options: { method: TailMethod; continuityCorrection?: boolean },
): SignTestBound {
  const { plus, minus } = biasProbabilities(gamma);
  let pUpper: number;
  let pLower: number;
  if (Number.isNaN(gamma)) pUpper = pLower = NaN;
  else if (options.method === 'exact') {
    pUpper = binomialUpperTail(positive, nonTied, plus, minus);
    pLower = binomialUpperTail(positive, nonTied, minus, plus);
  } else {
    const c = options.continuityCorrection ? 0.5 : 0;
    pUpper = normalTail(positive - c, nonTied, plus, minus);
    pLower = normalTail(positive - c, nonTied, minus, plus);
  }
  return Object.freeze({ gamma, pUpper, pLower, method: options.method });
}

function normalTail(s: number, d: number, p: number, q: number): number {
  if (d === 0) return 1;
  const sd = Math.sqrt(d * p * q);
  const mean = d * p;
  if (sd === 0) return s <= mean ? 1 : 0;
  return upperNormalTail((s - mean) / sd);
}

/** One way a hidden covariate could produce bias Γ: its link to treatment (Λ) and to the outcome (Δ). */
export interface AmplifiedPair {
  /** Λ: how much the covariate may multiply the odds of treatment within a pair. */
  readonly lambda: number;
  /** Δ: how much it may multiply the odds of a higher outcome (of a positive pair difference). */
  readonly delta: number;
}

/**
 * Amplification of a sensitivity analysis: Δ such that a covariate with treatment link Λ and outcome link Δ
 * is equivalent to bias Γ.
 *
 * **Method.** Γ = (ΛΔ + 1)/(Λ + Δ); solved for Δ: Δ = (ΓΛ − 1)/(Λ − Γ), defined for Λ > Γ. The curve is
 * symmetric in (Λ, Δ) and passes through Λ = Δ = Γ + √(Γ² − 1).
 *
 * **References.** Rosenbaum PR, Silber JH (2009) Amplification of sensitivity analysis in matched
 * observational studies. JASA 104(488):1398–1405, §2.
 *
 * **Special cases.** Λ ≤ Γ → Infinity (no outcome link is strong enough); Λ = Infinity → Δ = Γ;
 * Γ = 1 → Δ = 1 for every Λ > 1; NaN → NaN.
 *
 * @param gamma Γ ≥ 1
 * @param lambda Λ > 0
 */
export function amplificationDelta(gamma: number, lambda: number): number {
  if (Number.isNaN(gamma) || Number.isNaN(lambda)) return NaN;
  if (lambda === Infinity) return gamma;
  if (lambda <= gamma) return Infinity;
  return (gamma * lambda - 1) / (lambda - gamma);
}

/** Γ from a pair (Λ, Δ): Γ = (ΛΔ + 1)/(Λ + Δ) (Rosenbaum & Silber 2009, §2). NaN in → NaN out. */
export function amplifiedGamma(lambda: number, delta: number): number {
  if (lambda === Infinity) return delta;
  if (delta === Infinity) return lambda;
  return (lambda * delta + 1) / (lambda + delta);
}

/**
 * The symmetric point of the amplification curve, Λ = Δ = Γ + √(Γ² − 1) (Rosenbaum & Silber 2009, §2).
 * Γ < 1 or NaN → NaN.
 */
export function amplificationSymmetricPoint(gamma: number): number {
  if (!(gamma >= 1)) return NaN;
  return gamma + Math.sqrt((gamma - 1) * (gamma + 1));
}

/**
 * Points (Λ, Δ) on the amplification curve of Γ for the given Λ values (those with Λ ≤ Γ are left out, since
 * no Δ matches them).
 */
export function amplificationCurve(gamma: number, lambdas: readonly number[]): AmplifiedPair[] {
  const points: AmplifiedPair[] = [];
  for (const lambda of lambdas) {
    if (!(lambda > gamma)) continue;
    points.push(Object.freeze({ lambda, delta: amplificationDelta(gamma, lambda) }));
  }
  return points;
}

/**
 * Two or three easily read pairs on the curve for a sentence: round Λ values a little, clearly and much above
 * Γ (from 1.5, 2, 3, 4, 5, 6, 8, 10, 15, 20, 30, 50, 100, …), each with its Δ. Γ ≤ 1 or NaN → none.
 */
export function readableAmplifications(gamma: number): AmplifiedPair[] {
  if (!(gamma > 1) || !Number.isFinite(gamma)) return [];
  const round: number[] = [];
  for (let decade = 1; decade <= 1e7; decade *= 10) for (const m of [1, 1.5, 2, 3, 4, 5, 6, 8]) round.push(m * decade);
  const above = round.filter((lambda) => lambda >= gamma * 1.25);
  const symmetric = amplificationSymmetricPoint(gamma);
  const first = above.find((lambda) => lambda >= symmetric) ?? above[0];
  const chosen = [first, above.find((l) => l >= first * 2), above.find((l) => l >= first * 5)].filter(
    (l): l is number => l !== undefined,
  );
  const points = chosen.map((lambda) => Object.freeze({ lambda, delta: amplificationDelta(gamma, lambda) }));
  return points;
}

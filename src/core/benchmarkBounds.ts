/** The bounding confounder for "k times as strong as a covariate", or why there is none. */
export interface BenchmarkBound {
  /** R²(D~Z|X) of the bounding confounder; NaN when not available. */
  readonly r2dz: number;
  /** Upper bound on R²(Y~Z|D,X); NaN when not available. */
  readonly r2yz: number;
  /** R²(Z~Xj|X₋j, D) implied by the assumption (a by-product; may be ≥ 1 when the bound is not available). */
  readonly r2zxj: number;
  /** Whether the bound on R²yz was capped at 1. */
  readonly capped: boolean;
  /** Null when available; otherwise a plain reason. */
  readonly unavailable: string | null;
  /**
   * Whether the bound says something about the estimate: false when it is not available, or when R²yz reached
   * 1 and was capped (a confounder explaining all of the outcome's residual variance: the adjusted standard
   * error is 0 and the adjusted t is not available).
   */
  readonly informative: boolean;
  /** Null when informative; otherwise why not, in plain words. */
  readonly reason: string | null;
}

/** Why a capped bound (R²yz = 1) is not informative, in plain words. */
export const CAPPED_BOUND_REASON =
  'the bound reaches 100% of the outcome’s residual variance (R²yz capped at 1): a confounder this strong could explain all of the outcome’s remaining variance, so no adjusted standard error or t follows from it';

/**
 * Bounds on the strength of a confounder Z that is k_D times as strongly associated with the treatment, and
 * k_Y times as strongly with the outcome, as the observed covariate (or group) X_j, with Z orthogonal to the
 * observed covariates.
 *
 * **Method.** With R²dxj = R²(D~Xj|X₋j) and R²yxj = R²(Y~Xj|X₋j,D):
 *  - R²dz = k_D·R²dxj/(1 − R²dxj);
 *  - R²zxj = k_D·R²dxj²/((1 − k_D·R²dxj)(1 − R²dxj)) (the association of Z with X_j once D is held fixed);
 *  - R²yz ≤ ((√k_Y + √R²zxj)/√(1 − R²zxj))²·R²yxj/(1 − R²yxj), capped at 1.
 * Not available when R²dz ≥ 1 or when the implied R²zxj is not in [0, 1) (k_D·R²dxj ≥ 1 included): no
 * confounder that strong with the treatment is compatible with X_j's observed strength. A bound capped at
 * R²yz = 1 is flagged `informative: false` (with the reason): the adjusted standard error is then 0.
 *
 * **References.** Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias.
 * Journal of the Royal Statistical Society, Series B 82(1):39–67, §6 (bounding the strength of confounding
 * with observed covariates; §6.1 uses separate k_D and k_Y; section and formulas recalled from memory). The
 * formulas were re-derived from partial-correlation algebra
 * and checked on R's swiss data by constructing such a confounder (test/reference/ovb.json,
 * swiss.check_benchmark_algebra).
 *
 * **Special cases.** NaN, negative k, or a partial R² outside [0, 1) → all fields NaN with a reason. k_D = 0 →
 * R²dz = 0 and R²yz = k_Y·R²yxj/(1 − R²yxj). R²yxj = 0 → R²yz = 0.
 *
 * @param r2dxj partial R² of X_j with the treatment given the other covariates, in [0, 1)
 * @param r2yxj partial R² of X_j with the outcome given the treatment and the other covariates, in [0, 1)
 * @param kTreatment k_D ≥ 0
 * @param kOutcome k_Y ≥ 0 (default k_D)
 */
export function benchmarkBound(r2dxj: number, r2yxj: number, kTreatment: number, kOutcome = kTreatment): BenchmarkBound {
  const valid = (x: number) => x >= 0 && x < 1;
  if (!valid(r2dxj) || !valid(r2yxj) || !(kTreatment >= 0) || !(kOutcome >= 0) || !Number.isFinite(kTreatment + kOutcome)) {
    return notAvailable(NaN, 'the inputs are outside their domain');
  }
  const r2dz = (kTreatment * r2dxj) / (1 - r2dxj);
  const r2zxj = (kTreatment * r2dxj * r2dxj) / ((1 - kTreatment * r2dxj) * (1 - r2dxj));
  if (r2dz >= 1) {
    return notAvailable(r2zxj, 'a confounder this many times as strong would explain all of the treatment');
  }
  if (!(r2zxj >= 0 && r2zxj < 1)) {
    return notAvailable(r2zxj, 'no confounder this many times as strong is compatible with the covariate’s observed association with the treatment');
  }
  const eta = (Math.sqrt(kOutcome) + Math.sqrt(r2zxj)) / Math.sqrt(1 - r2zxj);
  const bound = eta * eta * (r2yxj / (1 - r2yxj));
  const full = bound >= 1; // R²yz = 1: the adjusted standard error is 0
  return { r2dz, r2yz: Math.min(1, bound), r2zxj, capped: bound > 1, unavailable: null, informative: !full, reason: full ? CAPPED_BOUND_REASON : null };
}

function notAvailable(r2zxj: number, reason: string): BenchmarkBound {
  return { r2dz: NaN, r2yz: NaN, r2zxj, capped: false, unavailable: reason, informative: false, reason };
}

import type { WeightingEstimand } from './weightingInput';
import { type WeightedMeanRangeTable, weightedMeanRange, weightedMeanRangeTable } from './weightedMeanRange';

/** Everything needed to bound the weighted effect at any Λ: one range table per treatment group. */
export interface WeightingBoundTables {
  readonly estimand: WeightingEstimand;
  readonly treated: WeightedMeanRangeTable;
  readonly control: WeightedMeanRangeTable;
}

/** Reusable scratch arrays for {@link weightingBoundTables} (one per thread; saves allocation per resample). */
export interface WeightingBoundsWorkspace {
  readonly treatedOutcome: Float64Array;
  readonly treatedScaled: Float64Array;
  readonly treatedCount: Float64Array;
  readonly controlOutcome: Float64Array;
  readonly controlScaled: Float64Array;
  readonly controlCount: Float64Array;
  treatedTable?: WeightedMeanRangeTable;
  controlTable?: WeightedMeanRangeTable;
}

/**
 * Scratch arrays for {@link weightingBoundTables}, sized for the two groups.
 *
 * **Method.** Plain allocation of six arrays; the range tables are added on first use.
 *
 * **References.** None (a buffer).
 *
 * **Special cases.** Sizes of 0 give empty arrays.
 *
 * @param treatedSize number of treated people, whole number ≥ 0
 * @param controlSize number of controls, whole number ≥ 0
 * @throws RangeError when a size is negative or not whole (from the typed-array constructor)
 */
export function weightingBoundsWorkspace(treatedSize: number, controlSize: number): WeightingBoundsWorkspace {
  return {
    treatedOutcome: new Float64Array(treatedSize),
    treatedScaled: new Float64Array(treatedSize),
    treatedCount: new Float64Array(treatedSize),
    controlOutcome: new Float64Array(controlSize),
    controlScaled: new Float64Array(controlSize),
    controlCount: new Float64Array(controlSize),
  };
}

/**
 * Builds the tables that bound the inverse-probability-weighted effect under the marginal sensitivity model.
 *
 * **Method.** The marginal sensitivity model lets each person's true odds of treatment differ from the
 * fitted odds o = e/(1 − e) by a factor in [1/Λ, Λ]. Hájek (normalised) weights then lie in boxes:
 * ATE — treated 1/e_true = 1 + (1/e − 1)·h, control 1/(1 − e_true) = 1 + o·h, h ∈ [1/Λ, Λ];
 * ATT — treated 1 (fixed), control e_true/(1 − e_true) = o·h. Each group's weight is f + s·h with
 * (f, s) = (1, 1/o) or (1, o) for the ATE, (1, 0) and (0, o) for the ATT, and the odds are computed as exp(η)
 * from the linear predictor η (no loss of digits when e is near 0 or 1). The outcomes of each group are taken
 * in a fixed ascending order, so a resample only changes the multiplicities.
 *
 * **References.** Tan Z (2006) A distributional approach for causal inference using propensity scores.
 * JASA 101(476):1619–1637 (the marginal sensitivity model). Zhao Q, Small DS, Bhattacharya BB (2019)
 * Sensitivity analysis for inverse probability weighting estimators via the percentile bootstrap. JRSS-B
 * 81(4):735–761, §3–4 (the weight boxes and their extrema). Both recalled from memory.
 *
 * **Special cases.** A group whose multiplicities are all 0 gives NaN bounds.
 *
 * @param estimand `ate` or `att`
 * @param outcome outcomes by person
 * @param treatedOrder indices of the treated, in ascending order of outcome
 * @param controlOrder indices of the controls, in ascending order of outcome
 * @param linearPredictor η = logit(e) by person
 * @param counts multiplicity by person (whole numbers ≥ 0), or null for 1 each
 * @param workspace scratch arrays sized for the two groups (optional)
 */
export function weightingBoundTables(
  estimand: WeightingEstimand,
  outcome: ArrayLike<number>,
  treatedOrder: ArrayLike<number>,
  controlOrder: ArrayLike<number>,
  linearPredictor: ArrayLike<number>,
  counts: ArrayLike<number> | null,
  workspace: WeightingBoundsWorkspace = weightingBoundsWorkspace(treatedOrder.length, controlOrder.length),
): WeightingBoundTables {
  const w = workspace;
  for (let j = 0; j < treatedOrder.length; j++) {
    const i = treatedOrder[j];
    const k = counts === null ? 1 : counts[i];
    w.treatedOutcome[j] = outcome[i];
    w.treatedScaled[j] = estimand === 'ate' && k !== 0 ? Math.exp(-linearPredictor[i]) : 0;
    w.treatedCount[j] = k;
  }
  for (let j = 0; j < controlOrder.length; j++) {
    const i = controlOrder[j];
    const k = counts === null ? 1 : counts[i];
    w.controlOutcome[j] = outcome[i];
    w.controlScaled[j] = k !== 0 ? Math.exp(linearPredictor[i]) : 0;
    w.controlCount[j] = k;
  }
  w.treatedTable = weightedMeanRangeTable(w.treatedOutcome, w.treatedCount, 1, w.treatedScaled, w.treatedTable);
  w.controlTable = weightedMeanRangeTable(w.controlOutcome, w.controlCount, estimand === 'ate' ? 1 : 0, w.controlScaled, w.controlTable);
  return { estimand, treated: w.treatedTable, control: w.controlTable };
}

/** Bounds on the weighted effect (treated mean − control mean) at one Λ. */
export interface WeightingEffectBounds {
  readonly lowerBound: number;
  readonly upperBound: number;
  readonly treatedLower: number;
  readonly treatedUpper: number;
  readonly controlLower: number;
  readonly controlUpper: number;
}

/**
 * The smallest and largest weighted effect over the marginal sensitivity model's weight boxes at Λ.
 *
 * **Method.** The treated and control weights vary independently, so the effect's lower bound is the
 * treated group's smallest mean minus the control group's largest, and the upper bound the treated largest
 * minus the control smallest; each group's extremes are exact ({@link weightedMeanRange}). For the ATT the
 * treated mean is fixed.
 *
 * **References.** Zhao Q, Small DS, Bhattacharya BB (2019) JRSS-B 81(4):735–761, §4 — recalled from memory.
 *
 * **Special cases.** Λ = 1: both bounds equal the Hájek estimate.
 *
 * @param tables from {@link weightingBoundTables}
 * @param lambda Λ ≥ 1
 */
export function weightingEffectBounds(tables: WeightingBoundTables, lambda: number): WeightingEffectBounds {
  const t = weightedMeanRange(tables.treated, lambda);
  const c = weightedMeanRange(tables.control, lambda);
  return {
    lowerBound: t.lower - c.upper,
    upperBound: t.upper - c.lower,
    treatedLower: t.lower,
    treatedUpper: t.upper,
    controlLower: c.lower,
    controlUpper: c.upper,
  };
}

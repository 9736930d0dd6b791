import type { CommandFigure, CommandReport } from '../methodModule';
import { jsonReading } from '../jsonReading';
import { boundsByLambdaPlot, propensityOverlapPlot, weightSummaryPlot } from './plots';
import type { WeightingAnalysis } from './analysis';
import { WEIGHTING_CAUTION, weightingReading, weightingReportText } from './text';
import type { WeightingReadSummary } from './weightingData';

/** The JSON object of `lurk weighting --json`: self-explaining names, null where not available. */
export function weightingResultJson(analysis: WeightingAnalysis, read: WeightingReadSummary | null): Record<string, unknown> {
  const r = analysis.result;
  return {
    method: r.method,
    estimand: r.estimand,
    file: read ? { rowsRead: read.rowsRead, treatment: read.treatment, outcome: read.outcome, covariates: read.covariates, categorical: read.coded } : null,
    settings: r.inputs,
    counts: r.counts,
    estimate: r.estimate,
    rows: r.rows.map((row) => ({ lambda: row.lambda, lowestEffect: row.lowerBound, highestEffect: row.upperBound, intervalLow: row.intervalLower, intervalHigh: row.intervalUpper })),
    tippingLambdaPoint: r.tippingLambdaPoint,
    tippingPointStatus: r.tippingPointStatus,
    tippingLambdaInterval: r.tippingLambdaInterval,
    tippingIntervalStatus: r.tippingIntervalStatus,
    reading: jsonReading(weightingReading(r)),
    propensityModel: {
      coefficients: r.propensityModel.coefficients.map((c, i) => ({ name: c.name, value: c.value, standardError: analysis.standardErrors[i] ?? null })),
      iterations: r.propensityModel.iterations,
      converged: r.propensityModel.converged,
      deviance: r.propensityModel.deviance,
    },
    bootstrap: r.bootstrap,
    overlap: r.overlap,
    weights: r.weights,
    conventions: [...r.conventions, { id: 'standard-errors', text: "Coefficient standard errors: square roots of the diagonal of (XᵀWX)⁻¹, W = e(1 − e), as R's summary.glm." }],
    references: r.references,
    warnings: [...(read?.warnings ?? []), ...r.warnings],
    caution: WEIGHTING_CAUTION,
  };
}

/** The figures of `lurk weighting --svg NAME`, in the page's order. */
export const WEIGHTING_FIGURES: readonly CommandFigure[] = Object.freeze([
  { name: 'bounds', shows: 'the lowest and highest effect and the sensitivity interval against Λ, with the tipping Λ' },
  { name: 'overlap', shows: 'the estimated propensity scores of the treated and the untreated' },
  { name: 'weights', shows: 'the smallest, mean and largest weight of each group' },
]);

/** The command's report: text for people, the JSON object and the figures. */
export function weightingReport(analysis: WeightingAnalysis, read: WeightingReadSummary | null): CommandReport {
  const r = analysis.result;
  const figures = { bounds: () => boundsByLambdaPlot(r), overlap: () => propensityOverlapPlot(r), weights: () => weightSummaryPlot(r) };
  return Object.freeze({ text: weightingReportText(analysis, read), json: weightingResultJson(analysis, read), figures });
}

import type { WeightingResult, WeightingTippingStatus, WeightSummary } from '../../core/weightingAnalysis';
import { formatNumber } from '../../format/formatNumber';
import type { WeightingAnalysis } from './analysis';
import type { WeightingReadSummary } from './weightingData';
import { readNote } from './analysis';

/** The caution every weighting report ends with. */
export const WEIGHTING_CAUTION =
  'A sensitivity analysis bounds how strong hidden confounding would have to be; it does not prove causation. ' +
  'The bounds assume the propensity model is right apart from the hidden factor, and say nothing about bias from ' +
  'measurement error, selection or a wrong outcome model. Decisions about health or safety defer to domain experts, ' +
  'local guidance and licensed practice.';

/** Λ written as typed: "2", "1.25", "3.47". */
export function formatLambda(lambda: number | null | undefined): string {
  if (lambda === null || lambda === undefined || !Number.isFinite(lambda)) return 'not available';
  return Number(lambda.toPrecision(3)).toString();
}

/** A coverage in per cent: 0.05 → "95". */
export function coveragePercent(alpha: number): string {
  return String(Number(((1 - alpha) * 100).toPrecision(4)));
}

/** An effect with 4 significant digits. */
export function formatEffectValue(x: number | null | undefined): string {
  return formatNumber(x, { significant: 4 });
}

/** A tipping value and its status in words. */
export function tippingWords(lambda: number | null, status: WeightingTippingStatus, limit: number, what: 'point bounds' | 'interval'): string {
  switch (status) {
    case 'found':
      return `Λ = ${formatLambda(lambda)}: the ${what} first ${what === 'interval' ? 'includes' : 'include'} no effect there`;
    case 'includes-zero-at-one':
      return `Λ = 1: the ${what} already ${what === 'interval' ? 'includes' : 'include'} no effect without hidden bias`;
    case 'beyond-range':
      return `above ${formatLambda(limit)}: the ${what} still ${what === 'interval' ? 'excludes' : 'exclude'} no effect at the largest Λ searched`;
    default:
      return 'not available (no usable bootstrap resample)';
  }
}

/** The reading of a result in words: what a hidden factor would have to do. */
export function weightingReading(result: WeightingResult): string[] {
  const lines: string[] = [];
  const target = result.estimand === 'ate' ? 'average effect in everyone' : 'average effect in the treated';
  const pct = coveragePercent(result.inputs.alpha);
  if (result.tippingIntervalStatus === 'includes-zero-at-one') {
    lines.push(`Even without hidden bias (Λ = 1), the ${pct}% interval of the ${target} includes no effect: the data alone do not establish an effect, so no hidden factor is needed to explain it away.`);
  }
  if (result.tippingPointStatus === 'found') {
    lines.push(
      `A hidden factor that changed some people's odds of treatment by more than ${formatLambda(result.tippingLambdaPoint)}-fold (Λ = ${formatLambda(result.tippingLambdaPoint)}) could move the weighted ${target} to no effect.`,
    );
  } else if (result.tippingPointStatus === 'includes-zero-at-one') {
    lines.push(`The weighted estimate is exactly no effect.`);
  } else if (result.tippingPointStatus === 'beyond-range') {
    lines.push(`No hidden factor changing the odds of treatment by up to ${formatLambda(result.inputs.lambdaSearchLimit)}-fold could move the weighted ${target} to no effect.`);
  }
  if (result.tippingIntervalStatus === 'found') {
    lines.push(
      `Allowing for sampling error, the ${pct}% sensitivity interval first includes no effect at Λ = ${formatLambda(result.tippingLambdaInterval)}: a hidden factor that changed some people's odds of treatment by more than ${formatLambda(result.tippingLambdaInterval)}-fold could make the finding inconclusive.`,
    );
  } else if (result.tippingIntervalStatus === 'beyond-range') {
    lines.push(`The ${pct}% sensitivity interval excludes no effect for every Λ up to ${formatLambda(result.inputs.lambdaSearchLimit)}.`);
  }
  return lines;
}

function pad(cells: readonly string[], widths: readonly number[]): string {
  return cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ').trimEnd();
}

function table(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  return [pad(header, widths), ...rows.map((r) => pad(r, widths))].map((l) => `  ${l}`).join('\n');
}

function weightRow(name: string, w: WeightSummary): string[] {
  return [name, String(w.people), formatNumber(w.smallest, { significant: 3 }), formatNumber(w.largest, { significant: 3 }), formatNumber(w.mean, { significant: 3 }), formatNumber(w.effectiveSize, { significant: 4 }), `${formatNumber(w.largestShare * 100, { significant: 2 })}%`];
}

/** The report for people: the reading, the table by Λ, tipping values, model, overlap, weights, notes, conventions. */
export function weightingReportText(analysis: WeightingAnalysis, read: WeightingReadSummary | null): string {
  const r = analysis.result;
  const pct = coveragePercent(r.inputs.alpha);
  const out: string[] = [];
  out.push(`Weighting sensitivity analysis (marginal sensitivity model), estimand ${r.estimand.toUpperCase()} (${r.estimand === 'ate' ? 'average effect in everyone' : 'average effect in the treated'})`);
  if (read) out.push(readNote(read));
  const c = r.counts;
  out.push(`People: ${c.given} given, ${c.droppedMissing} left out for a missing value, ${c.trimmedBelow + c.trimmedAbove} trimmed; ${c.used} used (${c.treated} treated, ${c.control} control).`);
  out.push('');
  out.push(`Weighted estimate without hidden bias (Λ = 1): treated mean ${formatEffectValue(r.estimate.treatedMean)}, control mean ${formatEffectValue(r.estimate.controlMean)}, effect ${formatEffectValue(r.estimate.effect)}.`);
  out.push('');
  out.push('Reading:');
  for (const line of weightingReading(r)) out.push(`  ${line}`);
  out.push('');
  out.push(`Bounds on the effect by Λ (the odds of treatment may differ from the fitted odds by up to Λ-fold), with the ${pct}% sensitivity interval:`);
  out.push(
    table(
      ['Λ', 'lowest effect', 'highest effect', 'interval low', 'interval high'],
      r.rows.map((row) => [formatLambda(row.lambda), formatEffectValue(row.lowerBound), formatEffectValue(row.upperBound), formatEffectValue(row.intervalLower), formatEffectValue(row.intervalUpper)]),
    ),
  );
  out.push('');
  out.push(`Tipping Λ (point bounds): ${tippingWords(r.tippingLambdaPoint, r.tippingPointStatus, r.inputs.lambdaSearchLimit, 'point bounds')}.`);
  out.push(`Tipping Λ (${pct}% interval): ${tippingWords(r.tippingLambdaInterval, r.tippingIntervalStatus, r.inputs.lambdaSearchLimit, 'interval')}.`);
  const b = r.bootstrap;
  out.push(`Bootstrap: ${b.requested} stratified resamples (seed ${b.seed}), ${b.used} used, ${b.failed} left out.`);
  out.push('');
  out.push(`Propensity model (logistic; ${r.propensityModel.iterations} iterations, ${r.propensityModel.converged ? 'converged' : 'NOT converged'}, deviance ${formatNumber(r.propensityModel.deviance, { significant: 6 })}):`);
  out.push(
    table(
      ['term', 'coefficient', 'standard error'],
      r.propensityModel.coefficients.map((k, i) => [k.name, formatNumber(k.value, { significant: 5 }), formatNumber(analysis.standardErrors[i], { significant: 4 })]),
    ),
  );
  out.push('');
  const o = r.overlap;
  out.push(
    `Overlap: estimated propensity ${formatNumber(o.treatedRange.smallest, { significant: 3 })} to ${formatNumber(o.treatedRange.largest, { significant: 3 })} among the treated, ` +
      `${formatNumber(o.controlRange.smallest, { significant: 3 })} to ${formatNumber(o.controlRange.largest, { significant: 3 })} among controls; ` +
      `${o.belowLow} people below ${o.lowThreshold}, ${o.aboveHigh} above ${o.highThreshold}.`,
  );
  out.push('Weights at Λ = 1 (before normalising):');
  out.push(table(['group', 'people', 'smallest', 'largest', 'mean', 'effective size', 'largest share'], [weightRow('treated', r.weights.treated), weightRow('control', r.weights.control)]));
  const warnings = [...(read?.warnings ?? []), ...r.warnings];
  if (warnings.length > 0) {
    out.push('');
    out.push('Warnings:');
    for (const w of warnings) out.push(`  - ${w}`);
  }
  out.push('');
  out.push('Conventions:');
  for (const line of r.conventions) out.push(`  - ${line.text}`);
  out.push('  - Coefficient standard errors: square roots of the diagonal of (XᵀWX)⁻¹, W = e(1 − e), as R\'s summary.glm.');
  out.push('');
  out.push('References:');
  for (const ref of r.references) out.push(`  - ${ref}`);
  out.push('');
  out.push(WEIGHTING_CAUTION);
  return out.join('\n') + '\n';
}

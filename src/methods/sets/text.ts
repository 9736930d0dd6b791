import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import { formatNumber, formatPValue } from '../../format/formatNumber';
import { formatAsTyped, formatEffect, formatGamma, formatGammaValue } from '../../format/gammaText';
import { outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import { PAIRS_CAUTION, alignTable, amplificationPhrase, formatCount, pPhrase } from '../pairs/text';

/** The caution that goes with every matched-sets report (the same words as for matched pairs). */
export const SETS_CAUTION = PAIRS_CAUTION;

/** The test in words: "m-statistic with Huber's ψ" or "count of treated events". */
export function setsTestName(result: Pick<MatchedSetsResult, 'outcomeKind'>): string {
  return result.outcomeKind === 'binary' ? 'test on the count of treated units with the event' : 'm-statistic test with Huber’s ψ';
}

/** "12 sets (1 to 4 controls each), 40 units". */
export function setsCountsPhrase(result: MatchedSetsResult): string {
  const c = result.counts;
  const controls = c.controlsPerSet.map((k) => k.controls);
  const range = controls.length === 0 ? '' : controls.length === 1 ? `${controls[0]} control${controls[0] === 1 ? '' : 's'} each` : `${controls[0]} to ${controls[controls.length - 1]} controls each`;
  return `${formatCount(c.setsUsed)} matched sets${range ? ` (${range})` : ''}, ${formatCount(c.units)} units`;
}

/**
 * The plain-language reading of a matched-sets result: where the finding tips (or that it is not significant
 * at Γ = 1, first), an amplification example, and what the estimate range shows.
 */
export function setsReading(result: MatchedSetsResult, study?: Partial<StudyLabels>): string[] {
  const sentences: string[] = [];
  const treatment = study?.exposure?.trim() || 'treatment';
  const direction = `${treatment} ${result.alternative === 'greater' ? 'raises' : 'lowers'} ${outcomeLabel(study)}`;
  const alpha = formatAsTyped(result.alpha);
  if (result.sensitivityStatus === 'not-significant') {
    sentences.push(
      `Even with no hidden bias, the ${setsTestName(result)} does not support the finding that ${direction} at α = ${alpha} (${pPhrase(result.pValue)} across ${formatCount(result.counts.setsUsed)} matched sets), so there is no significant finding for hidden bias to explain away.`,
    );
  } else if (result.sensitivityStatus === 'beyond-range') {
    sentences.push(
      `The finding that ${direction} stays significant at α = ${alpha} for every hidden bias searched, up to Γ = ${formatNumber(result.searchedUpTo, { significant: 3 })}: units of a matched set would have to differ in their odds of ${treatment} by more than that.`,
    );
  } else {
    const gamma = formatGamma(result.sensitivityValue);
    sentences.push(
      `The finding that ${direction} (${setsTestName(result)}, ${pPhrase(result.pValue)} with no hidden bias) holds at α = ${alpha} unless a hidden covariate makes units of a matched set differ in their odds of ${treatment} by a factor of more than ${gamma} (Γ = ${gamma}).`,
    );
    const pairs = result.amplification.slice(0, 2);
    if (pairs.length > 0) {
      sentences.push(`Put another way (amplification), Γ = ${gamma} corresponds for instance to ${pairs.map((p) => amplificationPhrase(p, study, result.alternative)).join(', or to ')}.`);
    }
  }
  const last = result.rows.length > 0 ? result.rows[result.rows.length - 1] : null;
  if (result.estimate !== null && last && last.estimateLow !== null && last.estimateHigh !== null) {
    sentences.push(
      `With no hidden bias the m-estimate of the effect is ${formatEffect(result.estimate, study)}; allowing bias up to Γ = ${formatGammaValue(last.gamma)}, the estimate could lie anywhere from ${formatEffect(last.estimateLow, study)} to ${formatEffect(last.estimateHigh, study)}, with a ${formatAsTyped(result.intervalLevel * 100)}% sensitivity interval from ${limit(last.intervalLow, study)} to ${limit(last.intervalHigh, study)}. The interval is two-sided (${formatAsTyped((result.alpha * 100) / 2)}% in each tail).`,
    );
  }
  return sentences;
}

/** An interval end: "unbounded" when the analysis found none (null). */
function limit(x: number | null, study?: Partial<StudyLabels>): string {
  return x === null ? 'unbounded' : formatEffect(x, study);
}

/** The sensitivity table as header + formatted rows (shared by the command line and the page); units go in the header. */
export function setsTable(result: MatchedSetsResult, study?: Partial<StudyLabels>): { header: string[]; rows: string[][] } {
  const withEstimates = result.outcomeKind === 'continuous';
  const header = ['Γ', 'worst-case p', 'best-case p'];
  const units = study?.units?.trim() ? ` (${study.units.trim()})` : '';
  if (withEstimates) header.push(`smallest effect estimate${units}`, `largest effect estimate${units}`, `${formatAsTyped(result.intervalLevel * 100)}% interval${units}`);
  const rows = result.rows.map((row) => {
    const cells = [formatGammaValue(row.gamma), formatPValue(row.pUpper), formatPValue(row.pLower)];
    if (withEstimates) cells.push(formatEffect(row.estimateLow), formatEffect(row.estimateHigh), `${limit(row.intervalLow)} to ${limit(row.intervalHigh)}`);
    return cells;
  });
  return { header, rows };
}

/** The tipping Γ in words for a headline: "1.611", "none (not significant at Γ = 1)", "above 100 (…)". */
export function setsTippingText(result: MatchedSetsResult): string {
  return result.sensitivityStatus === 'found'
    ? formatGamma(result.sensitivityValue)
    : result.sensitivityStatus === 'not-significant'
      ? 'none (not significant at Γ = 1)'
      : `above ${formatNumber(result.searchedUpTo, { significant: 3 })} (the largest Γ searched)`;
}

/**
 * The result as one JSON-ready object, in the shape of `lurk pairs --json` (method, alternative, alpha, rows of
 * {gamma, pUpper, pLower}, estimate, intervalLevel, estimates, amplification, warnings, notes, references) plus
 * what matched sets add (outcome kind, counts, σ, c, the bounds' expectation and variance, conventions).
 */
export function setsResultJson(result: MatchedSetsResult): Record<string, unknown> {
  return {
    method: result.method,
    outcomeKind: result.outcomeKind,
    outcomeKindReason: result.outcomeKindReason,
    alternative: result.alternative,
    alpha: result.alpha,
    tailMethod: result.tail,
    counts: result.counts,
    scale: result.scale,
    trim: result.trim,
    statistic: result.statistic,
    pValue: result.pValue,
    sensitivityValue: result.sensitivityValue,
    sensitivityStatus: result.sensitivityStatus,
    searchedUpTo: result.searchedUpTo,
    rows: result.rows.map((r) => ({ gamma: r.gamma, pUpper: r.pUpper, pLower: r.pLower, expectation: r.expectation, variance: r.variance })),
    estimate: result.estimate,
    conventions: result.conventions,
    intervalLevel: result.intervalLevel,
    estimates:
      result.outcomeKind === 'continuous'
        ? result.rows.map((r) => ({ gamma: r.gamma, estimateLow: r.estimateLow, estimateHigh: r.estimateHigh, intervalLow: r.intervalLow, intervalHigh: r.intervalHigh }))
        : [],
    amplification: result.amplification.map((a) => ({ lambda: a.lambda, delta: a.delta })),
    warnings: result.warnings,
    notes: [
      'intervalLow/intervalHigh are null when the interval is unbounded at that Γ.',
      'estimate, estimates, scale and trim are null or empty for a binary outcome (the test counts treated events).',
    ],
    references: result.references,
  };
}

/** The readable command-line report, every convention of the computation stated. */
export function setsReportText(result: MatchedSetsResult, study?: Partial<StudyLabels>): string {
  const c = result.counts;
  const lines: string[] = [];
  lines.push(`Matched sets: ${result.method}`);
  let used = `${setsCountsPhrase(result)} used, of ${formatCount(c.setsGiven)} sets and ${formatCount(c.rows)} rows given`;
  if (c.missingOutcomes > 0) used += `; ${formatCount(c.missingOutcomes)} rows without an outcome left out`;
  lines.push(`${used}.`);
  lines.push(`Outcome: ${result.outcomeKindReason}.`);
  if (result.outcomeKind === 'binary') {
    lines.push(`Informative sets: ${formatCount(c.informativeSets ?? 0)}; sets with no or every unit with the event: ${formatCount(c.uninformativeSets ?? 0)}. T = ${formatCount(result.statistic)} treated units with the event.`);
  } else {
    lines.push(`Scale σ = ${formatNumber(result.scale, { significant: 4 })}, c = ${formatAsTyped(result.trim)}; T = ${formatNumber(result.statistic, { significant: 4 })}.`);
  }
  lines.push(
    `Alternative: treatment ${result.alternative === 'greater' ? 'raises' : 'lowers'} the outcome (one-sided), α = ${formatAsTyped(result.alpha)}. Tails: ${result.tail === 'exact' ? 'exact' : 'normal approximation'}.`,
  );
  lines.push('');
  lines.push(`Tipping Γ (sensitivity value): ${setsTippingText(result)}`);
  lines.push(`p-value with no hidden bias: ${formatPValue(result.pValue)}`);
  if (result.estimate !== null) lines.push(`m-estimate of the effect (Γ = 1): ${formatEffect(result.estimate, study)}`);
  lines.push('');
  const table = setsTable(result, study);
  lines.push(alignTable(table.header, table.rows));
  lines.push('');
  for (const sentence of setsReading(result, study)) lines.push(sentence);
  for (const warning of result.warnings) lines.push(`Note: ${warning}`);
  lines.push('');
  lines.push('Conventions:');
  for (const convention of result.conventions) lines.push(`- ${convention.text}`);
  lines.push('');
  lines.push('References:');
  for (const reference of result.references) lines.push(`- ${reference}`);
  lines.push('');
  lines.push(SETS_CAUTION);
  return lines.join('\n') + '\n';
}

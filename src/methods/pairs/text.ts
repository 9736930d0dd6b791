import type { PairsResult } from '../../core/pairsAnalysis';
import type { AmplifiedPair } from '../../core/amplification';
import { echoTyped, formatNumber, formatPValue, pValueClause, withoutRoundingNoise } from '../../format/formatNumber';
import { outcomeLabel, unitsSuffix, type StudyLabels } from '../../format/studyLabels';
import { formatAsTyped, formatEffect, formatGamma, formatGammaValue } from '../../format/gammaText';

/** The caution that goes with every matched-pairs report. */
export const PAIRS_CAUTION =
  'A sensitivity analysis bounds how strong hidden bias would have to be; it does not prove causation. ' +
  'Decisions about health or safety defer to domain experts, local guidance and licensed practice.';

export { formatAsTyped, formatEffect, formatGamma, formatGammaValue } from '../../format/gammaText';

/** A count or rank sum with thousands separators ("1,000,000"; a half-integer keeps its ".5"). */
export function formatCount(x: number): string {
  if (!Number.isFinite(x)) return 'not available';
  return x.toLocaleString('en-US', { maximumFractionDigits: 1 });
}

/** "p = 0.0123" or "p < 0.0001" (never "p = < 0.0001"). */
export function pPhrase(p: number): string {
  return pValueClause(p);
}

/** The largest magnitude among a result's estimates and interval limits: the data's scale for rounding noise. */
function estimateScale(result: Pick<PairsResult, 'estimate' | 'estimates'>): number {
  let scale = Math.abs(result.estimate ?? 0);
  for (const e of result.estimates) {
    for (const x of [e.estimateLow, e.estimateHigh, e.intervalLow, e.intervalHigh]) if (Number.isFinite(x)) scale = Math.max(scale, Math.abs(x));
  }
  return scale;
}

/** The Hodges–Lehmann estimate at Γ = 1 without floating-point noise (a zero effect computed as −4.44e-16 is 0). */
export function cleanEstimate(result: Pick<PairsResult, 'estimate' | 'estimates'>): number | null {
  return result.estimate === null ? null : withoutRoundingNoise(result.estimate, estimateScale(result));
}

/**
 * Whether the data point against the alternative tested: a Hodges–Lehmann estimate of the other sign, or (without
 * an estimate) fewer pairs favouring the alternative than against it.
 */
export function pointsOtherWay(result: Pick<PairsResult, 'alternative' | 'estimate' | 'estimates' | 'favourable' | 'nonZero'>): boolean {
  const estimate = cleanEstimate(result);
  if (estimate !== null) return result.alternative === 'greater' ? estimate < 0 : estimate > 0;
  return result.favourable < result.nonZero - result.favourable;
}

/** The treatment as the odds sentence needs it ("treatment" when no label was given). */
function treatmentWords(study?: Partial<StudyLabels>): string {
  return study?.exposure?.trim() || 'treatment';
}

/** The outcome after "a higher" ("outcome" when no label was given). */
function outcomeWords(study?: Partial<StudyLabels>): string {
  return study?.outcome?.trim() || 'outcome';
}

/** "triples", "doubles", or "multiplies … by 7.5": a factor on the odds in words. */
export function factorWords(factor: number): { verb: string; by: string } {
  const rounded = Math.round(factor * 10) / 10;
  if (rounded === 2) return { verb: 'doubles', by: '' };
  if (rounded === 3) return { verb: 'triples', by: '' };
  if (rounded === 4) return { verb: 'quadruples', by: '' };
  return { verb: 'multiplies', by: ` by ${factor >= 1e6 ? formatNumber(factor, { significant: 2 }) : String(Number(factor.toPrecision(factor < 10 ? 2 : 3)))}` };
}

/** One amplification pair as a sentence fragment. */
export function amplificationPhrase(pair: AmplifiedPair, study?: Partial<StudyLabels>, alternative: 'greater' | 'less' = 'greater'): string {
  const side = alternative === 'greater' ? 'higher' : 'lower';
  const treat = factorWords(pair.lambda);
  const out = factorWords(pair.delta);
  const treatment = treat.verb === 'multiplies' ? `multiplies the odds of ${treatmentWords(study)}${treat.by}` : `${treat.verb} the odds of ${treatmentWords(study)}`;
  const outcome = out.verb === 'multiplies' ? `multiplies the odds of a ${side} ${outcomeWords(study)}${out.by}` : `${out.verb} the odds of a ${side} ${outcomeWords(study)}`;
  return `a covariate that ${treatment} and ${outcome}`;
}

/**
 * The plain-language reading of a matched-pairs result: what Γ means here, where the finding tips, an
 * amplification example, and what the estimate range shows.
 */
export function pairsReading(result: PairsResult, study?: Partial<StudyLabels>, typedAlpha?: string): string[] {
  const sentences: string[] = [];
  const testName = result.test === 'signrank' ? 'Wilcoxon signed-rank test' : 'sign test';
  const direction =
    result.alternative === 'greater' ? `${treatmentWords(study)} raises ${outcomeLabel(study)}` : `${treatmentWords(study)} lowers ${outcomeLabel(study)}`;
  const alpha = echoTyped(result.alpha, typedAlpha, formatAsTyped);
  if (result.sensitivityStatus === 'not-significant' && pointsOtherWay(result)) {
    const estimate = cleanEstimate(result);
    const other = result.alternative === 'greater' ? 'lowers' : 'raises';
    sentences.push(
      `The data point the other way: ${estimate !== null ? `the Hodges–Lehmann estimate is ${formatEffect(estimate, study)}` : `only ${formatCount(result.favourable)} of ${formatCount(result.nonZero)} informative pairs favour it`}, ` +
        `so the ${testName} gives no support to the finding that ${direction} (${pPhrase(result.pValue)}, as expected when the data lean the opposite way). ` +
        `To examine the opposite direction, that ${treatmentWords(study)} ${other} ${outcomeLabel(study)}, choose the alternative "${result.alternative === 'greater' ? 'less' : 'greater'}"; decide the direction from the study's question, not from these data.`,
    );
  } else if (result.sensitivityStatus === 'not-significant') {
    sentences.push(
      `Even with no hidden bias, the ${testName} does not support the finding that ${direction} at α = ${alpha} (${pPhrase(result.pValue)} across ${formatCount(result.nonZero)} informative pairs), so there is no significant finding for hidden bias to explain away.`,
    );
  } else if (result.sensitivityStatus === 'beyond-range') {
    sentences.push(
      `The finding that ${direction} stays significant at α = ${alpha} for every hidden bias searched, up to Γ = ${formatNumber(result.searchedUpTo, { significant: 3 })}: matched units would have to differ in their odds of ${treatmentWords(study)} by more than that.`,
    );
  } else {
    const gamma = formatGamma(result.sensitivityValue);
    sentences.push(
      `The finding that ${direction} (${testName}, ${pPhrase(result.pValue)} with no hidden bias) holds at α = ${alpha} unless a hidden covariate makes matched units differ in their odds of ${treatmentWords(study)} by a factor of more than ${gamma} (Γ = ${gamma}).`,
    );
    if (result.test === 'signrank' && result.signTestSensitivityValue !== null) {
      sentences.push(`The sign test, which uses only the direction of each difference, tips at Γ = ${formatGamma(result.signTestSensitivityValue)}.`);
    }
    const pairs = result.amplification.slice(0, 2);
    if (pairs.length > 0) {
      sentences.push(
        `Put another way (amplification), Γ = ${gamma} corresponds for instance to ${pairs.map((p) => amplificationPhrase(p, study, result.alternative)).join(', or to ')}.`,
      );
    }
  }
  const raw = result.estimates.length > 0 ? result.estimates[result.estimates.length - 1] : null;
  const scale = estimateScale(result);
  const last = raw
    ? { ...raw, ...Object.fromEntries((['estimateLow', 'estimateHigh', 'intervalLow', 'intervalHigh'] as const).map((k) => [k, withoutRoundingNoise(raw[k], scale)])) }
    : null;
  if (result.estimate !== null && last) {
    sentences.push(
      `With no hidden bias the Hodges–Lehmann estimate of the effect is ${formatEffect(cleanEstimate(result), study)}; allowing bias up to Γ = ${formatGammaValue(last.gamma)}, the estimate could lie anywhere from ${formatEffect(last.estimateLow, study)} to ${formatEffect(last.estimateHigh, study)}, with a ${formatAsTyped(result.intervalLevel * 100)}% sensitivity interval from ${formatEffect(last.intervalLow, study)} to ${formatEffect(last.intervalHigh, study)}. The interval is two-sided (${formatAsTyped((result.alpha * 100) / 2)}% in each tail), so it can reach no effect at a somewhat smaller Γ than the one-sided test.`,
    );
  }
  return sentences;
}

/** The result as one JSON-ready object (infinite interval limits become null, noted in `notes`). */
export function pairsResultJson(result: PairsResult): Record<string, unknown> {
  const scale = estimateScale(result);
  const finite = (x: number) => (Number.isFinite(x) ? withoutRoundingNoise(x, scale) : null);
  return {
    method: result.method,
    test: result.test,
    alternative: result.alternative,
    alpha: result.alpha,
    tailMethod: result.tailMethod,
    tailMethodReason: result.tailMethodReason,
    continuityCorrection: result.continuityCorrection,
    n: result.n,
    droppedRows: result.droppedRows,
    zeroDifferences: result.zeroDifferences,
    nonZero: result.nonZero,
    favourable: result.favourable,
    statistic: result.statistic,
    pValue: result.pValue,
    pointsOtherWay: pointsOtherWay(result),
    sensitivityValue: result.sensitivityValue,
    sensitivityStatus: result.sensitivityStatus,
    searchedUpTo: result.searchedUpTo,
    signTestSensitivityValue: result.signTestSensitivityValue,
    rows: result.rows.map((r) => ({ gamma: r.gamma, pUpper: r.pUpper, pLower: r.pLower })),
    estimate: cleanEstimate(result),
    zeroRule: result.zeroRule,
    tieTolerance: result.tieTolerance,
    conventions: result.conventions,
    intervalLevel: result.intervalLevel,
    estimates: result.estimates.map((e) => ({
      gamma: e.gamma,
      estimateLow: finite(e.estimateLow),
      estimateHigh: finite(e.estimateHigh),
      intervalLow: finite(e.intervalLow),
      intervalHigh: finite(e.intervalHigh),
    })),
    amplification: result.amplification.map((a) => ({ lambda: a.lambda, delta: a.delta })),
    warnings: result.warnings,
    notes: ['intervalLow/intervalHigh are null when the interval is unbounded (too few pairs for this α and Γ).'],
    references: result.references,
  };
}

/** Pads a table to aligned columns (plain text). */
export function alignTable(header: string[], rows: string[][]): string {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (cells: string[]) => cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join('  ');
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

/** The sensitivity table as header + formatted rows (shared by the command line and the page); units go in the header. */
export function pairsTable(result: PairsResult, study?: Partial<StudyLabels>): { header: string[]; rows: string[][] } {
  const withEstimates = result.estimates.length === result.rows.length && result.estimates.length > 0;
  const header = ['Γ', 'worst-case p', 'best-case p'];
  const units = study?.units?.trim() ? ` (${study.units.trim()})` : '';
  if (withEstimates) header.push(`smallest effect estimate${units}`, `largest effect estimate${units}`, `${formatAsTyped(result.intervalLevel * 100)}% interval${units}`);
  const scale = estimateScale(result);
  const rows = result.rows.map((row, i) => {
    const cells = [formatGammaValue(row.gamma), formatPValue(row.pUpper), formatPValue(row.pLower)];
    if (withEstimates) {
      const e = result.estimates[i];
      const tidy = (x: number) => formatEffect(withoutRoundingNoise(x, scale));
      cells.push(tidy(e.estimateLow), tidy(e.estimateHigh), `${tidy(e.intervalLow)} to ${tidy(e.intervalHigh)}`);
    }
    return cells;
  });
  return { header, rows };
}

/** The readable command-line report. */
export function pairsReportText(result: PairsResult, study?: Partial<StudyLabels>, typedAlpha?: string): string {
  const lines: string[] = [];
  lines.push(`Matched pairs: ${result.method}`);
  const used = `${formatCount(result.n)} pairs used` + (result.droppedRows > 0 ? ` (${formatCount(result.droppedRows)} rows with a missing value left out)` : '');
  const informative =
    result.test === 'signrank'
      ? `${formatCount(result.nonZero)} non-zero differences, ${formatCount(result.zeroDifferences)} zero; T = ${formatCount(result.statistic)}`
      : `${formatCount(result.nonZero)} informative (discordant or non-tied) pairs, ${formatCount(result.favourable)} favouring the alternative`;
  lines.push(`${used}; ${informative}.`);
  lines.push(
    `Alternative: treatment ${result.alternative === 'greater' ? 'raises' : 'lowers'} the outcome (one-sided), α = ${echoTyped(result.alpha, typedAlpha, formatAsTyped)}. Tails: ${result.tailMethodReason}${result.tailMethod === 'normal' && result.continuityCorrection ? ', with a ½ continuity correction' : ''}.`,
  );
  lines.push('');
  const tipping =
    result.sensitivityStatus === 'found'
      ? formatGamma(result.sensitivityValue)
      : result.sensitivityStatus === 'not-significant'
        ? 'none (not significant at Γ = 1)'
        : `above ${formatNumber(result.searchedUpTo, { significant: 3 })} (the largest Γ searched)`;
  lines.push(`Tipping Γ (sensitivity value): ${tipping}`);
  if (result.test === 'signrank') lines.push(`Sign test tipping Γ, for comparison: ${result.signTestSensitivityValue === null ? 'none' : formatGamma(result.signTestSensitivityValue)}`);
  if (result.estimate !== null) lines.push(`Hodges–Lehmann estimate (Γ = 1): ${formatEffect(cleanEstimate(result), study)}`);
  lines.push('');
  const table = pairsTable(result, study);
  lines.push(alignTable(table.header, table.rows));
  lines.push('');
  for (const sentence of pairsReading(result, study, typedAlpha)) lines.push(sentence);
  for (const warning of result.warnings) lines.push(`Note: ${warning}`);
  lines.push('', 'Conventions:');
  for (const c of result.conventions) lines.push(`  - ${c.text}`);
  lines.push('');
  lines.push(PAIRS_CAUTION);
  return lines.join('\n') + '\n';
}

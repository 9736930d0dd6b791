import type { OvbBenchmarkRow, OvbResult } from '../../core/ovbAnalysis';
import { echoTyped, formatNumber, formatPercent, withoutRoundingNoise } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, unitsSuffix, type StudyLabels } from '../../format/studyLabels';
import { jsonReading } from '../jsonReading';

/** The caution that goes with every omitted-variable-bias report. */
export const OVB_CAUTION =
  'A sensitivity analysis bounds how strong hidden confounding would have to be; it does not prove causation. ' +
  'Decisions about health or safety defer to domain experts, local guidance and licensed practice.';

/** A setting such as k, q, α or df: whole numbers as they are, others with up to 4 significant digits, no trailing zeros. */
export function plainNumber(x: number): string {
  if (Number.isInteger(x) && Math.abs(x) < 1e15) return String(x);
  const text = formatNumber(x, { significant: 4 });
  return /^-?\d+\.\d+$/.test(text) ? text.replace(/\.?0+$/, '') : text;
}

/** What the confounder is asked to do, in words: "bring the estimate to zero" or "reduce the estimate by 50%". */
export function ovbGoalText(q: number): string {
  if (q === 1) return 'bring the estimate to zero';
  if (q > 1) return `push the estimate past zero, to ${plainNumber(1 - q)} times itself`;
  return `reduce the estimate by ${formatPercent(q, 0)}`;
}

/**
 * The benchmark row of the strongest measured covariate: the core's `strongestCovariate` (one rule, see
 * STRONGEST_COVARIATE_RULE), its row at k_D = k_Y = 1 when there is one; null when the core names none.
 */
export function strongestBenchmark(result: Pick<OvbResult, 'benchmarks' | 'strongestCovariate'>): OvbBenchmarkRow | null {
  if (result.strongestCovariate === null) return null;
  const rows = result.benchmarks.filter((b) => b.covariate === result.strongestCovariate);
  return rows.find((b) => b.kTreatment === 1 && b.kOutcome === 1) ?? rows[0] ?? null;
}

/** Why a capped bound says nothing, in words a reader can use (no "standard error 0, t not available"). */
export const CAPPED_BOUND_WORDS =
  'a confounder this strong could account for all of the outcome’s remaining variation (its bound on the share of the outcome’s residual variance is capped at 100%), so the adjusted estimate’s precision, and with it its significance, cannot be judged';

/** Why a benchmark bound is not informative, in words: the capped case in {@link CAPPED_BOUND_WORDS}, else the core's reason. */
export function notInformativeWords(row: Pick<OvbBenchmarkRow, 'unavailable' | 'reason' | 'informative'>): string {
  if (row.informative) return '';
  return row.unavailable === null ? CAPPED_BOUND_WORDS : (row.reason ?? row.unavailable);
}

/** The result's warnings as shown to people: a capped bound's note says why in words, not "standard error 0, t not available". */
export function shownWarnings(result: Pick<OvbResult, 'warnings'>): string[] {
  return result.warnings.map((w) => w.replace(/, ?\(adjusted standard error 0, (?:so no adjusted t|adjusted t not available)\)\.$/, `: ${CAPPED_BOUND_WORDS}.`));
}

/** Whether the estimate is statistically significant before any adjustment (|t| above the threshold). */
export function significantBeforeAdjustment(result: Pick<OvbResult, 't' | 'criticalT'>): boolean {
  return Math.abs(result.t) > result.criticalT;
}

/** "5%" for α = 0.05, "0.5%" for α = 0.005. */
function levelText(alpha: number): string {
  return formatPercent(alpha, alpha * 100 < 1 ? 1 : 0);
}

/**
 * What one benchmark bound does, in a sentence that agrees with its numbers: not informative (capped), enough to
 * reach the goal, enough to take away significance (adjusted |t| at or below the threshold), or neither.
 */
export function benchmarkSentence(result: OvbResult, row: OvbBenchmarkRow): string {
  const who = `a confounder ${multipleWords(row)} ${row.covariate}`;
  if (!row.informative) return `For ${who}, this bound is not informative: ${notInformativeWords(row)}.`;
  const adjusted = formatNumber(withoutRoundingNoise(row.correctedEstimate, Math.abs(result.estimate)), { significant: 3 });
  if (result.direction === 'toward-zero' && overturned(result, row)) {
    return `${capitalise(who)} would be enough to ${ovbGoalText(result.q)} (adjusted estimate ${adjusted}).`;
  }
  if (result.seKind !== 'classical') {
    return `${capitalise(who)} would leave an adjusted estimate of ${adjusted}; its t is not shown, because the standard error is ${result.seKind === 'unknown' ? 'of unknown kind' : result.seKind} and the adjusted t assumes a classical one.`;
  }
  const t = formatNumber(row.correctedT, { digits: 2 });
  const threshold = formatNumber(result.criticalT, { digits: 2 });
  if (!significantBeforeAdjustment(result)) {
    return `${capitalise(who)} would leave an adjusted estimate of ${adjusted} (t = ${t}); the estimate was not statistically significant at the ${levelText(result.alpha)} level to begin with.`;
  }
  if (Math.abs(row.correctedT) <= result.criticalT) {
    return `${capitalise(who)} would leave an adjusted estimate of ${adjusted}, but with t = ${t}, at or below the ${threshold} needed at the ${levelText(result.alpha)} level: the estimate would no longer be statistically significant.`;
  }
  return `Even ${who} would leave an adjusted estimate of ${adjusted}, still statistically significant at the ${levelText(result.alpha)} level (t = ${t}, above ${threshold}).`;
}

/**
 * The plain-language reading of the analysis: how strong a confounder would have to be, compared with the
 * strongest measured covariate; a few sentences, every number formatted for people. When the estimate is not
 * significant before any adjustment, that comes first.
 */
export function ovbReading(result: OvbResult, study?: Partial<StudyLabels>): string[] {
  const parts = ovbReadingParts(result, study);
  return [...(parts.notSignificant ? [parts.notSignificant] : []), parts.estimate, parts.headline, ...parts.comparison];
}

/** The reading in its parts, for a page that lays them out: see {@link ovbReading} for the order. */
export interface OvbReadingParts {
  /** Said first when the estimate is not significant before any adjustment; else null. */
  readonly notSignificant: string | null;
  /** The estimate, its SE, t, df and partial R². */
  readonly estimate: string;
  /** How strong a confounder would have to be (the robustness values). */
  readonly headline: string;
  /** The strongest measured covariate and what a confounder like it would do. */
  readonly comparison: readonly string[];
}

export function ovbReadingParts(result: OvbResult, study?: Partial<StudyLabels>): OvbReadingParts {
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const sentences: string[] = [];
  const level = levelText(result.alpha);
  const significant = significantBeforeAdjustment(result);
  let notSignificant: string | null = null;
  if (!significant) {
    notSignificant = (
      `Even before any adjustment for hidden confounding, the estimate is not statistically significant at the ${level} level (t = ${formatNumber(result.t, { digits: 2 })}, threshold ${formatNumber(result.criticalT, { digits: 2 })}): the data are compatible with no effect of ${exposure} on ${outcome}.`
    );
  }
  sentences.push(
    `The estimate of ${formatNumber(result.estimate, { significant: 4 })}${unitsSuffix(study)} (standard error ${formatNumber(result.se, {
      significant: 3,
    })}, t = ${formatNumber(result.t, { digits: 2 })}, ${plainNumber(result.df)} residual degrees of freedom) means that ${exposure} explains ${formatPercent(result.partialR2)} of the residual variance of ${outcome}.`,
  );
  if (result.direction === 'away-from-zero') {
    sentences.push(
      `You assumed the confounding pushes the estimate away from zero, so removing it would make the estimate larger, never zero. For confounding toward zero: a hidden confounder would have to explain at least ${formatPercent(result.rv)} of the residual variance of both ${exposure} and ${outcome} to ${ovbGoalText(result.q)}.`,
    );
  } else {
    sentences.push(
      `A hidden confounder would have to explain at least ${formatPercent(result.rv)} of the residual variance of both ${exposure} and ${outcome} to ${ovbGoalText(result.q)}` +
        (significant && result.rvAlpha > 0 ? `, and at least ${formatPercent(result.rvAlpha)} of both to make it lose statistical significance at the ${level} level.` : '.'),
    );
  }
  const strongest = strongestBenchmark(result);
  if (strongest) {
    const both = Number.isFinite(strongest.r2dxj)
      ? `explains ${formatPercent(strongest.r2dxj)} of the residual variance of ${exposure} and ${formatPercent(strongest.r2yxj)} of that of ${outcome}`
      : `explains ${formatPercent(strongest.r2yxj)} of the residual variance of ${outcome} (its association with ${exposure} is not known)`;
    sentences.push(`The strongest measured covariate, ${strongest.covariate}, ${both}.`);
    const bounds = result.benchmarks.filter((b) => b.covariate === strongest.covariate);
    const flips = result.direction === 'toward-zero' ? bounds.find((b) => b.informative && overturned(result, b)) : undefined;
    if (flips) sentences.push(benchmarkSentence(result, flips));
    else if (bounds.length > 0) sentences.push(benchmarkSentence(result, bounds[bounds.length - 1]));
  }
  const [estimate, headline, ...comparison] = sentences;
  return Object.freeze({ notSignificant, estimate, headline, comparison: Object.freeze(comparison) });
}

/** "as strong as" for k = 1, "2 times as strong as" otherwise; separate multiples named for each side. */
function multipleWords(row: Pick<OvbBenchmarkRow, 'k' | 'kOutcome'>): string {
  if (row.kOutcome !== undefined && row.kOutcome !== row.k) {
    return `${plainNumber(row.k)} times as strongly related to the treatment and ${plainNumber(row.kOutcome)} times to the outcome as`;
  }
  return timesAsStrong(row.k);
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** "as strong as" for k = 1, "2 times as strong as" otherwise. */
function timesAsStrong(k: number): string {
  return k === 1 ? 'as strong as' : `${plainNumber(k)} times as strong as`;
}

/** Whether a bound's adjusted estimate has reached the threshold (1 − q)·estimate. */
function overturned(result: OvbResult, row: OvbBenchmarkRow): boolean {
  const sign = result.estimate < 0 ? -1 : 1;
  return sign * (row.correctedEstimate - result.threshold) <= 0;
}

/** A readable multi-line report for the command line, ending with the caution. */
export function ovbReport(
  result: OvbResult,
  options: {
    study?: Partial<StudyLabels>;
    dataNote?: string;
    typed?: { readonly estimate?: string; readonly se?: string; readonly q?: string; readonly alpha?: string };
  } = {},
): string {
  const lines: string[] = [];
  lines.push('Omitted-variable bias: how strong would a hidden confounder have to be?', '');
  if (options.dataNote) lines.push(options.dataNote, '');
  const pct = (x: number) => formatPercent(x, 1);
  lines.push(
    `  estimate              ${echoTyped(result.estimate, options.typed?.estimate, (x) => formatNumber(x, { significant: 6 }))}`,
    `  standard error        ${echoTyped(result.se, options.typed?.se, (x) => formatNumber(x, { significant: 6 }))}`,
    `  t                     ${formatNumber(result.t, { digits: 3 })}`,
    `  residual df           ${plainNumber(result.df)}`,
    '',
    `  partial R² of the treatment with the outcome   ${pct(result.partialR2)}`,
    `  robustness value RV (q = ${echoTyped(result.q, options.typed?.q, (x) => plainNumber(x as number))})`.padEnd(49) + pct(result.rv),
    `  robustness value at α = ${echoTyped(result.alpha, options.typed?.alpha, (x) => plainNumber(x as number))}`.padEnd(49) + pct(result.rvAlpha),
  );
  if (result.scenario) {
    const s = result.scenario;
    lines.push(
      '',
      `  With a confounder's partial R² of ${pct(s.r2dz)} with the treatment and ${pct(s.r2yz)} with the outcome: adjusted estimate ${formatNumber(withoutRoundingNoise(s.correctedEstimate, Math.abs(result.estimate)), {
        significant: 4,
      })}, SE ${formatNumber(s.correctedSe, { significant: 4 })}, t ${formatNumber(s.correctedT, { digits: 2 })}`,
    );
  }
  if (result.benchmarks.length > 0) {
    const separate = result.benchmarks.some((b) => b.kOutcome !== b.k);
    lines.push('', separate ? 'Bounds on a confounder some times as strong as a measured covariate (treatment side : outcome side):' : 'Bounds on a confounder some times as strong as a measured covariate:');
    const header = ['covariate', separate ? 'times (treatment:outcome)' : 'times as strong', 'R² with treatment', 'R² with outcome', 'adjusted estimate', 'adjusted SE', 'adjusted t'];
    const kCell = (b: OvbBenchmarkRow) => (separate ? `${plainNumber(b.k)}:${plainNumber(b.kOutcome)}` : plainNumber(b.k));
    const tShown = result.seKind === 'classical';
    const rows = result.benchmarks.map((b) =>
      b.unavailable !== null
        ? [b.covariate, kCell(b), '—', '—', `not available: ${b.unavailable}`, '', '']
        : !b.informative
          ? [b.covariate, kCell(b), pct(b.r2dz), `${pct(b.r2yz)} (capped)`, formatNumber(withoutRoundingNoise(b.correctedEstimate, Math.abs(result.estimate)), { significant: 4 }), '—', '—']
          : [
              b.covariate,
              kCell(b),
              pct(b.r2dz),
              pct(b.r2yz),
              formatNumber(withoutRoundingNoise(b.correctedEstimate, Math.abs(result.estimate)), { significant: 4 }),
              tShown ? formatNumber(b.correctedSe, { significant: 4 }) : '—',
              tShown ? formatNumber(b.correctedT, { digits: 2 }) : '—',
            ],
    );
    const widths = header.map((h, c) => Math.max(h.length, ...rows.filter((r) => r[5] !== '').map((r) => r[c].length)));
    const fmt = (cells: string[]) => '  ' + cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join('  ').trimEnd();
    lines.push(fmt(header));
    for (const r of rows) lines.push(r[5] === '' ? `  ${r[0].padEnd(widths[0])}  ${r[1].padStart(widths[1])}  ${r[4]}` : fmt(r));
    for (const b of result.benchmarks) {
      if (b.unavailable === null && !b.informative) lines.push(`  ${b.covariate} (${kCell(b)}): this bound is not informative: ${notInformativeWords(b)}.`);
    }
    if (!tShown) lines.push(`  Adjusted SE and t are not shown: the standard error is ${result.seKind === 'unknown' ? 'of unknown kind' : result.seKind}, and they assume a classical one.`);
    if (result.strongestCovariate !== null) lines.push(`  Strongest measured covariate: ${result.strongestCovariate}`);
  }
  if (result.direction === 'toward-zero') {
    lines.push('', `Extreme scenarios (the confounder's partial R² with the treatment needed to ${ovbGoalText(result.q)}):`);
    for (const e of result.extremeScenarios) {
      lines.push(`  if the confounder explained ${formatPercent(e.r2yz, 0)} of the outcome's residual variance: ${pct(e.r2dzToReach)}`);
    }
  }
  lines.push('', ...ovbReading(result, options.study));
  if (result.warnings.length > 0) lines.push('', ...shownWarnings(result).map((w) => `Note: ${w}`));
  lines.push('', 'Conventions:', ...result.conventions.map((c) => `  - ${c.text}`));
  lines.push('', OVB_CAUTION, '');
  return lines.join('\n');
}

/** The JSON form (numbers that are not finite become null). */
export function ovbJson(result: OvbResult, extra: Record<string, unknown> = {}): string {
  const benchmarks = result.benchmarks.map((b) => ({
    covariate: b.covariate,
    k: b.k,
    kTreatment: b.kTreatment,
    kOutcome: b.kOutcome,
    r2dz: b.r2dz,
    r2yz: b.r2yz,
    correctedEstimate: b.correctedEstimate,
    correctedSe: b.correctedSe,
    correctedT: b.correctedT,
    r2dxj: b.r2dxj,
    r2yxj: b.r2yxj,
    capped: b.capped,
    unavailable: b.unavailable,
    informative: b.informative,
    reason: b.informative ? null : notInformativeWords(b),
    sentence: benchmarkSentence(result, b),
  }));
  const body = {
    estimate: result.estimate,
    se: result.se,
    t: result.t,
    df: result.df,
    partialR2: result.partialR2,
    rv: result.rv,
    rvAlpha: result.rvAlpha,
    q: result.q,
    alpha: result.alpha,
    direction: result.direction,
    criticalT: result.criticalT,
    significantBeforeAdjustment: significantBeforeAdjustment(result),
    seKind: result.seKind,
    kOutcome: result.kOutcome,
    strongestCovariate: result.strongestCovariate,
    conventions: result.conventions,
    benchmarks,
    extremeScenarios: result.extremeScenarios,
    scenario: result.scenario,
    ...extra,
    reading: jsonReading(ovbReading(result)),
    warnings: shownWarnings(result),
    method: result.method,
    references: result.references,
    caution: OVB_CAUTION,
  };
  return JSON.stringify(body, (_key, value) => (typeof value === 'number' && !Number.isFinite(value) ? null : value), 2) + '\n';
}

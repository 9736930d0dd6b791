import type { OvbBenchmarkRow, OvbResult } from '../../core/ovbAnalysis';
import { formatNumber, formatPercent } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, unitsSuffix, type StudyLabels } from '../../format/studyLabels';

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

/** The benchmark whose covariate is strongest with both treatment and outcome (largest smaller partial R²; covariates whose association with the treatment is unknown only when no other is available). */
export function strongestBenchmark(result: OvbResult): OvbBenchmarkRow | null {
  const seen = new Set<string>();
  let best: OvbBenchmarkRow | null = null;
  let bestScore = -Infinity;
  for (const row of result.benchmarks) {
    if (seen.has(row.covariate)) continue;
    seen.add(row.covariate);
    // Covariates with both associations known come first (by the smaller of the two), then the others.
    const score = Number.isFinite(row.r2dxj) ? 1 + Math.min(row.r2dxj, row.r2yxj) : row.r2yxj;
    if (score > bestScore) {
      best = row;
      bestScore = score;
    }
  }
  return best;
}

/**
 * The plain-language reading of the analysis: how strong a confounder would have to be, compared with the
 * strongest measured covariate; a few sentences, every number formatted for people.
 */
export function ovbReading(result: OvbResult, study?: Partial<StudyLabels>): string[] {
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const sentences: string[] = [];
  const level = formatPercent(result.alpha, result.alpha * 100 < 1 ? 1 : 0);
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
        (result.rvAlpha > 0
          ? `, and at least ${formatPercent(result.rvAlpha)} of both to make it lose statistical significance at the ${level} level.`
          : `; the estimate is not statistically significant at the ${level} level even without confounding.`),
    );
  }
  const strongest = strongestBenchmark(result);
  if (strongest) {
    const both = Number.isFinite(strongest.r2dxj)
      ? `explains ${formatPercent(strongest.r2dxj)} of the residual variance of ${exposure} and ${formatPercent(strongest.r2yxj)} of that of ${outcome}`
      : `explains ${formatPercent(strongest.r2yxj)} of the residual variance of ${outcome} (its association with ${exposure} is not known)`;
    sentences.push(`The strongest measured covariate, ${strongest.covariate}, ${both}.`);
    const bounds = result.benchmarks.filter((b) => b.covariate === strongest.covariate && b.unavailable === null);
    const flips = bounds.find((b) => (result.direction === 'toward-zero' ? overturned(result, b) : false));
    if (flips) {
      sentences.push(
        `A confounder ${timesAsStrong(flips.k)} ${strongest.covariate} would be enough to ${ovbGoalText(result.q)} (adjusted estimate ${formatNumber(flips.correctedEstimate, { significant: 3 })}).`,
      );
    } else if (bounds.length > 0) {
      const last = bounds[bounds.length - 1];
      sentences.push(
        `Even a confounder ${timesAsStrong(last.k)} ${strongest.covariate} would leave an adjusted estimate of ${formatNumber(last.correctedEstimate, { significant: 3 })} ${Number.isFinite(last.correctedT) ? ` (t = ${formatNumber(last.correctedT, { digits: 2 })})` : ' (its t is not defined: the bound leaves no residual variance)'}.`,
      );
    }
  }
  return sentences;
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
export function ovbReport(result: OvbResult, options: { study?: Partial<StudyLabels>; dataNote?: string } = {}): string {
  const lines: string[] = [];
  lines.push('Omitted-variable bias: how strong would a hidden confounder have to be?', '');
  if (options.dataNote) lines.push(options.dataNote, '');
  const pct = (x: number) => formatPercent(x, 1);
  lines.push(
    `  estimate              ${formatNumber(result.estimate, { significant: 6 })}`,
    `  standard error        ${formatNumber(result.se, { significant: 6 })}`,
    `  t                     ${formatNumber(result.t, { digits: 3 })}`,
    `  residual df           ${plainNumber(result.df)}`,
    '',
    `  partial R² of the treatment with the outcome   ${pct(result.partialR2)}`,
    `  robustness value RV (q = ${plainNumber(result.q)})`.padEnd(49) + pct(result.rv),
    `  robustness value at α = ${plainNumber(result.alpha)}`.padEnd(49) + pct(result.rvAlpha),
  );
  if (result.scenario) {
    const s = result.scenario;
    lines.push(
      '',
      `  With R²(D~Z|X) = ${pct(s.r2dz)} and R²(Y~Z|D,X) = ${pct(s.r2yz)}: adjusted estimate ${formatNumber(s.correctedEstimate, {
        significant: 4,
      })}, SE ${formatNumber(s.correctedSe, { significant: 4 })}, t ${formatNumber(s.correctedT, { digits: 2 })}`,
    );
  }
  if (result.benchmarks.length > 0) {
    lines.push('', 'Bounds on a confounder k times as strong as a measured covariate:');
    const header = ['covariate', 'k', 'R²(D~Z|X)', 'R²(Y~Z|D,X)', 'adj. estimate', 'adj. SE', 'adj. t'];
    const rows = result.benchmarks.map((b) =>
      b.unavailable !== null
        ? [b.covariate, plainNumber(b.k), '—', '—', `not available: ${b.unavailable}`, '', '']
        : [
            b.covariate,
            plainNumber(b.k),
            pct(b.r2dz),
            pct(b.r2yz) + (b.capped ? ' (capped)' : ''),
            formatNumber(b.correctedEstimate, { significant: 4 }),
            formatNumber(b.correctedSe, { significant: 4 }),
            formatNumber(b.correctedT, { digits: 2 }),
          ],
    );
    const widths = header.map((h, c) => Math.max(h.length, ...rows.filter((r) => r[5] !== '').map((r) => r[c].length)));
    const fmt = (cells: string[]) => '  ' + cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join('  ').trimEnd();
    lines.push(fmt(header));
    for (const r of rows) lines.push(r[5] === '' ? `  ${r[0].padEnd(widths[0])}  ${r[1].padStart(widths[1])}  ${r[4]}` : fmt(r));
  }
  if (result.direction === 'toward-zero') {
    lines.push('', `Extreme scenarios (R²(D~Z|X) needed to ${ovbGoalText(result.q)}):`);
    for (const e of result.extremeScenarios) {
      lines.push(`  if the confounder explained ${formatPercent(e.r2yz, 0)} of the outcome's residual variance: ${pct(e.r2dzToReach)}`);
    }
  }
  lines.push('', ...ovbReading(result, options.study));
  if (result.warnings.length > 0) lines.push('', ...result.warnings.map((w) => `Note: ${w}`));
  lines.push('', OVB_CAUTION, '');
  return lines.join('\n');
}

/** The JSON form (numbers that are not finite become null). */
export function ovbJson(result: OvbResult, extra: Record<string, unknown> = {}): string {
  const benchmarks = result.benchmarks.map((b) => ({
    covariate: b.covariate,
    k: b.k,
    r2dz: b.r2dz,
    r2yz: b.r2yz,
    correctedEstimate: b.correctedEstimate,
    correctedSe: b.correctedSe,
    correctedT: b.correctedT,
    r2dxj: b.r2dxj,
    r2yxj: b.r2yxj,
    capped: b.capped,
    unavailable: b.unavailable,
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
    benchmarks,
    extremeScenarios: result.extremeScenarios,
    scenario: result.scenario,
    ...extra,
    reading: ovbReading(result).join(' '),
    warnings: result.warnings,
    method: result.method,
    references: result.references,
    caution: OVB_CAUTION,
  };
  return JSON.stringify(body, (_key, value) => (typeof value === 'number' && !Number.isFinite(value) ? null : value), 2) + '\n';
}

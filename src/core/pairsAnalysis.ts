import { gammaListProblems } from './gammaList';
import { inputProblem, throwIfProblems, type InputProblem } from './inputProblem';
import { conventionList, type AnalysisConvention } from './analysisConvention';
import { RANK_TIE_TOLERANCE, signedRanks, type SignedRanks, type ZeroRule } from './signedRanks';
import { biasProbabilities, NORMAL_APPROXIMATION_MEASURED_ERROR, signedRankBound, signedRankUpperP, type TailMethod } from './signedRankBound';
import { signTestBound } from './signTestBound';
import { tippingGamma, type TippingGamma } from './tippingGamma';
import { walshAverages } from './walshAverages';
import { effectUnderBias, exactCriticalValueAndTail, type EffectUnderBias } from './hodgesLehmannRange';
import { readableAmplifications, type AmplifiedPair } from './amplification';
import { signedRanksFromSummary, validateSignedRankSummary, type SignedRankSummary } from './signedRankSummary';

/** The data of a matched-pairs study, in one of three forms. */
export type PairsData =
  /** One treated-minus-control difference per pair. */
  | { readonly kind: 'differences'; readonly differences: ArrayLike<number> }
  /** The two outcomes of each pair (same length; difference = treated − control). */
  | { readonly kind: 'outcomes'; readonly treated: ArrayLike<number>; readonly control: ArrayLike<number> }
  /** A binary outcome: counts of discordant pairs. */
  | {
      readonly kind: 'discordant';
      readonly treatedOnly: number;
      readonly controlOnly: number;
      /** Pairs where both or neither had the event, when known (counted in n; they carry no information). */
      readonly concordant?: number;
    }
  /**
   * The sums of the signed-rank test, e.g. from a database query (Wilcoxon's rule, mid-ranks): the bounds use
   * the normal approximation; no Hodges–Lehmann estimate (that needs every difference).
   */
  | ({ readonly kind: 'signed-rank-summary' } & SignedRankSummary);

export type PairsTest = 'signrank' | 'sign';
export type PairsAlternative = 'greater' | 'less';

export interface PairsInput {
  readonly data: PairsData;
  /** Default: `signrank` for numeric outcomes, `sign` for discordant counts (the only choice there). */
  readonly test?: PairsTest;
  /** `greater`: treatment raises the outcome (default); `less`: it lowers it. */
  readonly alternative?: PairsAlternative;
  /** Significance level, in (0, 1). Default 0.05. */
  readonly alpha?: number;
  /** Γ values to tabulate, each ≥ 1. Default: a grid from 1 to just past the sensitivity value. */
  readonly gammas?: readonly number[];
  /**
   * `auto` (default): exact when the study has at most `EXACT_PAIRS_LIMIT` pairs (all pairs used, zero
   * differences included), the normal approximation beyond — one rule for the test and the estimates.
   */
  readonly method?: TailMethod | 'auto';
  /** Normal approximation only: ½ continuity correction. Default false. */
  readonly continuityCorrection?: boolean;
  /** Rows the reader dropped because a value was missing (reported back; not used in the computation). */
  readonly droppedRows?: number;
  /**
   * Signed-rank test only: how pairs with a zero difference enter the ranking. `wilcoxon` (default): left out of
   * the test; `pratt`: ranked with the others (mid-ranks) and scored 0. Both keep every pair in the
   * Hodges–Lehmann estimate and interval.
   */
  readonly zeroRule?: ZeroRule;
}


/** One row of the sensitivity table. */
export interface PairsRow {
  readonly gamma: number;
  readonly pUpper: number;
  readonly pLower: number;
}

export interface PairsResult {
  readonly method: string;
  readonly references: readonly string[];
  readonly test: PairsTest;
  readonly alternative: PairsAlternative;
  readonly alpha: number;
  /** How the tails were computed and why. */
  readonly tailMethod: TailMethod;
  readonly tailMethodReason: string;
  readonly continuityCorrection: boolean;
  /** Pairs used (after dropped rows). */
  readonly n: number;
  readonly droppedRows: number;
  /**
   * Pairs with zero difference: left out of the sign test, and of the signed-rank test under Wilcoxon's rule;
   * ranked with score 0 under Pratt's rule (see `zeroRule`).
   */
  readonly zeroDifferences: number;
  /** The zero rule used by the signed-rank test (`wilcoxon` for the sign test, where zeros always drop out). */
  readonly zeroRule: ZeroRule;
  /** The relative tolerance within which two |differences| tie (0 for discordant counts). */
  readonly tieTolerance: number;
  /** Every convention this analysis follows, in plain words. */
  readonly conventions: readonly AnalysisConvention[];
  /** Pairs that count in the test: non-zero differences (signed-rank), discordant pairs (sign). */
  readonly nonZero: number;
  /** Pairs in the direction of the alternative (treated better for `greater`). */
  readonly favourable: number;
  /** T (signed-rank, in the direction of the alternative) or S (sign test). */
  readonly statistic: number;
  /** p-value at Γ = 1 (no hidden bias). */
  readonly pValue: number;
  /** The sensitivity value: the largest Γ with pUpper ≤ α; null when none (see `sensitivityStatus`). */
  readonly sensitivityValue: number | null;
  readonly sensitivityStatus: TippingGamma['status'];
  readonly searchedUpTo: number;
  /** What the sign test alone gives (for the signed-rank test too, as a comparison). */
  readonly signTestSensitivityValue: number | null;
  readonly rows: readonly PairsRow[];
  /**
   * The same bounds on a finer Γ grid for drawing (41 points from 1 to the largest tabulated Γ, 21 for exact
   * signed-rank tails over 100 pairs), computed the same way as the rows; just the rows when the exact tails
   * are too slow to repeat (over 300 pairs).
   */
  readonly curve: readonly PairsRow[];
  /** Hodges–Lehmann estimate at Γ = 1 (signed-rank test with numeric outcomes only). */
  readonly estimate: number | null;
  /** Estimate range and sensitivity interval for each Γ (signed-rank with numeric outcomes; else empty). */
  readonly estimates: readonly EffectUnderBias[];
  /** Level of the sensitivity intervals (two-sided), 1 − α. */
  readonly intervalLevel: number;
  /** Readable (Λ, Δ) pairs equivalent to the sensitivity value (Rosenbaum & Silber 2009). */
  readonly amplification: readonly AmplifiedPair[];
  readonly warnings: readonly string[];
}

/** Above this many non-zero pairs the exact plotting curve is not computed (the table rows are drawn). */
const CURVE_EXACT_LIMIT = 5000;

/**
 * The one rule for `method: 'auto'` with the signed-rank test: exact bounding distributions when the number
 * of pairs used, n (zero differences included), is at most this limit; the normal approximation beyond. The
 * same n decides for the p-value bounds (ranks over the non-zero pairs, never more than n) and for the
 * Hodges–Lehmann sensitivity intervals (ranks 1…n), so both parts of one analysis use the same method
 * (`tailMethod` on the result). The error of the approximation beyond the limit is measured at
 * `NORMAL_APPROXIMATION_MEASURED_ERROR` (signedRankBound.ts). The sign test is always exact (constant cost).
 */
export const EXACT_PAIRS_LIMIT = 5000;

/** The works the matched-pairs analysis follows (also what the robustness statement cites). */
export const PAIRS_ANALYSIS_REFERENCES = Object.freeze([
  'Rosenbaum PR (2002) Observational Studies, 2nd ed. New York: Springer, chapter 4.',
  'Rosenbaum PR (1987) Sensitivity analysis for certain permutation inferences in matched observational studies. Biometrika 74(1):13–26.',
  'Rosenbaum PR (1993) Hodges–Lehmann point estimates of treatment effect in observational studies. JASA 88(424):1250–1253.',
  'Rosenbaum PR, Silber JH (2009) Amplification of sensitivity analysis in matched observational studies. JASA 104(488):1398–1405.',
  'Zhao Q (2019) On sensitivity value of pair-matched observational studies. JASA 114(526):713–722 (the name sensitivity value; recalled from memory).',
  'Wilcoxon F (1945) Individual comparisons by ranking methods. Biometrics Bulletin 1(6):80–83.',
]);

const PRATT_REFERENCE =
  'Pratt JW (1959) Remarks on zeros and ties in the Wilcoxon signed rank procedures. JASA 54(287):655–667 (recalled from memory).';

/**
 * Checks a matched-pairs input and lists every problem (field, rule, value); an empty list means valid.
 */
export function validatePairsInput(input: PairsInput): InputProblem[] {
  const problems: InputProblem[] = [];
  const data = input?.data;
  if (!data || typeof data !== 'object') {
    problems.push(inputProblem('data', 'missing', 'give the pairs: differences, treated and control outcomes, or discordant counts'));
  } else if (data.kind === 'differences') {
    checkFinite(data.differences, 'data.differences', problems);
    if (problems.length === 0) checkNonZero(data.differences, 'data.differences', problems);
  } else if (data.kind === 'outcomes') {
    const before = problems.length;
    checkFinite(data.treated, 'data.treated', problems);
    checkFinite(data.control, 'data.control', problems);
    if (problems.length === before && data.treated.length !== data.control.length) {
      problems.push(
        inputProblem(
          'data.control',
          'unequal-length',
          `the treated and control columns must have one value per pair; treated has ${data.treated.length}, control has ${data.control.length}`,
        ),
      );
    }
    if (problems.length === before) {
      const differences = outcomeDifferences(data.treated, data.control);
      const overflow = differences.findIndex((d) => !Number.isFinite(d));
      if (overflow >= 0) {
        problems.push(
          inputProblem(`data.treated[${overflow}]`, 'difference-overflow', `the difference in pair ${overflow + 1} is too large to represent; rescale the outcomes`),
        );
      } else checkNonZero(differences, 'data', problems);
    }
  } else if (data.kind === 'discordant') {
    for (const key of ['treatedOnly', 'controlOnly', 'concordant'] as const) {
      const v = data[key];
      if (key === 'concordant' && v === undefined) continue;
      if (!(typeof v === 'number' && Number.isInteger(v) && v >= 0)) {
        problems.push(inputProblem(`data.${key}`, 'not-count', 'must be a whole number of pairs, 0 or more', v));
      }
    }
    if (problems.length === 0 && data.treatedOnly + data.controlOnly < 2) {
      problems.push(
        inputProblem('data', 'too-few-pairs', 'needs at least two discordant pairs (pairs where exactly one unit had the event)'),
      );
    }
  } else if (data.kind === 'signed-rank-summary') {
    problems.push(...validateSignedRankSummary(data, 'data'));
  } else {
    problems.push(inputProblem('data.kind', 'unknown-kind', 'must be differences, outcomes, discordant or signed-rank-summary', (data as { kind?: unknown }).kind));
  }
  if (input?.test !== undefined && input.test !== 'signrank' && input.test !== 'sign') {
    problems.push(inputProblem('test', 'not-a-choice', 'must be signrank or sign', input.test));
  }
  if (input?.alternative !== undefined && input.alternative !== 'greater' && input.alternative !== 'less') {
    problems.push(inputProblem('alternative', 'not-a-choice', 'must be greater or less', input.alternative));
  }
  if (input?.zeroRule !== undefined && input.zeroRule !== 'wilcoxon' && input.zeroRule !== 'pratt') {
    problems.push(inputProblem('zeroRule', 'not-a-choice', 'must be wilcoxon (zero differences left out of the test) or pratt (ranked, scored 0)', input.zeroRule));
  }
  if (input?.method !== undefined && !['auto', 'exact', 'normal'].includes(input.method)) {
    problems.push(inputProblem('method', 'not-a-choice', 'must be auto, exact or normal', input.method));
  }
  if (input?.alpha !== undefined && !(typeof input.alpha === 'number' && input.alpha > 0 && input.alpha < 1)) {
    problems.push(inputProblem('alpha', 'outside-interval', 'must be between 0 and 1 (e.g. 0.05), exclusive', input.alpha));
  }
  if (input?.gammas !== undefined) problems.push(...gammaListProblems(input.gammas));
  return problems;
}

function checkFinite(values: ArrayLike<number> | undefined, field: string, problems: InputProblem[]): void {
  if (!values || typeof values.length !== 'number') {
    problems.push(inputProblem(field, 'missing', 'give one number per pair'));
    return;
  }
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      problems.push(inputProblem(`${field}[${i}]`, 'not-finite', `pair ${i + 1} is not a finite number`, v));
      return;
    }
  }
}

function checkNonZero(differences: ArrayLike<number>, field: string, problems: InputProblem[]): void {
  let nonZero = 0;
  for (let i = 0; i < differences.length && nonZero < 2; i++) if (differences[i] !== 0) nonZero++;
  if (nonZero < 2) {
    problems.push(
      inputProblem(
        field,
        'too-few-pairs',
        `needs at least two pairs whose outcomes differ (non-zero differences); found ${nonZero} among ${differences.length} pairs`,
      ),
    );
  }
}

/**
 * treated − control, pair by pair, rounded to 12 significant digits (kept for callers that want tidy
 * differences; {@link analysePairs} no longer rounds: it ranks the exact differences with the relative tie
 * tolerance {@link RANK_TIE_TOLERANCE}, which also catches near-equal differences on either side of a
 * rounding boundary, such as 100000.3 − 100000.2 and 0.1).
 */
export function outcomeDifferences(treated: ArrayLike<number>, control: ArrayLike<number>): Float64Array {
  const d = new Float64Array(Math.min(treated.length, control.length));
  for (let i = 0; i < d.length; i++) d[i] = roundSignificant(treated[i] - control[i], 12);
  return d;
}

/** x rounded to `digits` significant digits (0 and non-finite values unchanged). */
export function roundSignificant(x: number, digits: number): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  const exponent = Math.floor(Math.log10(Math.abs(x)));
  const scale = Math.pow(10, digits - 1 - exponent);
  if (!Number.isFinite(scale) || scale === 0) return Number(x.toPrecision(digits));
  const rounded = Math.round(x * scale) / scale;
  return Number.isFinite(rounded) ? rounded : x;
}

/**
 * Sensitivity analysis of a matched-pairs study: bounds on the one-sided p-value of the signed-rank or sign
 * test for a range of hidden biases Γ, the sensitivity value (tipping Γ), the Hodges–Lehmann estimate range
 * and sensitivity interval under each Γ, and equivalent (Λ, Δ) pairs by amplification.
 *
 * **Method.** See `signedRankBound`, `signTestBound`, `tippingGamma`, `effectUnderBias` and
 * `amplificationDelta`. The alternative `less` is handled by reversing the sign of every difference (equivalently,
 * swapping treated and control), so both alternatives share one computation. Default Γ grid: from 1 in round
 * steps to the first step past the sensitivity value (about 6–12 rows).
 *
 * Zero differences: Wilcoxon's rule (default) leaves them out of the signed-rank test; Pratt's rule
 * (`zeroRule: 'pratt'`) ranks them with the others and scores them 0, and the bounds under Γ then use those
 * ranks. Either way every pair enters the Hodges–Lehmann estimate and interval. Ties: |d| within the relative
 * tolerance {@link RANK_TIE_TOLERANCE} share their average rank. `conventions` lists all of this in words.
 *
 * **References.** Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer, ch. 4; Rosenbaum 1987,
 * Biometrika 74:13–26; Rosenbaum 1993, JASA 88:1250–1253; Rosenbaum & Silber 2009, JASA 104:1398–1405;
 * Wilcoxon F (1945) Biometrics Bulletin 1(6):80–83 (zeros dropped); Pratt JW (1959) JASA 54(287):655–667
 * (zeros ranked, scored 0; recalled from memory); Zhao Q (2019) On sensitivity value of pair-matched
 * observational studies, JASA 114(526):713–722 (the term sensitivity value for the tipping Γ; recalled from
 * memory).
 *
 * **Special cases.** A binary outcome given as discordant counts uses the sign test (McNemar); asking for the
 * signed-rank test there gives the sign test and a warning. No estimate range without numeric outcomes.
 *
 * @throws InputError listing every problem when the input breaks a rule (see `validatePairsInput`)
 */
export function analysePairs(input: PairsInput): PairsResult {
  throwIfProblems(validatePairsInput(input));
  const alpha = input.alpha ?? 0.05;
  const alternative = input.alternative ?? 'greater';
  const continuityCorrection = input.continuityCorrection ?? false;
  const requested = input.method ?? 'auto';
  const warnings: string[] = [];
  const data = input.data;
  const direction = alternative === 'greater' ? 1 : -1;
  const requestedZeroRule: ZeroRule = input.zeroRule ?? 'wilcoxon';

  // The study's differences (treated − control), when there are numeric outcomes.
  const differences: Float64Array | null =
    data.kind === 'differences'
      ? Float64Array.from(data.differences as ArrayLike<number>)
      : data.kind === 'outcomes'
        ? Float64Array.from({ length: data.treated.length }, (_, i) => data.treated[i] - data.control[i])
        : null;

  const summary = data.kind === 'signed-rank-summary' ? data : null;
  let test: PairsTest = input.test ?? (differences || summary ? 'signrank' : 'sign');
  if (!differences && !summary && test === 'signrank') {
    warnings.push('With a binary outcome (discordant counts) the signed-rank test is the sign test; the sign test was used.');
    test = 'sign';
  }
  const zeroRule: ZeroRule = test === 'signrank' && !summary ? requestedZeroRule : 'wilcoxon';
  if (summary && test === 'signrank' && requestedZeroRule === 'pratt') {
    warnings.push("Pratt's rule needs the differences themselves; the summary follows Wilcoxon's rule (zero differences left out of the test).");
  } else if (test === 'sign' && requestedZeroRule === 'pratt') {
    warnings.push("Pratt's rule for zero differences applies to the signed-rank test only; the sign test leaves them out.");
  }

  let n: number;
  let zeros: number;
  let favourable: number;
  let nonZero: number;
  let ranks: SignedRanks | null = null;
  if (differences) {
    const oriented = direction === 1 ? differences : differences.map((d) => -d);
    ranks = signedRanks(oriented, { zeroRule: test === 'signrank' ? zeroRule : 'wilcoxon', tieTolerance: RANK_TIE_TOLERANCE });
    n = ranks.pairs;
    zeros = ranks.zeros;
    nonZero = ranks.nonZero;
    favourable = ranks.positive;
  } else if (summary) {
    ranks = signedRanksFromSummary(summary, direction);
    n = ranks.pairs;
    zeros = ranks.zeros;
    nonZero = ranks.nonZero;
    favourable = ranks.positive;
  } else {
    const d = data as Extract<PairsData, { kind: 'discordant' }>;
    favourable = direction === 1 ? d.treatedOnly : d.controlOnly;
    nonZero = d.treatedOnly + d.controlOnly;
    n = nonZero + (d.concordant ?? 0);
    zeros = d.concordant ?? 0;
  }
  if (zeros > 0 && !differences && !summary) warnings.push(`${zeros} concordant ${zeros === 1 ? 'pair' : 'pairs'} (both or neither had the event) carry no information and ${zeros === 1 ? 'was' : 'were'} left out of the test.`);
  else if (zeros > 0 && zeroRule === 'pratt') warnings.push(`${zeros} ${zeros === 1 ? 'pair has' : 'pairs have'} a difference of zero; by Pratt's rule ${zeros === 1 ? 'it was' : 'they were'} ranked with the others and scored 0.`);
  else if (zeros > 0) warnings.push(`${zeros} ${zeros === 1 ? 'pair has' : 'pairs have'} a difference of zero and ${zeros === 1 ? 'was' : 'were'} left out of the test.`);
  if (ranks?.tiedMagnitudes) warnings.push('Some differences have equal sizes; they share average ranks (handled exactly).');

  let tailMethod: TailMethod;
  let tailMethodReason: string;
  if (test === 'sign') {
    tailMethod = requested === 'normal' ? 'normal' : 'exact';
    tailMethodReason =
      tailMethod === 'exact' ? 'exact binomial tails (cheap for any number of pairs)' : 'normal approximation, as requested';
  } else if (summary) {
    // Exact bounding distributions need every rank; the summary has only their sums.
    tailMethod = 'normal';
    tailMethodReason = 'normal approximation (the summary holds the sums of the ranks, not the ranks the exact tails need)';
    if (requested === 'exact') warnings.push('The exact tails need every rank; from a summary the normal approximation was used.');
  } else if (requested === 'auto') {
    // One rule (see EXACT_PAIRS_LIMIT): all pairs used, for the test and the estimates alike.
    tailMethod = n <= EXACT_PAIRS_LIMIT ? 'exact' : 'normal';
    tailMethodReason =
      tailMethod === 'exact'
        ? `exact bounding distribution (${n} pairs, at most ${EXACT_PAIRS_LIMIT})`
        : `normal approximation (${n} pairs, more than ${EXACT_PAIRS_LIMIT}; near p = 0.05 its relative error was measured at up to ${formatPercent(NORMAL_APPROXIMATION_MEASURED_ERROR.atAlpha05)} for Γ ≤ 2 and 1,500 pairs or more)`;
  } else {
    tailMethod = requested;
    tailMethodReason = requested === 'exact' ? 'exact bounding distribution, as requested' : 'normal approximation, as requested';
  }
  if (tailMethod === 'exact' && continuityCorrection) {
    warnings.push('The continuity correction applies to the normal approximation only; the exact tails need none.');
  }
  const tailOptions = { method: tailMethod, continuityCorrection };

  const upperAt = (gamma: number): number =>
    test === 'sign' || !ranks
      ? signTestBound(favourable, nonZero, gamma, tailOptions).pUpper
      : signedRankUpperP(ranks, gamma, tailOptions);
  const normalGuess =
    tailMethod === 'exact' ? tippingGamma((g) => upperAtNormal(g), alpha, { tolerance: 1e-4 }).gamma ?? undefined : undefined;
  function upperAtNormal(gamma: number): number {
    const normal = { method: 'normal' as const, continuityCorrection: false };
    return test === 'sign' || !ranks
      ? signTestBound(favourable, nonZero, gamma, normal).pUpper
      : signedRankUpperP(ranks, gamma, normal);
  }
  const tipping = tippingGamma(upperAt, alpha, {
    guess: normalGuess,
    // Finer than the 3 decimals shown.
    tolerance: 1e-10,
    model: tailMethod === 'exact' ? upperAtNormal : undefined,
  });
  const signTipping =
    test === 'sign' ? tipping : tippingGamma((g) => signTestBound(favourable, nonZero, g, { method: 'exact' }).pUpper, alpha);

  const gammas = input.gammas ? [...input.gammas] : defaultGammaGrid(tipping);
  const withEstimates = test === 'signrank' && differences !== null;
  const estimateMethod: TailMethod = tailMethod;
  // With exact tails, untied ranks and no zeros, the ranks are 1…n for both the test and the estimates, so one
  // table per Γ gives the interval's critical value and the upper p-value bound together.
  const shareTables =
    withEstimates && ranks !== null && tailMethod === 'exact' && estimateMethod === 'exact' && !ranks.tiedMagnitudes && ranks.zeros === 0;
  const critical = new Map<number, number>();
  const rows: PairsRow[] = gammas.map((gamma) => {
    // At Γ = 1 both bounds are the ordinary p-value, already computed by the search.
    if (gamma === 1) return Object.freeze({ gamma, pUpper: tipping.pAtOne, pLower: tipping.pAtOne });
    if (shareTables && ranks) {
      const { plus, minus } = biasProbabilities(gamma);
      const shared = exactCriticalValueAndTail(n, plus, minus, alpha / 2, ranks.statistic);
      critical.set(gamma, shared.critical);
      const pUpper = shared.tail ?? signedRankUpperP(ranks, gamma, tailOptions);
      const pLower = signedRankUpperP(ranks, gamma, tailOptions, 'lower');
      return Object.freeze({ gamma, pUpper, pLower });
    }
    const bound =
      test === 'sign' || !ranks ? signTestBound(favourable, nonZero, gamma, tailOptions) : signedRankBound(ranks, gamma, tailOptions);
    return Object.freeze({ gamma, pUpper: bound.pUpper, pLower: bound.pLower });
  });

  const curveCheap = tailMethod === 'normal' || test === 'sign' || nonZero <= CURVE_EXACT_LIMIT;
  const top = Math.max(...gammas);
  const curve: PairsRow[] = [];
  if (curveCheap && top > 1) {
    const steps = tailMethod === 'exact' && test === 'signrank' && nonZero > 100 ? 20 : 40;
    for (let i = 0; i <= steps; i++) {
      const gamma = 1 + ((top - 1) * i) / steps;
      const bound =
        test === 'sign' || !ranks ? signTestBound(favourable, nonZero, gamma, tailOptions) : signedRankBound(ranks, gamma, tailOptions);
      curve.push(Object.freeze({ gamma, pUpper: bound.pUpper, pLower: bound.pLower }));
    }
  } else curve.push(...[...rows].sort((a, b) => a.gamma - b.gamma));

  let estimate: number | null = null;
  const estimates: EffectUnderBias[] = [];
  if (withEstimates && differences) {
    const walsh = walshAverages(differences);
    for (const gamma of gammas) {
      estimates.push(effectUnderBias(walsh, n, gamma, alpha, { method: estimateMethod, continuityCorrection, criticalValue: critical.get(gamma) }));
    }
    estimate = effectUnderBias(walsh, n, 1, alpha, { method: 'normal' }).estimateLow;
  }
  if (summary && test === 'signrank') {
    warnings.push('The Hodges–Lehmann estimate and its range under each Γ need the differences themselves; a summary gives the p-value bounds only.');
  }

  if (tipping.status === 'not-significant') {
    warnings.push(`The finding is not significant at α = ${alpha} even with no hidden bias (p = ${tipping.pAtOne.toPrecision(3)} at Γ = 1).`);
  }
  if (tipping.status === 'beyond-range') warnings.push(`The bound stays below α up to the largest Γ searched (${tipping.searchedUpTo}).`);

  return Object.freeze({
    method:
      test === 'signrank'
        ? 'Rosenbaum bounds for the Wilcoxon signed-rank test in matched pairs'
        : 'Rosenbaum bounds for the sign test in matched pairs (McNemar for a binary outcome)',
    references: zeroRule === 'pratt' ? Object.freeze([...PAIRS_ANALYSIS_REFERENCES, PRATT_REFERENCE]) : PAIRS_ANALYSIS_REFERENCES,
    test,
    alternative,
    alpha,
    tailMethod,
    tailMethodReason,
    continuityCorrection,
    n,
    droppedRows: input.droppedRows ?? 0,
    zeroDifferences: zeros,
    zeroRule,
    tieTolerance: differences ? RANK_TIE_TOLERANCE : 0,
    conventions: pairsConventions({ test, zeroRule, withEstimates, numeric: differences !== null || summary !== null, tailMethod, continuityCorrection, alpha, exactTies: summary !== null }),
    nonZero,
    favourable,
    statistic: test === 'sign' || !ranks ? favourable : ranks.statistic,
    pValue: tipping.pAtOne,
    sensitivityValue: tipping.gamma,
    sensitivityStatus: tipping.status,
    searchedUpTo: tipping.searchedUpTo,
    signTestSensitivityValue: signTipping.gamma,
    rows: Object.freeze(rows),
    curve: Object.freeze(curve),
    estimate,
    estimates: Object.freeze(estimates),
    intervalLevel: 1 - alpha,
    amplification: Object.freeze(tipping.gamma !== null ? readableAmplifications(tipping.gamma) : []),
    warnings: Object.freeze(warnings),
  });
}

/** The conventions of a matched-pairs analysis, in plain words (frozen). */
function pairsConventions(settings: {
  test: PairsTest;
  zeroRule: ZeroRule;
  withEstimates: boolean;
  numeric: boolean;
  tailMethod: TailMethod;
  continuityCorrection: boolean;
  alpha: number;
  exactTies?: boolean;
}): readonly AnalysisConvention[] {
  const conventions = conventionList();
  const add = conventions.add;
  if (settings.test === 'signrank') {
    add(
      'zero-differences',
      settings.zeroRule === 'pratt'
        ? "Pairs with a difference of exactly zero are ranked together with the others by the size of their difference and score 0 in the test (Pratt's rule); they also count in the Hodges–Lehmann estimate and interval."
        : "Pairs with a difference of exactly zero are left out of the signed-rank test (Wilcoxon's rule) but count in the Hodges–Lehmann estimate and interval.",
    );
    if (settings.exactTies) add('tied-differences', 'Differences of exactly equal size (as the database computed them) count as tied and share the average of their ranks.');
    else add('tied-differences', `Differences whose sizes agree within a relative ${RANK_TIE_TOLERANCE} (about 10 significant digits) count as tied and share the average of their ranks, so that differences equal on paper but not in binary arithmetic (1.3 − 1.2 and 2.3 − 2.2) tie.`);
  } else {
    add('zero-differences', settings.numeric
      ? 'Pairs with a difference of exactly zero are left out of the sign test.'
      : 'Concordant pairs (both or neither had the event) are left out of the sign test.');
  }
  add('one-sided-bounds', `The p-value bounds are one-sided, compared with α = ${settings.alpha}; the sensitivity value is the largest Γ at which the upper bound is still at most α (the name follows Zhao 2019).`);
  if (settings.tailMethod === 'normal') {
    add('normal-approximation', settings.continuityCorrection
      ? 'Tails come from the normal approximation with a continuity correction of ½.'
      : 'Tails come from the normal approximation without a continuity correction.');
  }
  if (settings.withEstimates) {
    add('interval-two-sided', `The sensitivity interval is two-sided at level ${1 - settings.alpha} (α/2 on each side), while the p-value bounds are one-sided at α.`);
    add('estimate-whole-number', 'Under bias Γ the estimate range uses the expectations N·Γ/(1 + Γ) and N/(1 + Γ) of the signed-rank statistic (N = n(n + 1)/2), with Γ taken as the decimal number it is written as; when one is a whole number the estimate is the mean of two Walsh averages.');
  }
  return conventions.list();
}

/** A fraction as a percentage with two significant digits (for the method's reason; not user formatting). */
function formatPercent(fraction: number): string {
  return `${Number((100 * fraction).toPrecision(2))}%`;
}

/**
 * Γ values from 1 in round steps (0.05, 0.1, 0.25, 0.5, 1, 2, 5, 10, …) up to the first step past the
 * sensitivity value, at most about 12 rows. Without a sensitivity value: 1, 1.25, 1.5, 2, 3.
 */
export function defaultGammaGrid(tipping: Pick<TippingGamma, 'gamma' | 'status' | 'searchedUpTo'>): number[] {
  const top = tipping.status === 'found' && tipping.gamma !== null ? tipping.gamma : tipping.status === 'beyond-range' ? tipping.searchedUpTo : 2;
  if (tipping.status === 'not-significant') return [1, 1.25, 1.5, 2, 3];
  const span = top - 1;
  const steps = [0.05, 0.1, 0.25, 0.5, 1, 2, 2.5, 5];
  let step = steps.find((s) => span / s <= 10);
  if (step === undefined) {
    let decade = 10;
    while (span / decade > 10) decade *= 10;
    step = span / (decade / 2) <= 10 ? decade / 2 : decade;
  }
  const grid: number[] = [];
  for (let k = 0; ; k++) {
    const gamma = Number((1 + k * step).toPrecision(12));
    grid.push(gamma);
    if (gamma > top) break;
  }
  return grid;
}


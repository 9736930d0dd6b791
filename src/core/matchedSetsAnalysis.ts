import { conventionList, type AnalysisConvention } from './analysisConvention';
import { gammaListProblems } from './gammaList';
import { inputProblem, throwIfProblems, type InputProblem } from './inputProblem';
import { groupMatchedSets, mapMatchedSetsOutcomes, type MatchedSetsGrouping, type MatchedSetsLayout } from './matchedSetsGrouping';
import { matchedSetsMStatistic, mStatisticScale, mStatisticUpperP } from './matchedSetsMStatistic';
import { mEstimate, mEstimateBracket, mEstimateUnderBias } from './matchedSetsEstimate';
import { matchedSetsEventBound, matchedSetsEventCounts } from './matchedSetsEventBound';
import { tippingGamma, type TippingGamma } from './tippingGamma';
import { readableAmplifications, type AmplifiedPair } from './amplification';
import { defaultGammaGrid } from './pairsAnalysis';

export type MatchedSetsAlternative = 'greater' | 'less';
export type MatchedSetsOutcomeKind = 'continuous' | 'binary';

/** A matched-sets study: one row per unit, each set with one treated unit and one or more controls. */
export interface MatchedSetsInput {
  /** The set each row belongs to (text; numbers are read as text, so 1 and "1" are one set). */
  readonly setIds: readonly (string | number)[];
  /** 1 for the treated unit of its set, 0 for a control. */
  readonly treated: readonly number[];
  /** The outcome; null or NaN = missing (the row is left out and counted). */
  readonly outcomes: readonly (number | null)[];
  /** Γ values to tabulate, each ≥ 1. Default: from 1 in round steps to just past the sensitivity value. */
  readonly gammas?: readonly number[];
  /** One-sided significance level, in (0, 0.5]. Default 0.05. */
  readonly alpha?: number;
  /** `greater`: treatment raises the outcome (default); `less`: it lowers it. */
  readonly alternative?: MatchedSetsAlternative;
  /** c of Huber's ψ, in units of σ (continuous outcomes). Default 2.5. */
  readonly trim?: number;
  /** `auto` (default): binary when every outcome is 0 or 1, else continuous. */
  readonly outcomeKind?: 'auto' | MatchedSetsOutcomeKind;
  /** Binary outcomes: `exact` Poisson-binomial tails (default) or their `normal` approximation. */
  readonly tail?: 'exact' | 'normal';
}

/** One row of the sensitivity table. */
export interface MatchedSetsRow {
  readonly gamma: number;
  /** Upper bound on the one-sided p-value (the worst case a bias of at most Γ allows). */
  readonly pUpper: number;
  /** Lower bound (the best case). */
  readonly pLower: number;
  /** The null expectation of T behind `pUpper`. */
  readonly expectation: number;
  /** The null variance of T behind `pUpper`. */
  readonly variance: number;
  /** Continuous outcomes: the smallest m-estimate a bias of at most Γ allows; null for binary outcomes. */
  readonly estimateLow: number | null;
  readonly estimateHigh: number | null;
  /** Continuous outcomes: the two-sided 1 − α sensitivity interval; null when unbounded or for binary outcomes. */
  readonly intervalLow: number | null;
  readonly intervalHigh: number | null;
}

/** Sets left out of the analysis, for one reason. */
export interface MatchedSetsDropped {
  readonly code: 'missing-treated-outcome' | 'missing-control-outcomes';
  readonly reason: string;
  readonly sets: number;
  /** The first (up to 10) of their ids. */
  readonly ids: readonly string[];
}

export interface MatchedSetsCounts {
  /** Rows given. */
  readonly rows: number;
  /** Distinct set ids given. */
  readonly setsGiven: number;
  /** Sets in the analysis. */
  readonly setsUsed: number;
  /** Units (rows) in the analysis. */
  readonly units: number;
  /** How many sets have each number of controls (ascending). */
  readonly controlsPerSet: readonly { readonly controls: number; readonly sets: number }[];
  /** Rows without an outcome (null or NaN), left out. */
  readonly missingOutcomes: number;
  readonly setsDropped: readonly MatchedSetsDropped[];
  /** Binary outcomes: sets with some but not all units with the event; null for continuous outcomes. */
  readonly informativeSets: number | null;
  /** Binary outcomes: sets with no or every unit with the event (no information); null for continuous. */
  readonly uninformativeSets: number | null;
}

export interface MatchedSetsResult {
  readonly method: string;
  readonly references: readonly string[];
  readonly outcomeKind: MatchedSetsOutcomeKind;
  /** Why this kind (as asked, or what `auto` saw). */
  readonly outcomeKindReason: string;
  readonly alternative: MatchedSetsAlternative;
  readonly alpha: number;
  /** How the p-value bounds are computed: the normal approximation (continuous), exact or normal (binary). */
  readonly tail: 'exact' | 'normal';
  readonly counts: MatchedSetsCounts;
  /** σ, the median absolute treated-minus-control difference (continuous); null for binary outcomes. */
  readonly scale: number | null;
  /** c of Huber's ψ (continuous); null for binary outcomes. */
  readonly trim: number | null;
  /** T: the m-statistic (continuous) or the treated events in informative sets (binary), oriented to `alternative`. */
  readonly statistic: number;
  /** The one-sided p-value at Γ = 1. */
  readonly pValue: number;
  readonly rows: readonly MatchedSetsRow[];
  /** The m-estimate of the effect at Γ = 1 (continuous, on the outcome's scale); null for binary outcomes. */
  readonly estimate: number | null;
  /** Level of the sensitivity intervals (two-sided), 1 − α. */
  readonly intervalLevel: number;
  /** The sensitivity value: the largest Γ with pUpper ≤ α; null when none (see `sensitivityStatus`). */
  readonly sensitivityValue: number | null;
  readonly sensitivityStatus: TippingGamma['status'];
  readonly searchedUpTo: number;
  /** Readable (Λ, Δ) pairs equivalent to the sensitivity value (Rosenbaum & Silber 2009). */
  readonly amplification: readonly AmplifiedPair[];
  /** The conventions this computation follows, in words, each with a stable id. */
  readonly conventions: readonly AnalysisConvention[];
  readonly warnings: readonly string[];
}

const MAX_LISTED = 10;

const REFERENCES_CONTINUOUS = Object.freeze([
  'Rosenbaum PR (2007) Sensitivity analysis for m-estimates, tests, and confidence intervals in matched observational studies. Biometrics 63(2):456–464 (recalled from memory).',
  'Gastwirth JL, Krieger AM, Rosenbaum PR (2000) Asymptotic separability in sensitivity analysis. Journal of the Royal Statistical Society B 62(3):545–555 (recalled from memory).',
  'Huber PJ (1964) Robust estimation of a location parameter. Annals of Mathematical Statistics 35(1):73–101 (recalled from memory).',
  'Rosenbaum PR, Silber JH (2009) Amplification of sensitivity analysis in matched observational studies. JASA 104(488):1398–1405.',
]);

const REFERENCES_BINARY = Object.freeze([
  'Rosenbaum PR (2002) Observational Studies, 2nd ed. New York: Springer, chapter 4 (recalled from memory).',
  'Hong Y (2013) On computing the distribution function for the Poisson binomial distribution. Computational Statistics & Data Analysis 59:41–51 (recalled from memory).',
  'Rosenbaum PR, Silber JH (2009) Amplification of sensitivity analysis in matched observational studies. JASA 104(488):1398–1405.',
]);

/** The conventions of a continuous-outcome analysis, in words. */
function continuousConventions(trim: number, alternative: MatchedSetsAlternative): readonly AnalysisConvention[] {
  const conventions = conventionList();
  conventions.add('scale', 'Scale σ: the median of |treated − control| over all sets and all controls, computed once at no effect.');
  conventions.add('huber-psi', `ψ(x) = max(−c, min(c, x)) with c = ${trim} (Huber).`);
  conventions.add('unit-score', 'Score of a unit: the mean over the other units of its set of ψ((its outcome − theirs)/σ); T = the sum over sets of the treated unit’s score.');
  conventions.add('separable-bound', 'Bound under Γ (separable approximation): per set, sort the scores; split a = 1 … n − 1 gives weight 1 to the a smallest and Γ to the rest; the set’s mean is the largest weighted mean over a, its variance the largest weighted variance among splits tied at that mean (ties within 1e-12·c); means and variances add over sets.');
  conventions.add('best-case-bound', 'Lower (best-case) bound: the same rule applied to the negated scores.');
  conventions.add('p-value-bounds', 'p-value bounds: 1 − Φ((T − E)/√V).');
  conventions.add('alternative', alternative === 'less'
    ? 'Alternative “less”: the outcomes are negated, so the test asks whether treatment lowers the outcome; estimates stay on the original scale.'
    : 'Alternative “greater”: the test asks whether treatment raises the outcome.');
  conventions.add('sensitivity-value', 'Sensitivity value: the largest Γ at which the upper p-value bound is still at most α.');
  conventions.add('effect-estimate', 'Effect τ: the treated outcome shifted by −τ, σ kept at its no-effect value; the estimate solves T(τ) = its expectation at Γ = 1; under Γ the range solves T(τ) = the upper and the lower expectation; the two-sided interval uses the normal critical value at α/2 on each side.');
  conventions.add('amplification', 'Amplification: Γ = (ΛΔ + 1)/(Λ + Δ).');
  return conventions.list();
}

/** The conventions of a binary-outcome analysis, in words. */
function binaryConventions(tail: 'exact' | 'normal', alternative: MatchedSetsAlternative): readonly AnalysisConvention[] {
  const conventions = conventionList();
  conventions.add('statistic', 'T: the number of treated units with the event, over sets where some but not all units had it; sets with no or all events carry no information and are left out.');
  conventions.add('bernoulli-bound', 'Under Γ a set with e events among n units adds an independent Bernoulli with probability at most Γe/(Γe + n − e) (worst case) and at least e/(e + Γ(n − e)) (best case).');
  conventions.add('p-value-bounds', tail === 'exact'
    ? 'p-value bounds: the exact tail P(T_Γ ≥ T) of the sum of these Bernoullis (convolution).'
    : 'p-value bounds: the normal approximation 1 − Φ((T − Σp)/√Σp(1 − p)), without continuity correction.');
  conventions.add('alternative', alternative === 'less'
    ? 'Alternative “less”: events and non-events are swapped (y → 1 − y), so the test asks whether treatment lowers the event rate.'
    : 'Alternative “greater”: the test asks whether treatment raises the event rate.');
  conventions.add('sensitivity-value', 'Sensitivity value: the largest Γ at which the upper p-value bound is still at most α.');
  conventions.add('amplification', 'Amplification: Γ = (ΛΔ + 1)/(Λ + Δ).');
  return conventions.list();
}

/** "a, b, c" or "a, b, … and N more" (at most 10 named). */
function listIds(ids: readonly (string | number)[]): string {
  const shown = ids.slice(0, MAX_LISTED).join(', ');
  return ids.length > MAX_LISTED ? `${shown} and ${ids.length - MAX_LISTED} more` : shown;
}

function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

function isBinaryLayout(layout: MatchedSetsLayout): boolean {
  for (let i = 0; i < layout.values.length; i++) if (layout.values[i] !== 0 && layout.values[i] !== 1) return false;
  return true;
}

/**
 * Checks a matched-sets input and lists every problem (field, rule, value); an empty list means valid.
 *
 * Sets are named by id (up to ten, then "and N more"), rows by their 1-based number.
 */
export function validateMatchedSets(input: MatchedSetsInput): InputProblem[] {
  const problems: InputProblem[] = [];
  const columns = ['setIds', 'treated', 'outcomes'] as const;
  let columnsOk = true;
  for (const key of columns) {
    const v = input?.[key];
    if (!v || typeof v !== 'object' || typeof (v as ArrayLike<unknown>).length !== 'number') {
      problems.push(inputProblem(key, 'missing', 'give one value per unit (row)'));
      columnsOk = false;
    }
  }
  if (columnsOk) {
    const lengths = columns.map((k) => input[k].length);
    if (lengths[1] !== lengths[0] || lengths[2] !== lengths[0]) {
      problems.push(
        inputProblem(
          'outcomes',
          'unequal-length',
          `the set id, treated and outcome columns need one value per unit; they have ${lengths[0]}, ${lengths[1]} and ${lengths[2]}`,
        ),
      );
      columnsOk = false;
    }
  }
  if (columnsOk) problems.push(...dataProblems(input, groupMatchedSets(input)));
  checkOptions(input, problems);
  return problems;
}

function dataProblems(input: MatchedSetsInput, grouping: MatchedSetsGrouping): InputProblem[] {
  const problems: InputProblem[] = [];
  const rowList = (rows: readonly number[]) => listIds(rows.map((r) => r + 1));
  if (grouping.rowsWithoutSetId.length > 0) {
    const r = grouping.rowsWithoutSetId;
    problems.push(inputProblem('setIds', 'missing-set-id', `${plural(r.length, 'row has', 'rows have')} no set id (row ${rowList(r)})`));
  }
  if (grouping.rowsWithBadTreated.length > 0) {
    const r = grouping.rowsWithBadTreated;
    problems.push(
      inputProblem('treated', 'not-zero-one', `must be 1 (treated) or 0 (control); ${plural(r.length, 'row is', 'rows are')} neither (row ${rowList(r)})`),
    );
  }
  if (grouping.rowsWithBadOutcome.length > 0) {
    const r = grouping.rowsWithBadOutcome;
    problems.push(
      inputProblem(
        'outcomes',
        'not-a-number',
        `${plural(r.length, 'outcome is', 'outcomes are')} not a finite number (row ${rowList(r)}); leave a missing outcome empty`,
      ),
    );
  }
  // Rows whose set or role is unknown would make the set-level checks below misleading.
  if (problems.length > 0 && (grouping.rowsWithoutSetId.length > 0 || grouping.rowsWithBadTreated.length > 0)) return problems;
  if (grouping.setsWithoutControl.length > 0) {
    const ids = grouping.setsWithoutControl;
    problems.push(
      inputProblem('treated', 'set-without-control', `${plural(ids.length, 'set has', 'sets have')} no control (set ${listIds(ids)}); every set needs at least one control`),
    );
  }
  if (grouping.setsWithoutTreated.length > 0) {
    const ids = grouping.setsWithoutTreated;
    problems.push(
      inputProblem('treated', 'set-without-treated', `${plural(ids.length, 'set has', 'sets have')} no treated unit (set ${listIds(ids)}); every set needs exactly one`),
    );
  }
  if (grouping.setsWithSeveralTreated.length > 0) {
    const ids = grouping.setsWithSeveralTreated;
    problems.push(
      inputProblem(
        'treated',
        'several-treated',
        `${plural(ids.length, 'set has', 'sets have')} more than one treated unit (set ${listIds(ids)}); several treated with one control is not supported: each set needs exactly one treated unit`,
      ),
    );
  }
  if (problems.length > 0) return problems;

  const layout = grouping.layout;
  if (layout.sets < 2) {
    problems.push(
      inputProblem('setIds', 'too-few-sets', `needs at least two matched sets with a treated and a control outcome; found ${layout.sets}`),
    );
    return problems;
  }
  const values = layout.values;
  let allEqual = true;
  for (let i = 1; i < values.length && allEqual; i++) if (values[i] !== values[0]) allEqual = false;
  if (allEqual) {
    problems.push(inputProblem('outcomes', 'all-equal', `every outcome is ${values[0]}; there is nothing to compare`));
    return problems;
  }
  const binary = isBinaryLayout(layout);
  const kind = input.outcomeKind ?? 'auto';
  if (kind === 'binary' && !binary) {
    problems.push(inputProblem('outcomes', 'not-binary', 'a binary outcome must be 0 (no event) or 1 (event) in every row'));
  } else if (kind === 'binary' || (kind === 'auto' && binary)) {
    if (matchedSetsEventCounts(layout).informativeSets === 0) {
      problems.push(
        inputProblem('outcomes', 'no-informative-sets', 'no set has both a unit with the event and a unit without it, so the sets carry no information'),
      );
    }
  } else if (kind === 'continuous' || kind === 'auto') {
    const differences = values.length - layout.sets;
    if (mStatisticScale(layout) === 0) {
      problems.push(
        inputProblem(
          'outcomes',
          'zero-scale',
          `more than half of the ${differences} treated-minus-control differences are zero, so their median (the scale σ) is 0 and the m-statistic cannot be formed`,
        ),
      );
    }
  }
  return problems;
}

function checkOptions(input: MatchedSetsInput, problems: InputProblem[]): void {
  if (input?.alternative !== undefined && input.alternative !== 'greater' && input.alternative !== 'less') {
    problems.push(inputProblem('alternative', 'not-a-choice', 'must be greater or less', input.alternative));
  }
  if (input?.outcomeKind !== undefined && !['auto', 'continuous', 'binary'].includes(input.outcomeKind)) {
    problems.push(inputProblem('outcomeKind', 'not-a-choice', 'must be auto, continuous or binary', input.outcomeKind));
  }
  if (input?.tail !== undefined && input.tail !== 'exact' && input.tail !== 'normal') {
    problems.push(inputProblem('tail', 'not-a-choice', 'must be exact or normal', input.tail));
  }
  if (input?.alpha !== undefined && !(typeof input.alpha === 'number' && input.alpha > 0 && input.alpha <= 0.5)) {
    problems.push(inputProblem('alpha', 'outside-interval', 'must be above 0 and at most 0.5 (e.g. 0.05)', input.alpha));
  }
  if (input?.trim !== undefined && !(typeof input.trim === 'number' && input.trim > 0 && Number.isFinite(input.trim))) {
    problems.push(inputProblem('trim', 'not-positive', 'must be a positive number (e.g. 2.5)', input.trim));
  }
  if (input?.gammas !== undefined) problems.push(...gammaListProblems(input.gammas));
}

/**
 * Sensitivity analysis of a matched-sets study (one treated unit, one or more controls per set): bounds on the
 * one-sided p-value for a range of hidden biases Γ, the sensitivity value, and for a continuous outcome the
 * m-estimate of the effect with its range and sensitivity interval under each Γ.
 *
 * **Method.** Continuous outcomes: Rosenbaum's m-statistic with Huber's ψ and the separable approximation
 * (`matchedSetsMStatistic`, `mStatisticUpperP`, `mEstimate`, `mEstimateUnderBias`); conventions: σ = the
 * median |treated − control| over all sets and controls at no effect; ψ(x) = max(−c, min(c, x)), c = `trim`;
 * unit scores are the mean over the other units of the set of ψ(difference/σ); T = Σ treated scores; under Γ
 * each set's bounding mean is the largest weighted mean over splits of its sorted scores (weight 1 to the a
 * smallest, Γ to the rest; largest variance among tied means); p ≤ 1 − Φ((T − E)/√V); the effect τ shifts the
 * treated outcomes by −τ with σ fixed. Binary outcomes: the count of treated events over informative sets,
 * bounded by independent Bernoullis with probability Γe/(Γe + n − e) (`matchedSetsEventBound`), exact
 * Poisson-binomial tails or their normal approximation. The alternative `less` negates a continuous outcome
 * (reports estimates back on the original scale) and swaps events and non-events of a binary one. The
 * sensitivity value is found by `tippingGamma`; amplification by `readableAmplifications`
 * (Γ = (ΛΔ + 1)/(Λ + Δ)). The result lists these conventions in `conventions`.
 *
 * **References.** Rosenbaum PR (2007) Biometrics 63(2):456–464; Gastwirth JL, Krieger AM, Rosenbaum PR (2000)
 * JRSS-B 62(3):545–555; Huber PJ (1964) Ann Math Stat 35:73–101; Rosenbaum PR (2002) Observational Studies,
 * 2nd ed., ch. 4 — all recalled from memory; Rosenbaum PR, Silber JH (2009) JASA 104:1398–1405.
 *
 * **Special cases.** Rows with a missing outcome are left out and counted; a set left without its treated
 * unit or without any control is left out and named in `counts.setsDropped`. A sensitivity interval end that
 * is unbounded is null (with a warning). `tail` is ignored for continuous outcomes (always the normal
 * approximation of the separable bound), with a warning when `exact` was asked for.
 *
 * @throws InputError listing every problem when the input breaks a rule (see `validateMatchedSets`)
 */
export function analyseMatchedSets(input: MatchedSetsInput): MatchedSetsResult {
  throwIfProblems(validateMatchedSets(input));
  const alpha = input.alpha ?? 0.05;
  const alternative = input.alternative ?? 'greater';
  const trim = input.trim ?? 2.5;
  const warnings: string[] = [];
  const grouping = groupMatchedSets(input);
  const layout = grouping.layout;
  const binaryData = isBinaryLayout(layout);
  const askedKind = input.outcomeKind ?? 'auto';
  const outcomeKind: MatchedSetsOutcomeKind = askedKind === 'auto' ? (binaryData ? 'binary' : 'continuous') : askedKind;
  const outcomeKindReason =
    askedKind !== 'auto'
      ? `${outcomeKind}, as requested`
      : binaryData
        ? 'binary: every outcome is 0 or 1'
        : 'continuous: the outcomes are not all 0 or 1';

  if (grouping.missingOutcomes > 0) {
    warnings.push(`${plural(grouping.missingOutcomes, 'row has', 'rows have')} no outcome (empty or not a number) and ${grouping.missingOutcomes === 1 ? 'was' : 'were'} left out.`);
  }
  const setsDropped: MatchedSetsDropped[] = [];
  if (grouping.droppedMissingTreatedOutcome.length > 0) {
    const ids = grouping.droppedMissingTreatedOutcome;
    setsDropped.push(
      Object.freeze({ code: 'missing-treated-outcome', reason: 'the treated unit has no outcome', sets: ids.length, ids: Object.freeze(ids.slice(0, MAX_LISTED)) }),
    );
    warnings.push(`${plural(ids.length, 'set was', 'sets were')} left out because the treated unit has no outcome (set ${listIds(ids)}).`);
  }
  if (grouping.droppedMissingControlOutcomes.length > 0) {
    const ids = grouping.droppedMissingControlOutcomes;
    setsDropped.push(
      Object.freeze({ code: 'missing-control-outcomes', reason: 'no control has an outcome', sets: ids.length, ids: Object.freeze(ids.slice(0, MAX_LISTED)) }),
    );
    warnings.push(`${plural(ids.length, 'set was', 'sets were')} left out because no control has an outcome (set ${listIds(ids)}).`);
  }
  const controlsCount = new Map<number, number>();
  for (let s = 0; s < layout.sets; s++) {
    const k = layout.start[s + 1] - layout.start[s] - 1;
    controlsCount.set(k, (controlsCount.get(k) ?? 0) + 1);
  }
  const controlsPerSet = Object.freeze(
    [...controlsCount.entries()].sort((a, b) => a[0] - b[0]).map(([controls, sets]) => Object.freeze({ controls, sets })),
  );
  const baseCounts = {
    rows: grouping.rows,
    setsGiven: grouping.setsGiven,
    setsUsed: layout.sets,
    units: layout.values.length,
    controlsPerSet,
    missingOutcomes: grouping.missingOutcomes,
    setsDropped: Object.freeze(setsDropped),
  };

  const common = { alpha, alternative, intervalLevel: 1 - alpha };
  let result: MatchedSetsResult;
  if (outcomeKind === 'binary') {
    const tail = input.tail ?? 'exact';
    const oriented = alternative === 'less' ? mapMatchedSetsOutcomes(layout, (y) => 1 - y) : layout;
    const counts = matchedSetsEventCounts(oriented);
    if (counts.uninformativeSets > 0) {
      warnings.push(
        `${plural(counts.uninformativeSets, 'set', 'sets')} in which no unit or every unit had the event carry no information and ${counts.uninformativeSets === 1 ? 'was' : 'were'} left out of the test.`,
      );
    }
    const upperAt = (g: number) => matchedSetsEventBound(counts, g, tail).pUpper;
    const normalAt = (g: number) => matchedSetsEventBound(counts, g, 'normal').pUpper;
    const guess = tail === 'exact' ? tippingGamma(normalAt, alpha, { tolerance: 1e-4 }).gamma ?? undefined : undefined;
    const tipping = tippingGamma(upperAt, alpha, { guess, model: tail === 'exact' ? normalAt : undefined });
    const gammas = input.gammas ? [...input.gammas] : defaultGammaGrid(tipping);
    const rows = gammas.map((gamma) => {
      const b = matchedSetsEventBound(counts, gamma, tail);
      return Object.freeze({
        gamma,
        pUpper: b.pUpper,
        pLower: b.pLower,
        expectation: b.expectation,
        variance: b.variance,
        estimateLow: null,
        estimateHigh: null,
        intervalLow: null,
        intervalHigh: null,
      });
    });
    pushTippingWarnings(tipping, alpha, warnings);
    result = {
      method:
        tail === 'exact'
          ? 'Rosenbaum bounds for matched sets with a binary outcome: count of treated events, exact tails'
          : 'Rosenbaum bounds for matched sets with a binary outcome: count of treated events, normal approximation',
      references: REFERENCES_BINARY,
      outcomeKind,
      outcomeKindReason,
      ...common,
      tail,
      counts: Object.freeze({ ...baseCounts, informativeSets: counts.informativeSets, uninformativeSets: counts.uninformativeSets }),
      scale: null,
      trim: null,
      statistic: counts.statistic,
      pValue: tipping.pAtOne,
      rows: Object.freeze(rows),
      estimate: null,
      sensitivityValue: tipping.gamma,
      sensitivityStatus: tipping.status,
      searchedUpTo: tipping.searchedUpTo,
      amplification: Object.freeze(tipping.gamma !== null ? readableAmplifications(tipping.gamma) : []),
      conventions: binaryConventions(tail, alternative),
      warnings: Object.freeze(warnings),
    };
  } else {
    if (input.tail === 'exact') warnings.push('For a continuous outcome the bounds use the normal approximation (separable bounds); the exact tail applies to binary outcomes only.');
    const oriented = alternative === 'less' ? mapMatchedSetsOutcomes(layout, (y) => -y) : layout;
    const scale = mStatisticScale(layout);
    const test = matchedSetsMStatistic(oriented, scale, trim);
    const upperAt = (g: number) => mStatisticUpperP(test.at(0, g, 'upper'));
    const tipping = tippingGamma(upperAt, alpha);
    const gammas = input.gammas ? [...input.gammas] : defaultGammaGrid(tipping);
    // Estimates on the original scale (they do not depend on the alternative).
    const forEstimates = alternative === 'less' ? matchedSetsMStatistic(layout, scale, trim) : test;
    const bracket = mEstimateBracket(layout, scale, trim);
    const estimate = mEstimate(forEstimates, bracket);
    const unboundedLow: number[] = [];
    const unboundedHigh: number[] = [];
    const rows = gammas.map((gamma) => {
      const bounds = test.at(0, gamma);
      const range = mEstimateUnderBias(forEstimates, bracket, gamma, alpha);
      if (range.intervalLow === null) unboundedLow.push(gamma);
      if (range.intervalHigh === null) unboundedHigh.push(gamma);
      return Object.freeze({
        gamma,
        pUpper: mStatisticUpperP(bounds, 'upper'),
        pLower: mStatisticUpperP(bounds, 'lower'),
        expectation: bounds.upperExpectation,
        variance: bounds.upperVariance,
        estimateLow: gamma === 1 ? estimate : range.estimateLow,
        estimateHigh: gamma === 1 ? estimate : range.estimateHigh,
        intervalLow: range.intervalLow,
        intervalHigh: range.intervalHigh,
      });
    });
    if (unboundedLow.length > 0) warnings.push(`The sensitivity interval has no lower end at Γ = ${unboundedLow.join(', ')}: no effect, however small, is rejected.`);
    if (unboundedHigh.length > 0) warnings.push(`The sensitivity interval has no upper end at Γ = ${unboundedHigh.join(', ')}: no effect, however large, is rejected.`);
    pushTippingWarnings(tipping, alpha, warnings);
    result = {
      method: 'Rosenbaum bounds for matched sets: m-statistic with Huber’s ψ (separable approximation)',
      references: REFERENCES_CONTINUOUS,
      outcomeKind,
      outcomeKindReason,
      ...common,
      tail: 'normal',
      counts: Object.freeze({ ...baseCounts, informativeSets: null, uninformativeSets: null }),
      scale,
      trim,
      statistic: test.at(0, 1, 'upper').statistic,
      pValue: tipping.pAtOne,
      rows: Object.freeze(rows),
      estimate,
      sensitivityValue: tipping.gamma,
      sensitivityStatus: tipping.status,
      searchedUpTo: tipping.searchedUpTo,
      amplification: Object.freeze(tipping.gamma !== null ? readableAmplifications(tipping.gamma) : []),
      conventions: continuousConventions(trim, alternative),
      warnings: Object.freeze(warnings),
    };
  }
  return Object.freeze(result);
}

function pushTippingWarnings(tipping: TippingGamma, alpha: number, warnings: string[]): void {
  if (tipping.status === 'not-significant') {
    warnings.push(`The finding is not significant at α = ${alpha} even with no hidden bias (p = ${tipping.pAtOne.toPrecision(3)} at Γ = 1).`);
  }
  if (tipping.status === 'beyond-range') warnings.push(`The bound stays below α up to the largest Γ searched (${tipping.searchedUpTo}).`);
}

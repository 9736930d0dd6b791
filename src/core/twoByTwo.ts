import { confidenceZ } from './confidenceZ';
import type { InputProblem } from './inputProblem';
import { inputProblem } from './inputProblem';

/**
 * The four cells of an exposure × outcome table of counts.
 *
 * |           | had the outcome | did not |
 * |-----------|-----------------|---------|
 * | exposed   | a               | b       |
 * | unexposed | c               | d       |
 */
export interface TwoByTwoCounts {
  /** Exposed, had the outcome. */
  readonly a: number;
  /** Exposed, did not have the outcome. */
  readonly b: number;
  /** Unexposed, had the outcome. */
  readonly c: number;
  /** Unexposed, did not have the outcome. */
  readonly d: number;
}

/** The ratio measures a 2×2 table gives. */
export type TwoByTwoMeasure = 'rr' | 'or';

/** A ratio from a 2×2 table with its log-scale Wald interval. */
export interface TwoByTwoEstimate {
  readonly measure: TwoByTwoMeasure;
  readonly estimate: number;
  readonly lower: number;
  readonly upper: number;
  /** The standard error of the log ratio. */
  readonly logSe: number;
  readonly level: number;
  /** The counts as given. */
  readonly counts: TwoByTwoCounts;
  /** The counts the ratio was computed from (0.5 added to every cell when any cell was zero). */
  readonly countsUsed: TwoByTwoCounts;
  readonly zeroCellCorrection: boolean;
  readonly warnings: readonly string[];
}

/** The amount added to every cell when any cell is zero. */
export const ZERO_CELL_CORRECTION = 0.5;

const CELLS = ['a', 'b', 'c', 'd'] as const;

/**
 * Checks a 2×2 table of counts: every cell a finite whole number ≥ 0, each exposure group non-empty, and
 * both outcome columns non-empty (otherwise no ratio is defined, corrected or not).
 *
 * @param counts the table
 * @param field the field path of the table in the caller's input (problems name `field.a` and so on)
 * @returns every problem found (empty when the table is usable)
 */
export function validateTwoByTwoCounts(counts: TwoByTwoCounts | null | undefined, field = 'counts'): InputProblem[] {
  if (counts === null || typeof counts !== 'object') {
    return [inputProblem(field, 'required', 'needs the four counts a, b, c, d', counts)];
  }
  const problems: InputProblem[] = [];
  for (const cell of CELLS) {
    const value = counts[cell];
    if (typeof value !== 'number' || Number.isNaN(value)) {
      problems.push(inputProblem(`${field}.${cell}`, 'not-a-number', 'must be a number (a count)', value));
    } else if (!Number.isFinite(value) || value < 0 || !Number.isInteger(value)) {
      problems.push(inputProblem(`${field}.${cell}`, 'not-a-count', 'must be a whole number of people, 0 or more', value));
    }
  }
  if (problems.length > 0) return problems;
  const { a, b, c, d } = counts;
  if (a + b === 0) problems.push(inputProblem(field, 'empty-group', 'has no exposed people (a + b = 0)'));
  if (c + d === 0) problems.push(inputProblem(field, 'empty-group', 'has no unexposed people (c + d = 0)'));
  if (problems.length === 0 && a + c === 0) {
    problems.push(inputProblem(field, 'no-outcomes', 'has nobody with the outcome (a + c = 0): no ratio is defined'));
  }
  if (problems.length === 0 && b + d === 0) {
    problems.push(inputProblem(field, 'all-outcomes', 'has everybody with the outcome (b + d = 0): no ratio is defined'));
  }
  return problems;
}

/**
 * The risk ratio or odds ratio of a 2×2 table with a log-scale Wald confidence interval.
 *
 * **Method.** RR = (a/(a + b))/(c/(c + d)) with SE(log RR) = √(b/(a(a + b)) + d/(c(c + d))), the usual
 * 1/a − 1/(a + b) + 1/c − 1/(c + d) written without subtraction. OR = (a/b)·(d/c) with
 * SE(log OR) = √(1/a + 1/b + 1/c + 1/d) (Woolf). Interval: exp(log ratio ± z·SE), z the two-sided normal
 * critical value for the level. When any cell is zero, 0.5 is added to every cell first (Haldane–Anscombe),
 * and a warning says so.
 *
 * **References.** Rothman KJ, Greenland S, Lash TL (2008). Modern Epidemiology, 3rd ed., Lippincott Williams
 * & Wilkins, ch. 14 (Wald intervals for the risk ratio and the odds ratio). Woolf B (1955). On estimating the
 * relation between blood group and disease. Annals of Human Genetics 19(4):251–253. Haldane JBS (1956). The
 * estimation and significance of the logarithm of a ratio of frequencies. Annals of Human Genetics
 * 20(4):309–311 (the 0.5 correction).
 *
 * **Special cases.** Counts are assumed valid (see {@link validateTwoByTwoCounts}); an invalid table or level
 * gives NaN numbers.
 *
 * @param counts the table of counts (whole numbers ≥ 0)
 * @param measure `rr` for the risk ratio, `or` for the odds ratio
 * @param level the confidence level, in (0, 1); default 0.95
 */
export function twoByTwoRatio(counts: TwoByTwoCounts, measure: TwoByTwoMeasure, level = 0.95): TwoByTwoEstimate {
  const zeroCellCorrection = CELLS.some((cell) => counts[cell] === 0);
  const add = zeroCellCorrection ? ZERO_CELL_CORRECTION : 0;
  const used = Object.freeze({ a: counts.a + add, b: counts.b + add, c: counts.c + add, d: counts.d + add });
  const { a, b, c, d } = used;
  let estimate: number;
  let logSe: number;
  if (measure === 'rr') {
    estimate = a / (a + b) / (c / (c + d));
    logSe = Math.sqrt(b / (a * (a + b)) + d / (c * (c + d)));
  } else {
    estimate = (a / b) * (d / c);
    logSe = Math.sqrt(1 / a + 1 / b + 1 / c + 1 / d);
  }
  const halfWidth = confidenceZ(level) * logSe;
  const logEstimate = Math.log(estimate);
  const warnings = zeroCellCorrection
    ? [
        `A cell of the table is zero, so ${ZERO_CELL_CORRECTION} was added to every cell before computing the ` +
          `${measure === 'rr' ? 'risk' : 'odds'} ratio and its interval; treat both as rough.`,
      ]
    : [];
  return Object.freeze({
    measure,
    estimate,
    lower: Math.exp(logEstimate - halfWidth),
    upper: Math.exp(logEstimate + halfWidth),
    logSe,
    level,
    counts: Object.freeze({ a: counts.a, b: counts.b, c: counts.c, d: counts.d }),
    countsUsed: used,
    zeroCellCorrection,
    warnings: Object.freeze(warnings),
  });
}

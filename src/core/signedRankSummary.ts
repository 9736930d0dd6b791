import { inputProblem, type InputProblem } from './inputProblem';
import type { SignedRanks } from './signedRanks';

/**
 * The sums of a Wilcoxon signed-rank analysis (Wilcoxon's rule: zero differences dropped, mid-ranks for tied
 * |d|), as a database query returns them when the differences themselves stay in the database.
 */
export interface SignedRankSummary {
  /** Pairs used (every pair with both values present). */
  readonly pairs: number;
  /** Pairs with a difference of exactly zero. */
  readonly zeros: number;
  /** Pairs with a non-zero difference (pairs − zeros). */
  readonly nonZero: number;
  /** Pairs with a positive difference (treated − control > 0). */
  readonly positive: number;
  /** T: the sum of the ranks of |d| over the positive differences. */
  readonly statistic: number;
  /** ΣRᵢ over the non-zero differences: nonZero·(nonZero + 1)/2. */
  readonly sumRanks: number;
  /** ΣRᵢ² over the non-zero differences (below n(n + 1)(2n + 1)/6 when |d| has ties). */
  readonly sumSquaredRanks: number;
}

/**
 * Checks a signed-rank summary and lists every problem (field `${field}.<key>`); an empty list means valid.
 *
 * **Method.** Each count a whole number ≥ 0, each sum a finite number ≥ 0; the identities of mid-ranks:
 * pairs = zeros + nonZero, positive ≤ nonZero, ΣRᵢ = n(n + 1)/2, T ≤ ΣRᵢ, and n ≤ ΣRᵢ² ≤ n(n + 1)(2n + 1)/6
 * (the lower end: all |d| tied, every rank (n + 1)/2 gives n(n + 1)²/4, which is ≥ n; the upper end: no ties),
 * each checked to a relative 1e-9 (the sums may come from a database in double precision).
 *
 * **References.** Wilcoxon F (1945) Individual comparisons by ranking methods. Biometrics Bulletin 1(6):80–83.
 * Lehmann EL (1975) Nonparametrics, ch. 3 (mid-ranks and the variance under ties; recalled from memory).
 *
 * **Special cases.** Fewer than two non-zero pairs is a problem (`too-few-pairs`), as for raw differences.
 *
 * @param summary the sums; any field may be of the wrong type (each is checked)
 * @param field prefix of the problems' fields (default `data`)
 */
export function validateSignedRankSummary(summary: SignedRankSummary, field = 'data'): InputProblem[] {
  const problems: InputProblem[] = [];
  const s = summary as unknown as Record<string, unknown>;
  const counts = ['pairs', 'zeros', 'nonZero', 'positive'] as const;
  const sums = ['statistic', 'sumRanks', 'sumSquaredRanks'] as const;
  for (const key of counts) {
    const v = s[key];
    if (!(typeof v === 'number' && Number.isInteger(v) && v >= 0)) problems.push(inputProblem(`${field}.${key}`, 'not-count', 'must be a whole number, 0 or more', v));
  }
  for (const key of sums) {
    const v = s[key];
    if (!(typeof v === 'number' && Number.isFinite(v) && v >= 0)) problems.push(inputProblem(`${field}.${key}`, 'not-sum', 'must be a finite number, 0 or more', v));
  }
  if (problems.length > 0) return problems;
  const n = summary.nonZero;
  const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));
  if (summary.zeros + n !== summary.pairs) {
    problems.push(inputProblem(`${field}.pairs`, 'inconsistent', `must equal zeros + non-zero pairs (${summary.zeros} + ${n}), got ${summary.pairs}`, summary.pairs));
  }
  if (summary.positive > n) problems.push(inputProblem(`${field}.positive`, 'inconsistent', `cannot exceed the non-zero pairs (${n})`, summary.positive));
  if (!close(summary.sumRanks, (n * (n + 1)) / 2)) {
    problems.push(inputProblem(`${field}.sumRanks`, 'inconsistent', `must be n(n + 1)/2 = ${(n * (n + 1)) / 2} for n = ${n} non-zero pairs`, summary.sumRanks));
  }
  if (summary.statistic > summary.sumRanks * (1 + 1e-9)) {
    problems.push(inputProblem(`${field}.statistic`, 'inconsistent', 'cannot exceed the sum of all ranks', summary.statistic));
  }
  const most = (n * (n + 1) * (2 * n + 1)) / 6;
  const least = (n * (n + 1) * (n + 1)) / 4;
  if (n > 0 && (summary.sumSquaredRanks > most * (1 + 1e-9) || summary.sumSquaredRanks < least * (1 - 1e-9))) {
    problems.push(
      inputProblem(`${field}.sumSquaredRanks`, 'inconsistent', `must lie between n(n + 1)²/4 = ${least} and n(n + 1)(2n + 1)/6 = ${most} for n = ${n}`, summary.sumSquaredRanks),
    );
  }
  if (problems.length === 0 && n < 2) {
    problems.push(inputProblem(field, 'too-few-pairs', `needs at least two pairs whose outcomes differ (non-zero differences); found ${n} among ${summary.pairs} pairs`));
  }
  return problems;
}

/**
 * The signed ranks that the normal approximation of the bounds needs, built from a summary (no individual ranks:
 * `ranks` is empty, so only the normal approximation can use the result).
 *
 * **Method.** For the alternative `less` every difference changes sign (Rosenbaum 2002, §4.3.3): the positive
 * pairs become nonZero − positive and T becomes ΣRᵢ − T; ΣRᵢ and ΣRᵢ² stay. Ties are present when
 * ΣRᵢ² < n(n + 1)(2n + 1)/6 by more than a relative 1e-12.
 *
 * **References.** Rosenbaum PR (2002) Observational Studies, 2nd ed. New York: Springer, §4.3.3.
 *
 * **Special cases.** None beyond the validation (call {@link validateSignedRankSummary} first).
 *
 * @param summary a valid summary
 * @param direction 1 for the alternative `greater`, −1 for `less`
 */
export function signedRanksFromSummary(summary: SignedRankSummary, direction: 1 | -1 = 1): SignedRanks {
  const n = summary.nonZero;
  const untied = (n * (n + 1) * (2 * n + 1)) / 6;
  return Object.freeze({
    pairs: summary.pairs,
    zeros: summary.zeros,
    nonZero: n,
    positive: direction === 1 ? summary.positive : n - summary.positive,
    ranks: new Float64Array(0),
    statistic: direction === 1 ? summary.statistic : summary.sumRanks - summary.statistic,
    sumRanks: summary.sumRanks,
    sumSquaredRanks: summary.sumSquaredRanks,
    zeroRule: 'wilcoxon' as const,
    tieTolerance: 0,
    tiedMagnitudes: summary.sumSquaredRanks < untied * (1 - 1e-12),
  });
}

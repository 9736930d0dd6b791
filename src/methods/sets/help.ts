import { NUMBER_READING_RULE } from '../../data/numberText';
import { SETS_CAUTION } from './text';

/** The text of `lurk sets --help`. */
export const SETS_HELP = `lurk sets — Rosenbaum bounds for a matched-sets study (each set: one treated unit and one or more controls):
how large a hidden bias Γ would have to be before the finding stops being significant, and how the effect estimate
widens with Γ. Γ is the largest factor by which two units of a matched set may differ in their odds of treatment
because of an unmeasured covariate.

  lurk sets --file data.csv --set COLUMN --treated COLUMN --outcome COLUMN [options]
  cat data.csv | lurk sets --file - --set COLUMN --treated COLUMN --outcome COLUMN [options]

Data:
  --file F            a CSV file (comma, semicolon or tab separated) with a header row, one row per unit;
                      "-" reads standard input
  --set COLUMN        the set id of each unit (text: 1 and "1" are the same set)
  --treated COLUMN    1 for the treated unit of its set, 0 for a control
  --outcome COLUMN    the outcome; an empty cell (or NA, N/A, NaN, NULL, ".") is missing: the row is left out
                      and counted. A cell that is not a number is an error naming its rows.

Analysis:
  --gamma G1,G2,...   the Γ values to tabulate, each 1 or more (default: from 1 to just past the tipping point)
  --alpha A           one-sided significance level, above 0 and at most 0.5 (default 0.05; "5%" is 0.05)
  --alternative A     greater (treatment raises the outcome, default) or less (lowers it)
  --trim C            c of Huber's ψ in units of σ, a positive number (default 2.5; continuous outcomes)
  --outcome-kind K    auto (default: binary when every outcome is 0 or 1), continuous or binary
  --tail T            binary outcomes: exact (default) or normal; continuous outcomes always use the normal
                      approximation
  --json              print one JSON object (counts, sensitivityValue, rows of {gamma, pUpper, pLower, ...},
                      estimates, amplification, reading, conventions, warnings, references)

Conventions (continuous outcome: Rosenbaum's m-statistic, separable approximation):
  σ, the scale: the median of |treated − control| over all sets and all their controls, computed once at no effect.
  ψ(x) = max(−c, min(c, x)), c = --trim (Huber).
  Score of a unit: the mean over the other units of its set of ψ((its outcome − theirs)/σ); T = the sum over
  sets of the treated unit's score.
  Bound under Γ: per set, sort the scores; the split a = 1 … n − 1 gives weight 1 to the a smallest and Γ to the
  rest; the set's mean is the largest weighted mean over a, its variance the largest weighted variance among
  splits tied at that mean; means and variances add over sets. The lower bound applies the rule to −scores.
  p-value bounds: the normal approximation 1 − Φ((T − E)/√V).
  Effect τ: treated outcomes shifted by −τ with σ fixed; the m-estimate solves T(τ) = its expectation at Γ = 1;
  under Γ the range solves T(τ) = the upper and the lower expectation; the two-sided 1 − α sensitivity interval
  uses the normal critical value at α/2 on each side (an end may be unbounded).
  --alternative less negates the outcomes; estimates stay on the outcome's own scale.
Conventions (binary outcome, every value 0 or 1):
  T = the number of treated units with the event over informative sets (some but not all units had it); sets
  with no or every unit with the event carry no information and are left out of the test.
  Under Γ a set with e events among n units adds an independent Bernoulli with probability at most
  Γe/(Γe + n − e); --tail exact gives the exact Poisson-binomial tail P(T_Γ ≥ T) (by convolution), --tail normal
  its normal approximation without continuity correction. --alternative less swaps events and non-events.
Both:
  Sets left out: a set whose treated unit has no outcome, or none of whose controls has one, is left out and
  named in the report. A set with no treated unit, several treated units or no control is an error naming it.
  Sensitivity value (tipping Γ): the largest Γ at which the upper p-value bound is still at most α.
  Amplification: Γ = (ΛΔ + 1)/(Λ + Δ) (Rosenbaum & Silber 2009).

${NUMBER_READING_RULE}

${SETS_CAUTION}
`;

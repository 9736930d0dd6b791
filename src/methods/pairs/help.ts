import { EXACT_PAIRS_LIMIT } from '../../core/pairsAnalysis';
import { NORMAL_APPROXIMATION_MEASURED_ERROR } from '../../core/signedRankBound';
import { NUMBER_READING_RULE } from '../../data/numberText';

const percent = (x: number) => `${Number((x * 100).toPrecision(2))}%`;
import { PAIRS_CAUTION } from './text';
import { SUMMARY_ARGUMENT_RULE } from '../summaryArgument';

/** The text of `lurk pairs --help`. */
export const PAIRS_HELP = `lurk pairs — Rosenbaum bounds for a matched-pairs study: how large a hidden bias Γ would have to be before
the finding stops being significant, and how the effect estimate widens with Γ. Γ is the largest factor by which
two matched units may differ in their odds of treatment because of an unmeasured covariate.

  lurk pairs --file data.csv --treated COLUMN --control COLUMN [options]
  lurk pairs --file data.csv --diff COLUMN [options]
  lurk pairs --discordant A,B [options]
  lurk pairs --sql TABLE --diff COLUMN | --treated COLUMN --control COLUMN   prints a query for your database
  lurk pairs --summary ROW [options]                                     analyses its one result row

Data (one source: a file with its columns, or discordant counts):
  --file F            a CSV file (comma, semicolon or tab separated) with a header row, one row per pair;
                      rows with a missing value (empty, NA, ...) are left out and counted
  --treated, --control  the treated unit's and the control unit's outcome columns (difference = treated − control);
                      two columns holding only 0 and 1 are read as a binary outcome
  --diff COLUMN       or one column of treated − control differences
  --discordant A,B    a binary outcome: A pairs where only the treated unit had the event, B where only the control did
  --outcome-type T    auto (default), numeric, or binary (insist on 0/1 columns)
  --sql TABLE         the pairs stay in your database: print one standard SQL query (signed-rank sums) over
                      TABLE (or schema.table); run it there and give its one result row to --summary
  --summary ROW       the query's result row; bounds by the normal approximation, no Hodges–Lehmann estimate.
                      ${SUMMARY_ARGUMENT_RULE.replace(/\n/g, '\n                      ')}

Analysis:
  --test T            signrank (Wilcoxon signed-rank, default) or sign (sign test; McNemar for binary outcomes)
  --alternative A     greater (treatment raises the outcome, default) or less (lowers it); one-sided
  --alpha A           significance level, between 0 and 1 (default 0.05; "5%" is 0.05)
  --gamma G1,G2,...   the Γ values to tabulate, each 1 or more (default: from 1 to just past the tipping point)
  --method M          exact or normal (default: exact up to ${EXACT_PAIRS_LIMIT.toLocaleString('en-US')} pairs, zero differences included;
                      the normal approximation beyond, whose relative error near p = 0.05 was measured at up to
                      ${percent(NORMAL_APPROXIMATION_MEASURED_ERROR.atAlpha05)} for Γ ≤ 2 and ${NORMAL_APPROXIMATION_MEASURED_ERROR.fromPairs.toLocaleString('en-US')} pairs or more, on the cautious side)
  --continuity-correction  subtract ½ from the statistic in the normal approximation
  --zeros Z           signed-rank test: wilcoxon (default: pairs with a zero difference are left out of the test)
                      or pratt (ranked with the others and scored 0); both keep every pair in the estimate
  --json              print one JSON object (n, sensitivityValue, rows of {gamma, pUpper, pLower}, estimates,
                      reading, ...)

Conventions (each report lists the ones that apply):
  - Zero differences: left out of the sign test; in the signed-rank test as --zeros says.
  - Differences whose sizes agree to about 10 significant digits tie and share their average rank.
  - The p-value bounds are one-sided at α; the sensitivity value (tipping Γ) is the largest Γ whose upper
    bound is still at most α. The sensitivity interval is two-sided at 1 − α (α/2 in each tail).
  - The Hodges–Lehmann estimate and its range under Γ assume an additive, constant effect.

${NUMBER_READING_RULE}

${PAIRS_CAUTION}
`;

import type { Appraisal } from './appraisal';
import type { EValueSummary, OvbSummary, PairsSummary } from './calculatorSummaries';
import { formatNumber, formatPercent } from '../format/formatNumber';
import { exposureLabel, outcomeLabel } from '../format/studyLabels';
import { formatGamma } from '../methods/pairs/text';

/**
 * The bottom line for decision-makers: in plain words, how strong a hidden confounder would have to be,
 * compared with the strongest measured covariates where known, what would and would not change the
 * conclusion, and the caution. No statistics vocabulary beyond what is explained in the same sentence.
 */
export interface BottomLine {
  /** One sentence per analysis: how strong a hidden confounder would have to be. */
  readonly howStrong: readonly string[];
  /** Comparisons with measured covariates or known confounders, where given. */
  readonly comparedWithMeasured: readonly string[];
  /** What would change the conclusion. */
  readonly wouldChange: readonly string[];
  /** What would not. */
  readonly wouldNotChange: readonly string[];
  readonly caution: string;
  /** True when no calculator has a result yet. */
  readonly empty: boolean;
}

export const DECISION_CAUTION =
  'A sensitivity analysis bounds how much hidden confounding it would take to change a conclusion; it does not prove ' +
  'that the exposure causes the outcome, and it does not address other problems such as who was studied or how things ' +
  'were measured. Decisions about health or safety defer to domain experts, local guidance and licensed practice.';

export function buildBottomLine(appraisal: Appraisal): BottomLine {
  const exposure = exposureLabel(appraisal.study);
  const outcome = outcomeLabel(appraisal.study);
  const howStrong: string[] = [];
  const compared: string[] = [];
  const change: string[] = [];
  const notChange: string[] = [];

  const e = appraisal.calculators.evalue?.summary as EValueSummary | null | undefined;
  if (e?.kind === 'evalue' && e.eValueEstimate !== null) {
    const ev = two(e.eValueEstimate);
    howStrong.push(
      `To explain away the link between ${exposure} and ${outcome}, a hidden factor would have to make both ${exposure} and ${outcome} at least ${ev} times as likely (E-value ${ev}), beyond what was already accounted for.`,
    );
    if (e.eValueInterval !== null) {
      if (e.eValueInterval === 1) {
        change.push(`The reported range of plausible values already includes no effect, so even without any hidden confounding the data are compatible with no link.`);
      } else {
        change.push(`A hidden factor making both at least ${two(e.eValueInterval)} times as likely could make the result compatible with no link.`);
      }
    }
    notChange.push(`Hidden factors weaker than ${ev}-fold with both ${exposure} and ${outcome} could not explain the link away on their own.`);
    for (const r of e.references ?? []) {
      compared.push(
        `${r.name} (about ${two(r.rrExposure)}-fold with ${exposure} and ${two(r.rrOutcome)}-fold with ${outcome}): a hidden factor this strong ${r.explainsEstimate ? 'could' : 'could not'} explain the link away.`,
      );
    }
  }

  const p = appraisal.calculators.pairs?.summary as PairsSummary | null | undefined;
  if (p?.kind === 'pairs' && p.pValue !== null) {
    if (p.sensitivityValue !== null) {
      const g = formatGamma(p.sensitivityValue);
      howStrong.push(
        `In the matched comparison, the finding holds unless a hidden factor made otherwise similar people differ in their chances of ${exposure} by more than ${g} to 1 (Γ = ${g}).`,
      );
      change.push(`A hidden factor that changed the odds of ${exposure} within matched pairs by more than ${g}-fold, and strongly predicted ${outcome}, could overturn the matched comparison.`);
      notChange.push(`Hidden differences in the odds of ${exposure} smaller than ${g}-fold within pairs could not make the matched finding lose significance.`);
    } else if (p.sensitivityStatus === 'not-significant') {
      howStrong.push(`The matched comparison is not statistically significant even without hidden bias, so it gives no firm evidence of a link on its own.`);
    } else {
      howStrong.push(`The matched comparison stays significant for every amount of hidden bias examined (up to ${two(p.searchedUpTo)}-fold).`);
    }
  }

  const r = appraisal.calculators.regression?.summary as OvbSummary | null | undefined;
  if (r?.kind === 'regression' && r.rv !== null) {
    howStrong.push(
      `In the regression, a hidden factor would have to account for at least ${formatPercent(r.rv)} of the otherwise unexplained differences in both ${exposure} and ${outcome} to remove the estimated effect.`,
    );
    if (r.rvAlpha !== null && r.rvAlpha > 0) {
      change.push(`A hidden factor accounting for ${formatPercent(r.rvAlpha)} or more of both would leave the regression estimate no longer statistically distinguishable from zero.`);
    }
    notChange.push(`Hidden factors accounting for less than ${formatPercent(r.rv)} of each could not remove the regression estimate.`);
    const strongest = strongestBenchmark(r);
    if (strongest) {
      compared.push(
        `The strongest measured factor, ${strongest.covariate}, accounts for ${formatPercent(strongest.r2dz)} of ${exposure} and ${formatPercent(strongest.r2yz)} of ${outcome} in the same terms; a hidden factor as strong would change the estimate from ${formatNumber(r.estimate, { significant: 3 })} to ${formatNumber(strongest.correctedEstimate, { significant: 3 })}.`,
      );
    }
  }

  return Object.freeze({
    howStrong: Object.freeze(howStrong),
    comparedWithMeasured: Object.freeze(compared),
    wouldChange: Object.freeze(change),
    wouldNotChange: Object.freeze(notChange),
    caution: DECISION_CAUTION,
    empty: howStrong.length === 0,
  });
}

/** The benchmark at k = 1 with the largest adjusted change (the strongest measured covariate). */
function strongestBenchmark(r: OvbSummary) {
  const atOne = (r.benchmarks ?? []).filter((b) => b.k === 1 && b.correctedEstimate !== null);
  if (atOne.length === 0) return undefined;
  return atOne.reduce((best, b) => (Math.abs((r.estimate ?? 0) - (b.correctedEstimate ?? 0)) > Math.abs((r.estimate ?? 0) - (best.correctedEstimate ?? 0)) ? b : best));
}

function two(value: number | null | undefined): string {
  return formatNumber(value, { digits: 2 });
}

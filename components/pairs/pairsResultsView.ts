import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import type { StudyLabels } from '../../src/format/studyLabels';
import type { PairsSource } from '../../src/methods/pairs/request';
import type { PairsOutcome } from '../../src/methods/pairs/runner';
import type { PairsWorkerProgress } from '../../src/methods/pairs/pairsWorkerClient';
import { conventionsBlock } from '../conventionsBlock';
import { PAIRS_CAUTION, cleanEstimate, formatEffect, formatGamma, pairsReading, pairsTable } from '../../src/methods/pairs/text';
import type { PlotSpec } from '../../src/plot/plotSpec';
import { boundsProgress, boundsTable, notesBlock, plotColumn, tippingAndPValueBoxes, waitingLine, wasCancelled } from '../resultParts';

/** The three figures of a result (null when there is no result or no such figure). */
export interface PairsPlotSpecs {
  readonly pValue: PlotSpec | null;
  readonly estimate: PlotSpec | null;
  readonly amplification: PlotSpec | null;
}

/** What the results column shows: the worker's progress, the waiting line, or the result with its table and plots. */
export interface PairsResultsView {
  readonly outcome: PairsOutcome;
  /** The problems shown now (see `shownProblems`). */
  readonly shown: readonly InputProblem[];
  readonly progress: PairsWorkerProgress | null;
  readonly source: PairsSource;
  readonly study: StudyLabels;
  readonly specs: PairsPlotSpecs;
  cancel(): void;
}

export function pairsResultsTemplate(v: PairsResultsView): TemplateResult {
  if (v.progress) return boundsProgress(v.progress, 'pairs-progress', () => v.cancel());
  const result = v.outcome.result;
  if (wasCancelled(v.outcome)) {
    return html`<p class="waiting" role="status">The analysis was cancelled; change any input to run it again.</p>`;
  }
  if (!result) {
    return waitingLine(
      v.shown,
      v.source === 'file'
        ? 'Choose a CSV file of pairs and its columns to see the bounds.'
        : v.source === 'pasted'
          ? 'Paste the pairs to see the bounds.'
          : 'Enter the two counts of discordant pairs to see the bounds.',
    );
  }
  const table = pairsTable(result, v.study);
  const notes = [...(v.outcome.read?.warnings ?? []), ...result.warnings];
  return html`
    <div class="headlines" role="group" aria-label="Headline numbers">
      ${tippingAndPValueBoxes(result)}
      ${result.test === 'signrank'
        ? html`<div class="headline-box">
            <span class="label">Sign test tipping Γ</span>
            <span class="number small" id="sign-tipping-gamma">${result.signTestSensitivityValue === null ? 'none' : formatGamma(result.signTestSensitivityValue)}</span>
          </div>`
        : nothing}
      ${result.estimate !== null
        ? html`<div class="headline-box">
            <span class="label">Hodges–Lehmann estimate</span>
            <span class="number small" id="estimate">${formatEffect(cleanEstimate(result), v.study)}</span>
          </div>`
        : nothing}
    </div>
    <p class="method" id="pairs-counts">
      ${result.n.toLocaleString('en')} pairs used${result.droppedRows > 0 ? `, ${result.droppedRows.toLocaleString('en')} left out for a missing value` : ''};
      ${result.test === 'signrank' ? `${result.nonZero.toLocaleString('en')} with a non-zero difference` : `${result.nonZero.toLocaleString('en')} informative`}.
      Tails: ${result.tailMethodReason}.
    </p>
    <div class="reading">${pairsReading(result, v.study).map((s) => html`<p>${s}</p>`)}</div>
    ${conventionsBlock(result.conventions)}
    ${notesBlock(notes)}
    ${boundsTable(`Bounds on the one-sided p-value${result.estimates.length > 0 ? ', estimate range and sensitivity interval' : ''} by Γ`, table, plainHeading)}
    ${plotColumn([v.specs.pValue, v.specs.estimate, v.specs.amplification])}
    <p class="caution" role="note">${PAIRS_CAUTION}</p>
  `;
}

/** The sensitivity table's column headings in plain words (the units in brackets are kept). */
function plainHeading(heading: string): string {
  return heading
    .replace(/^Γ$/, 'hidden bias Γ')
    .replace(/^p upper bound$/, 'worst-case p')
    .replace(/^p lower bound$/, 'best-case p')
    .replace(/^estimate low/, 'smallest effect estimate')
    .replace(/^estimate high/, 'largest effect estimate')
    .replace(/% interval/, '% sensitivity interval');
}

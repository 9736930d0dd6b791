import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import type { StudyLabels } from '../../src/format/studyLabels';
import { formatAsTyped, formatEffect } from '../../src/format/gammaText';
import type { SetsOutcome } from '../../src/methods/sets/runner';
import type { SetsWorkerProgress } from '../../src/methods/sets/setsWorkerClient';
import { SETS_CAUTION, setsCountsPhrase, setsReading, setsTable, setsTestName } from '../../src/methods/sets/text';
import type { PlotSpec } from '../../src/plot/plotSpec';
import { boundsProgress, boundsTable, notesBlock, plotColumn, tippingAndPValueBoxes, waitingLine, wasCancelled } from '../resultParts';

/** The three figures of a result (null when there is no result or no such figure). */
export interface SetsPlotSpecs {
  readonly pValue: PlotSpec | null;
  readonly estimate: PlotSpec | null;
  readonly amplification: PlotSpec | null;
}

/** What the results column shows: the worker's progress, the waiting line, or the result with its table and plots. */
export interface SetsResultsView {
  readonly outcome: SetsOutcome;
  /** The problems shown now (see `shownProblems`). */
  readonly shown: readonly InputProblem[];
  readonly progress: SetsWorkerProgress | null;
  readonly study: StudyLabels;
  readonly specs: SetsPlotSpecs;
  cancel(): void;
}

export function setsResultsTemplate(v: SetsResultsView): TemplateResult {
  if (v.progress) return boundsProgress(v.progress, 'sets-progress', () => v.cancel());
  const result = v.outcome.result;
  if (wasCancelled(v.outcome)) {
    return html`<p class="waiting" role="status">The analysis was cancelled; change any input to run it again.</p>`;
  }
  if (!result) return waitingLine(v.shown, 'Choose a CSV file of matched sets and its three columns to see the bounds.');
  const table = setsTable(result, v.study);
  const notes = [...(v.outcome.read?.warnings ?? []), ...result.warnings];
  const estimated = result.estimate !== null ? result.rows[result.rows.length - 1] : null;
  return html`
    <div class="headlines" role="group" aria-label="Headline numbers">
      ${tippingAndPValueBoxes(result)}
      ${result.estimate !== null
        ? html`<div class="headline-box">
            <span class="label">m-estimate of the effect</span>
            <span class="number small" id="estimate">${formatEffect(result.estimate, v.study)}</span>
            ${estimated && estimated.gamma > 1 && estimated.estimateLow !== null && estimated.estimateHigh !== null
              ? html`<span class="label" id="estimate-range"
                  >${formatEffect(estimated.estimateLow, v.study)} to ${formatEffect(estimated.estimateHigh, v.study)} at Γ = ${formatAsTyped(estimated.gamma)}</span
                >`
              : nothing}
          </div>`
        : nothing}
    </div>
    <p class="method" id="sets-counts">
      ${setsCountsPhrase(result)} used${result.counts.missingOutcomes > 0 ? `, ${result.counts.missingOutcomes.toLocaleString('en')} rows without an outcome left out` : ''}.
      ${setsTestName(result)}; outcome ${result.outcomeKindReason}; tails: ${result.tail === 'exact' ? 'exact' : 'normal approximation'}.
    </p>
    <div class="reading">${setsReading(result, v.study).map((s) => html`<p>${s}</p>`)}</div>
    ${notesBlock(notes)}
    ${boundsTable(`Bounds on the one-sided p-value${result.outcomeKind === 'continuous' ? ', estimate range and sensitivity interval' : ''} by Γ`, table)}
    ${plotColumn([v.specs.pValue, v.specs.estimate, v.specs.amplification])}
    <details class="conventions" id="sets-conventions">
      <summary>Conventions of this computation</summary>
      <ul>
        ${result.conventions.map((c) => html`<li data-convention=${c.id}>${c.text}</li>`)}
      </ul>
    </details>
    <p class="caution" role="note">${SETS_CAUTION}</p>
  `;
}

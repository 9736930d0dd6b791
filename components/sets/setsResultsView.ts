import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import type { StudyLabels } from '../../src/format/studyLabels';
import { formatAsTyped, formatEffect, formatGamma } from '../../src/format/gammaText';
import type { SetsOutcome } from '../../src/methods/sets/runner';
import type { SetsWorkerProgress } from '../../src/methods/sets/setsWorkerClient';
import { SETS_CAUTION, setsCountsPhrase, setsReading, setsTable, setsTestName } from '../../src/methods/sets/text';
import { pPhrase } from '../../src/methods/pairs/text';
import type { PlotSpec } from '../../src/plot/plotSpec';
import '../lurk-plot';

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
  if (v.progress) {
    const p = v.progress;
    const fraction = p.phase === 'reading' && p.totalBytes ? p.bytesRead / p.totalBytes : undefined;
    return html`<div class="busy" role="status" aria-live="polite">
      <label for="sets-progress">${p.phase === 'reading' ? `Reading the file: ${p.rowsRead.toLocaleString('en')} rows` : 'Computing the bounds…'}</label>
      <progress id="sets-progress" max="1" .value=${fraction ?? null}></progress>
      <button type="button" class="secondary" @click=${() => v.cancel()}>Cancel</button>
    </div>`;
  }
  const result = v.outcome.result;
  if (!result && v.outcome.problems.some((p) => p.code === 'cancelled')) {
    return html`<p class="waiting" role="status">The analysis was cancelled; change any input to run it again.</p>`;
  }
  if (!result) {
    const shown = v.shown;
    return html`<p class="waiting" role="status">
      ${shown.length > 0
        ? `Fix the ${shown.length === 1 ? 'field' : `${shown.length} fields`} marked in the form to see the bounds.`
        : 'Choose a CSV file of matched sets and its three columns to see the bounds.'}
    </p>`;
  }
  const table = setsTable(result, v.study);
  const notes = [...(v.outcome.read?.warnings ?? []), ...result.warnings];
  const tipping =
    result.sensitivityStatus === 'found' ? formatGamma(result.sensitivityValue) : result.sensitivityStatus === 'not-significant' ? 'none' : `> ${formatAsTyped(result.searchedUpTo)}`;
  const estimated = result.estimate !== null ? result.rows[result.rows.length - 1] : null;
  return html`
    <div class="headlines" role="group" aria-label="Headline numbers">
      <div class="headline-box">
        <span class="label" id="tipping-label">Tipping Γ (sensitivity value)</span>
        <span class="number" id="tipping-gamma" aria-labelledby="tipping-label">${tipping}</span>
        ${result.sensitivityStatus === 'not-significant' ? html`<span class="label">not significant at Γ = 1</span>` : nothing}
      </div>
      <div class="headline-box">
        <span class="label">p-value with no hidden bias</span>
        <span class="number small" id="p-value">${pPhrase(result.pValue).replace(/^p = /, '')}</span>
      </div>
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
    ${notes.length > 0 ? html`<div class="warning" role="note">${notes.map((n) => html`<div>${n}</div>`)}</div>` : nothing}
    <div class="table-scroll" tabindex="0" role="region" aria-label="Sensitivity table (scrolls sideways)">
      <table id="bounds-table">
        <caption>
          Bounds on the one-sided p-value${result.outcomeKind === 'continuous' ? ', estimate range and sensitivity interval' : ''} by Γ
        </caption>
        <thead>
          <tr>
            ${table.header.map((h) => html`<th scope="col">${h}</th>`)}
          </tr>
        </thead>
        <tbody>
          ${table.rows.map((row) => html`<tr>${row.map((cell, i) => (i === 0 ? html`<th scope="row">${cell}</th>` : html`<td>${cell}</td>`))}</tr>`)}
        </tbody>
      </table>
    </div>
    <div class="plots">
      ${v.specs.pValue ? html`<lurk-plot .spec=${v.specs.pValue}></lurk-plot>` : nothing}
      ${v.specs.estimate ? html`<lurk-plot .spec=${v.specs.estimate}></lurk-plot>` : nothing}
      ${v.specs.amplification ? html`<lurk-plot .spec=${v.specs.amplification}></lurk-plot>` : nothing}
    </div>
    <details class="conventions" id="sets-conventions">
      <summary>Conventions of this computation</summary>
      <ul>
        ${result.conventions.map((c) => html`<li>${c}</li>`)}
      </ul>
    </details>
    <p class="caution" role="note">${SETS_CAUTION}</p>
  `;
}

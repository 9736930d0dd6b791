import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import type { StudyLabels } from '../../src/format/studyLabels';
import type { PairsSource } from '../../src/methods/pairs/request';
import type { PairsOutcome } from '../../src/methods/pairs/runner';
import type { PairsWorkerProgress } from '../../src/methods/pairs/pairsWorkerClient';
import { conventionsBlock } from '../conventionsBlock';
import { PAIRS_CAUTION, cleanEstimate, formatAsTyped, formatEffect, formatGamma, pPhrase, pairsReading, pairsTable } from '../../src/methods/pairs/text';
import type { PlotSpec } from '../../src/plot/plotSpec';
import '../lurk-plot';

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
  if (v.progress) {
    const p = v.progress;
    const fraction = p.phase === 'reading' && p.totalBytes ? p.bytesRead / p.totalBytes : undefined;
    return html`<div class="busy" role="status" aria-live="polite">
      <label for="pairs-progress">${p.phase === 'reading' ? `Reading the file: ${p.rowsRead.toLocaleString('en')} rows` : 'Computing the bounds…'}</label>
      <progress id="pairs-progress" max="1" .value=${fraction ?? null}></progress>
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
        : v.source === 'file'
          ? 'Choose a CSV file of pairs and its columns to see the bounds.'
          : v.source === 'pasted'
            ? 'Paste the pairs to see the bounds.'
            : 'Enter the two counts of discordant pairs to see the bounds.'}
    </p>`;
  }
  const table = pairsTable(result, v.study);
  const notes = [...(v.outcome.read?.warnings ?? []), ...result.warnings];
  const tipping =
    result.sensitivityStatus === 'found' ? formatGamma(result.sensitivityValue) : result.sensitivityStatus === 'not-significant' ? 'none' : `> ${formatAsTyped(result.searchedUpTo)}`;
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
    ${notes.length > 0 ? html`<div class="warning" role="note">${notes.map((n) => html`<div>${n}</div>`)}</div>` : nothing}
    <div class="table-scroll" tabindex="0" role="region" aria-label="Sensitivity table (scrolls sideways)">
      <table id="bounds-table">
        <caption>
          Bounds on the one-sided p-value${result.estimates.length > 0 ? ', estimate range and sensitivity interval' : ''} by Γ
        </caption>
        <thead>
          <tr>
            ${table.header.map((h) => html`<th scope="col">${plainHeading(h)}</th>`)}
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

import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../src/core/inputProblem';
import { formatAsTyped, formatGamma } from '../src/format/gammaText';
import { pPhrase } from '../src/methods/pairs/text';
import type { PlotSpec } from '../src/plot/plotSpec';
import './lurk-plot';

/** The waiting line while there is no result: how many fields to fix, or what to enter first. */
export function waitingLine(shown: readonly InputProblem[], whatToEnter: string): TemplateResult {
  return html`<p class="waiting" role="status">
    ${shown.length > 0 ? `Fix the ${shown.length === 1 ? 'field' : `${shown.length} fields`} marked in the form to see the bounds.` : whatToEnter}
  </p>`;
}

/** Whether the outcome has no result because its run was cancelled. */
export function wasCancelled(outcome: { readonly result: unknown; readonly problems: readonly InputProblem[] }): boolean {
  return !outcome.result && outcome.problems.some((p) => p.code === 'cancelled');
}

/** A Γ-bounds worker's progress (reading the file, then computing the bounds) with Cancel. */
export function boundsProgress(p: { readonly phase: string; readonly bytesRead: number; readonly totalBytes: number | null; readonly rowsRead: number }, id: string, cancel: () => void): TemplateResult {
  const fraction = p.phase === 'reading' && p.totalBytes ? p.bytesRead / p.totalBytes : undefined;
  return html`<div class="busy" role="status" aria-live="polite">
    <label for="${id}">${p.phase === 'reading' ? `Reading the file: ${p.rowsRead.toLocaleString('en')} rows` : 'Computing the bounds…'}</label>
    <progress id="${id}" max="1" .value=${fraction ?? null}></progress>
    <button type="button" class="secondary" @click=${() => cancel()}>Cancel</button>
  </div>`;
}

/** What the first headline boxes of a Γ analysis need from its result. */
export interface TippingHeadline {
  readonly sensitivityStatus: 'found' | 'not-significant' | 'beyond-range';
  readonly sensitivityValue: number | null;
  readonly searchedUpTo: number;
  readonly pValue: number;
}

/** The headline boxes every Γ analysis shows first: the tipping Γ and the p-value with no hidden bias. */
export function tippingAndPValueBoxes(r: TippingHeadline): TemplateResult {
  const tipping = r.sensitivityStatus === 'found' ? formatGamma(r.sensitivityValue) : r.sensitivityStatus === 'not-significant' ? 'none' : `> ${formatAsTyped(r.searchedUpTo)}`;
  return html`<div class="headline-box">
      <span class="label" id="tipping-label">Tipping Γ (sensitivity value)</span>
      <span class="number" id="tipping-gamma" aria-labelledby="tipping-label">${tipping}</span>
      ${r.sensitivityStatus === 'not-significant' ? html`<span class="label">not significant at Γ = 1</span>` : nothing}
    </div>
    <div class="headline-box">
      <span class="label">p-value with no hidden bias</span>
      <span class="number small" id="p-value">${pPhrase(r.pValue).replace(/^p = /, '')}</span>
    </div>`;
}

/** The warnings of a result (nothing when there are none). */
export function notesBlock(notes: readonly string[], id?: string): TemplateResult | typeof nothing {
  return notes.length > 0 ? html`<div class="warning" role="note" id=${id ?? nothing}>${notes.map((n) => html`<div>${n}</div>`)}</div>` : nothing;
}

/** The Γ bounds table (id `bounds-table`) in its sideways-scrolling region; the first cell of a row heads it. */
export function boundsTable(caption: string, table: { readonly header: readonly string[]; readonly rows: readonly (readonly string[])[] }, heading: (h: string) => string = (h) => h): TemplateResult {
  // The title sits above the scrolling box, so that a narrow screen shows all of it; the caption names the table.
  return html`<p class="table-title" aria-hidden="true">${caption}</p>
    <div class="table-scroll" tabindex="0" role="region" aria-label="Sensitivity table (scrolls sideways)">
    <table id="bounds-table">
      <caption class="visually-hidden">
        ${caption}
      </caption>
      <thead>
        <tr>
          ${table.header.map((h) => html`<th scope="col">${heading(h)}</th>`)}
        </tr>
      </thead>
      <tbody>
        ${table.rows.map((row) => html`<tr>${row.map((cell, i) => (i === 0 ? html`<th scope="row">${cell}</th>` : html`<td>${cell}</td>`))}</tr>`)}
      </tbody>
    </table>
  </div>`;
}

/** The figures of a result, in order (a missing one is left out). */
export function plotColumn(specs: readonly (PlotSpec | null)[]): TemplateResult {
  return html`<div class="plots">${specs.map((spec) => (spec ? html`<lurk-plot .spec=${spec}></lurk-plot>` : nothing))}</div>`;
}

import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import type { OvbResult } from '../../src/core/ovbAnalysis';
import { formatNumber, formatPercent } from '../../src/format/formatNumber';
import type { StudyLabels } from '../../src/format/studyLabels';
import { OVB_CAUTION, notInformativeWords, ovbReadingParts, plainNumber, shownWarnings } from '../../src/methods/regression/text';
import { conventionsBlock } from '../conventionsBlock';
import type { PlotSpec } from '../../src/plot/plotSpec';
import type { PlotPointerDetail } from '../lurk-plot';

/** What the regression results' templates need from the element. */
export interface OvbResultsView {
  readonly result: OvbResult | null;
  readonly started: boolean;
  /** The problems shown now. */
  readonly shown: readonly InputProblem[];
  readonly study: Partial<StudyLabels>;
  readonly specs: { estimate: PlotSpec; t: PlotSpec; extreme: PlotSpec } | null;
  readonly readouts: Record<string, string>;
  onPointer(kind: 'estimate' | 't', event: CustomEvent<PlotPointerDetail>): void;
  onPlotClick(event: MouseEvent): void;
}

/** Fields that have their own place in the form (their problems are shown there, not in the results). */
const FORM_FIELDS = /^(estimate|se|df|n|parameters|covariateTs|q|alpha|k|r2dz|r2yz|plotMax|outcome|treatment|covariates|benchmarks|summaryTable|summaryColumns|summaryResult|file|direction)/;

/** The results column: headline numbers, the reading, the benchmark table and the plots. */

export function results(v: OvbResultsView): TemplateResult {
  const result = v.result;
  if (!result) {
    const shown = v.shown;
    return html`<p class="hint">
        ${v.started && shown.length > 0
          ? 'Correct the marked fields to see the analysis.'
          : 'Enter the regression’s numbers, or read its data, to see how strong a hidden confounder would have to be.'}
      </p>
      ${shown.filter((p) => !FORM_FIELDS.test(p.field)).map((p) => html`<p class="field-error" role="alert">${p.message}</p>`)}
      <p class="caution" role="note">${OVB_CAUTION}</p>`;
  }
  const study = v.study;
  const reading = ovbReadingParts(result, study);
  const specs = v.specs!;
  return html`
    <div class="numbers">
      <div><span class="label">Partial R² of treatment with outcome</span><span class="number" id="partial-r2">${formatPercent(result.partialR2)}</span></div>
      <div><span class="label">Robustness value RV${result.q === 1 ? '' : ` (q = ${plainNumber(result.q)})`}</span><span class="number" id="rv">${formatPercent(result.rv)}</span></div>
      <div><span class="label">RV at α = ${plainNumber(result.alpha)}</span><span class="number" id="rv-alpha">${formatPercent(result.rvAlpha)}</span></div>
    </div>
    ${reading.notSignificant ? html`<p class="headline" id="not-significant">${reading.notSignificant}</p>` : nothing}
    <p class="${reading.notSignificant ? '' : 'headline'}" id="reading">${reading.headline}</p>
    ${reading.comparison.map((s) => html`<p>${s}</p>`)}
    <p class="hint">${reading.estimate}</p>
    ${shownWarnings(result).map((w) => html`<p class="warning" role="note">${w}</p>`)}
    ${conventionsBlock(result.conventions)}
    <p class="caution" role="note">${OVB_CAUTION}</p>
    ${result.scenario ? scenarioLine(result) : nothing} ${benchmarkTable(result)}
    <div class="plots">
      <p class="hint" id="plot-hint">Point at a contour plot to read the adjusted values there; click to try that confounder.</p>
      <lurk-plot
        id="plot-estimate"
        aria-describedby="plot-hint"
        .spec=${specs.estimate}
        .readout=${v.readouts.estimate ?? ''}
        @lurk-plot-pointer=${(e: CustomEvent<PlotPointerDetail>) => v.onPointer('estimate', e)}
        @click=${v.onPlotClick}
      ></lurk-plot>
      <lurk-plot
        id="plot-t"
        aria-describedby="plot-hint"
        .spec=${specs.t}
        .readout=${v.readouts.t ?? ''}
        @lurk-plot-pointer=${(e: CustomEvent<PlotPointerDetail>) => v.onPointer('t', e)}
        @click=${v.onPlotClick}
      ></lurk-plot>
      <lurk-plot id="plot-extreme" .spec=${specs.extreme}></lurk-plot>
    </div>
  `;
}

function scenarioLine(result: OvbResult): TemplateResult {
  const s = result.scenario!;
  return html`<p id="scenario">
    A confounder with partial R² ${formatPercent(s.r2dz)} with the treatment and ${formatPercent(s.r2yz)} with the outcome would give an adjusted estimate of
    <span class="number">${formatNumber(s.correctedEstimate, { significant: 4 })}</span> (standard error ${formatNumber(s.correctedSe, { significant: 3 })}, t =
    ${formatNumber(s.correctedT, { digits: 2 })}).
  </p>`;
}

function benchmarkTable(result: OvbResult): TemplateResult | typeof nothing {
  if (result.benchmarks.length === 0) return nothing;
  const separate = result.benchmarks.some((b) => b.kOutcome !== b.k);
  const kCell = (b: OvbResult['benchmarks'][number]) => (separate ? `${plainNumber(b.k)} : ${plainNumber(b.kOutcome)}` : plainNumber(b.k));
  const tShown = result.seKind === 'classical';
  return html`<h3>Confounders as strong as measured covariates</h3>
    <div class="table-scroll" tabindex="0" role="region" aria-label="Benchmark table (scrolls sideways)">
      <table id="benchmarks">
        <caption class="visually-hidden">Bounds on a confounder some times as strong as each covariate, and the estimate adjusted for it</caption>
        <thead>
          <tr>
            <th scope="col">Covariate</th>
            <th scope="col">${separate ? 'Times as strong (treatment : outcome)' : 'Times as strong'}</th>
            <th scope="col">R² with treatment</th>
            <th scope="col">R² with outcome</th>
            <th scope="col">Adjusted estimate</th>
            <th scope="col">SE</th>
            <th scope="col">t</th>
          </tr>
        </thead>
        <tbody>
          ${result.benchmarks.map((b) =>
            b.unavailable !== null
              ? html`<tr>
                  <th scope="row">${b.covariate}</th>
                  <td>${kCell(b)}</td>
                  <td class="unavailable" colspan="5">Not available: ${b.unavailable}</td>
                </tr>`
              : !b.informative
                ? html`<tr>
                    <th scope="row">${b.covariate}</th>
                    <td>${kCell(b)}</td>
                    <td>${formatPercent(b.r2dz)}</td>
                    <td>${formatPercent(b.r2yz)} (capped)</td>
                    <td class="unavailable" colspan="3">This bound is not informative: ${notInformativeWords(b)}</td>
                  </tr>`
                : html`<tr>
                    <th scope="row">${b.covariate}</th>
                    <td>${kCell(b)}</td>
                    <td>${formatPercent(b.r2dz)}</td>
                    <td>${formatPercent(b.r2yz)}</td>
                    <td>${formatNumber(b.correctedEstimate, { significant: 4 })}</td>
                    <td>${tShown ? formatNumber(b.correctedSe, { significant: 3 }) : '—'}</td>
                    <td>${tShown ? formatNumber(b.correctedT, { digits: 2 }) : '—'}</td>
                  </tr>`,
          )}
        </tbody>
      </table>
    </div>`;
}

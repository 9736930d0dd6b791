import { LitElement, html, nothing } from 'lit';
import type { TemplateResult } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { adjustForConfounder } from '../src/core/confounderAdjustment';
import { InputError, type InputProblem } from '../src/core/inputProblem';
import type { OvbResult } from '../src/core/ovbAnalysis';
import { readCsvText } from '../src/data/csv';
import { formatNumber, formatPercent } from '../src/format/formatNumber';
import { emptyOvbForm, evaluateOvbForm, normaliseOvbForm, ovbSummarySql, type FileRegression, type OvbFormInputs, type OvbFormOutcome } from '../src/methods/regression/request';
import { ovbSpecFromRegressionData } from '../src/methods/regression/ovbRegressionData';
import { OVB_CAUTION, ovbReading, plainNumber } from '../src/methods/regression/text';
import { runRegressionInWorker } from '../src/methods/regression/regressionWorkerClient';
import { emptyStudy, type StudyLabels } from '../src/format/studyLabels';
import { ovbSummary, type OvbSummary } from '../src/workspace/calculatorSummaries';
import { shownProblems } from '../src/format/shownProblems';
import { ovbContourPlot } from '../src/methods/regression/ovbContourPlot';
import { ovbExtremeScenarioPlot } from '../src/methods/regression/ovbExtremeScenarioPlot';
import type { PlotSpec } from '../src/plot/plotSpec';
import type { PlotPointerDetail } from './lurk-plot';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { ovbStyles } from './styles/ovb';
import './lurk-plot';
import { sourceChoice } from './sourceChoice';
import { textField } from './textField';

/** Detail of `lurk-result`: the new result, or null with the problems that prevent one. */
export interface OvbResultDetail {
  readonly result: OvbResult | null;
  readonly problems: readonly InputProblem[];
}

const SOURCES: ReadonlyArray<{ id: OvbFormInputs['source']; label: string }> = [
  { id: 'reported', label: 'Reported numbers' },
  { id: 'file', label: 'A CSV file of the data' },
  { id: 'summary', label: 'Summary statistics from a database' },
];

/** Bytes read to find a CSV's header and first rows (column pickers). */
const HEAD_BYTES = 256 * 1024;

/**
 * @summary The regression calculator: how strong an omitted confounder would have to be — as partial R² with the
 * treatment and with the outcome — to bring a regression estimate to zero (or a fraction q of itself) or make
 * it lose significance; from reported numbers, a CSV (fitted in a Web Worker, with progress and cancel), or
 * summary statistics computed by one SQL query in the user's database.
 *
 * @property inputs - the form as typed (OvbFormInputs: text, never parsed numbers); partial or older objects are
 *   completed. A CSV's rows are never part of it, only its name and the column choices.
 * @property study - the finding's labels (exposure, outcome, units) used in the text and the plots.
 * @fires lurk-inputs-change - {inputs} after every edit by the user.
 * @fires lurk-result - {result, problems} when a user's action gives a new result (null while there is none).
 * @csspart results - the results column.
 * @cssprop --lurk-font - font family
 * @cssprop --lurk-text - text colour
 * @cssprop --lurk-muted - colour of hints and secondary text
 * @cssprop --lurk-bg - background of inputs and panels
 * @cssprop --lurk-surface - background of result cards and notes
 * @cssprop --lurk-border - border colour
 * @cssprop --lurk-accent - colour of buttons, links and the selected tab
 * @cssprop --lurk-accent-text - text on the accent colour
 * @cssprop --lurk-error - colour of error messages and invalid fields
 * @cssprop --lurk-warning-bg - background of warnings
 * @cssprop --lurk-focus - focus outline colour
 * @cssprop --lurk-radius - corner radius
 */
@customElement('lurk-ovb')
export class LurkOvb extends LitElement {
  static override styles = [baseStyles, calculatorLayoutStyles, ovbStyles];

  @property({ attribute: false }) inputs: OvbFormInputs | Record<string, unknown> | null = null;
  @property({ attribute: false }) study: StudyLabels = emptyStudy;

  @state() private form: OvbFormInputs = emptyOvbForm();
  @state() private file: File | null = null;
  @state() private columns: readonly string[] = [];
  @state() private fileData: FileRegression | null = null;
  @state() private dataNote = '';
  @state() private fileProblem = '';
  @state() private progress: { fraction: number; rows: number } | null = null;
  @state() private readouts: Record<string, string> = {};

  private abort: AbortController | null = null;
  /** The confounder strength under the pointer on a contour plot, for a click. */
  private lastPointer: { x: number; y: number } | null = null;
  private outcome: OvbFormOutcome = evaluateOvbForm(this.form, null);
  private specs: { estimate: PlotSpec; t: PlotSpec; extreme: PlotSpec } | null = null;
  private evaluatedFor: unknown = undefined;

  /** Headline numbers of the current result, for the workspace's appraisal, statement and bottom line. */
  get summary(): OvbSummary | null {
    return this.outcome.result ? ovbSummary(this.outcome.result) : null;
  }

  /** The current analysis (null while the inputs give none). */
  get result(): OvbResult | null {
    return this.outcome.result;
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.abort?.abort();
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('inputs') && this.inputs !== this.form) this.form = normaliseOvbForm(this.inputs);
    if (this.evaluatedFor !== this.form || changed.has('fileData') || changed.has('study')) this.evaluate();
  }

  override render() {
    const f = this.form;
    return html`
      <div class="layout">
        <form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="Regression sensitivity inputs">
          ${sourceChoice('Start from', SOURCES, f.source, (source) => this.edit({ source }))}
          ${f.source === 'reported' ? this.reportedFields() : f.source === 'file' ? this.fileFields() : this.summaryFields()} ${this.settingFields()}
        </form>
        <section part="results" aria-label="Regression sensitivity results" aria-live="polite">${this.results()}</section>
      </div>
    `;
  }

  // ——— inputs ———

  private reportedFields(): TemplateResult {
    const f = this.form;
    return html`
      <div class="pair">
        ${this.textField('estimate', 'Estimate (coefficient)', f.estimate, (v) => ({ estimate: v }), 'Of the treatment, as reported')}
        ${this.textField('se', 'Standard error', f.se, (v) => ({ se: v }))}
      </div>
      <fieldset>
        <legend>Residual degrees of freedom</legend>
        <label class="choice"><input type="radio" name="df-by" .checked=${f.dfBy === 'df'} @change=${() => this.edit({ dfBy: 'df' })} />As reported</label>
        <label class="choice"
          ><input type="radio" name="df-by" .checked=${f.dfBy === 'n'} @change=${() => this.edit({ dfBy: 'n' })} />From n and the number of coefficients</label
        >
        ${f.dfBy === 'df'
          ? this.textField('df', 'Degrees of freedom', f.df, (v) => ({ df: v }), 'n minus the number of coefficients (intercept included)')
          : html`<div class="pair">
              ${this.textField('n', 'Observations n', f.n, (v) => ({ n: v }))}
              ${this.textField('parameters', 'Coefficients', f.parameters, (v) => ({ parameters: v }), 'Intercept, treatment and covariates')}
            </div>`}
      </fieldset>
      <fieldset>
        <legend>Covariates to compare with (optional)</legend>
        <p class="hint">
          From the paper’s tables: a covariate’s t in the outcome regression and, if printed, its t in the regression of the treatment on the
          covariates. Bounds need both.
        </p>
        ${f.covariateTs.map(
          (c, i) => html`<div class="covariate">
            ${this.textField(`covariateTs[${i}].name`, 'Covariate', c.name, (v) => this.covariateEdit(i, { name: v }))}
            <div class="triple">
            ${this.textField(`covariateTs[${i}].outcomeT`, 't (outcome)', c.outcomeT, (v) => this.covariateEdit(i, { outcomeT: v }))}
            ${this.textField(`covariateTs[${i}].treatmentT`, 't (treatment)', c.treatmentT, (v) => this.covariateEdit(i, { treatmentT: v }))}
            <div class="field">
              <button type="button" class="secondary small" aria-label="Remove covariate ${i + 1}" @click=${() => this.edit({ covariateTs: f.covariateTs.filter((_, j) => j !== i) })}>
                Remove
              </button>
            </div>
            </div>
          </div>`,
        )}
        <button type="button" class="secondary small" @click=${this.addCovariate}>Add a covariate</button>
      </fieldset>
    `;
  }

  private fileFields(): TemplateResult {
    const f = this.form;
    const fileError = this.fileProblem || (this.outcome.started ? (this.problemFor('file')?.message ?? '') : '');
    const select = (key: 'outcome' | 'treatment', label: string) => {
      const problem = this.problemFor(key);
      return html`<div class="field">
        <label for="column-${key}">${label}</label>
        <select
          id="column-${key}"
          aria-invalid=${problem ? 'true' : 'false'}
          aria-describedby="column-${key}-error"
          @change=${(e: Event) => this.chooseRole(key, (e.target as HTMLSelectElement).value)}
        >
          <option value="" ?selected=${f[key] === ''}>Choose a column</option>
          ${this.columns.map((c) => html`<option value=${c} ?selected=${f[key] === c}>${c}</option>`)}
        </select>
        <div class="field-error" id="column-${key}-error">${problem ? problem.message : ''}</div>
      </div>`;
    };
    const candidates = this.columns.filter((c) => c !== f.outcome && c !== f.treatment);
    const covariateProblem = this.problemFor('covariates');
    return html`
      <div class="field">
        <label for="file">CSV file</label>
        <input id="file" type="file" accept=".csv,.tsv,.txt,text/csv,text/plain" aria-describedby="file-hint file-error" aria-invalid=${fileError ? 'true' : 'false'} @change=${this.onFile} />
        <div class="hint" id="file-hint">
          ${this.file
            ? `${this.file.name}: ${this.columns.length} columns. It is read in this browser, in chunks; nothing is uploaded.`
            : f.fileName
              ? `Choose ${f.fileName} again: the rows of a file are never saved, only the choices below.`
              : 'A header row, then one row per observation. Read in this browser, in chunks; nothing is uploaded.'}
        </div>
        <div class="field-error" id="file-error" role=${fileError ? 'alert' : nothing}>${fileError}</div>
      </div>
      ${this.columns.length > 0
        ? html`<div class="pair">${select('outcome', 'Outcome')} ${select('treatment', 'Treatment (exposure)')}</div>
            <fieldset aria-describedby="covariates-error">
              <legend>Covariates</legend>
              <div class="columns">
                ${candidates.map(
                  (c) => html`<label class="choice"
                    ><input type="checkbox" .checked=${f.covariates.includes(c)} @change=${(e: Event) => this.toggleCovariate(c, (e.target as HTMLInputElement).checked)} />${c}</label
                  >`,
                )}
              </div>
              <div class="field-error" id="covariates-error">${covariateProblem ? covariateProblem.message : ''}</div>
              <p class="hint">Text columns are dummy-coded; rows with a missing value in a chosen column are dropped and counted.</p>
            </fieldset>
            <div class="run">
              <button type="button" id="fit" ?disabled=${!this.file || !f.outcome || !f.treatment || this.progress !== null} @click=${this.fit}>Fit the regression</button>
              ${this.progress ? html`<button type="button" class="secondary" id="cancel" @click=${this.cancel}>Cancel</button>` : nothing}
            </div>
            ${this.progress
              ? html`<label for="progress" class="hint">Reading… ${this.progress.rows.toLocaleString('en')} rows</label>
                  <progress id="progress" max="1" .value=${this.progress.fraction}></progress>`
              : nothing}
            ${this.dataNote ? html`<p class="hint" id="data-note">${this.dataNote}</p>` : nothing}
            ${this.textField('categorical', 'Numeric columns that are categories', f.categorical, (v) => this.refitNeeded({ categorical: v }), 'e.g. a region code; separated by commas')}
            ${this.textField('benchmarks', 'Covariates to compare with', f.benchmarks, (v) => ({ benchmarks: v }), 'Default: each covariate. Names separated by commas; a group as a+b.')}`
        : nothing}
    `;
  }

  private summaryFields(): TemplateResult {
    const f = this.form;
    const { sql, problem } = ovbSummarySql(f);
    const resultProblem = this.problemFor('summaryResult');
    return html`
      <p class="hint">For data too large or too private to move: run one query in your own database and paste its single result row here.</p>
      ${this.textField('summaryTable', 'Table or view', f.summaryTable, (v) => ({ summaryTable: v }), 'e.g. research.visits')}
      <div class="pair">
        ${this.textField('outcome', 'Outcome column', f.outcome, (v) => ({ outcome: v }))}
        ${this.textField('treatment', 'Treatment column', f.treatment, (v) => ({ treatment: v }))}
      </div>
      ${this.textField('summaryColumns', 'Covariate columns', f.summaryColumns, (v) => ({ summaryColumns: v }), 'Numeric columns, separated by commas')}
      ${sql
        ? html`<label for="sql">The query to run</label><pre class="sql" id="sql" tabindex="0">${sql}</pre>`
        : html`<p class="hint">${problem?.message ? `The query appears here once you ${problem.message.replace(/\.$/, '')}.` : ''}</p>`}
      <div class="field">
        <label for="summaryResult">Its result row</label>
        <textarea
          id="summaryResult"
          aria-describedby="summaryResult-hint summaryResult-error"
          aria-invalid=${resultProblem ? 'true' : 'false'}
          .value=${f.summaryResult}
          @input=${(e: Event) => this.edit({ summaryResult: (e.target as HTMLTextAreaElement).value })}
        ></textarea>
        <div class="hint" id="summaryResult-hint">As CSV (the header line and the one row) or as a JSON object.</div>
        <div class="field-error" id="summaryResult-error">${resultProblem ? resultProblem.message : ''}</div>
      </div>
      ${this.textField('benchmarks', 'Covariates to compare with', f.benchmarks, (v) => ({ benchmarks: v }), 'Default: each covariate. A group as a+b.')}
    `;
  }

  private settingFields(): TemplateResult {
    const f = this.form;
    return html`
      <fieldset>
        <legend>What would change the conclusion</legend>
        <div class="pair">
          ${this.textField('q', 'Fraction of the estimate q', f.q, (v) => ({ q: v }), '1: all of it (down to zero)')}
          ${this.textField('alpha', 'Significance level α', f.alpha, (v) => ({ alpha: v }))}
        </div>
        <fieldset>
          <legend>The confounder moves the estimate</legend>
          <label class="choice"
            ><input type="radio" name="direction" .checked=${f.direction === 'toward-zero'} @change=${() => this.edit({ direction: 'toward-zero' })} />toward zero (usual)</label
          >
          <label class="choice"
            ><input type="radio" name="direction" .checked=${f.direction === 'away-from-zero'} @change=${() => this.edit({ direction: 'away-from-zero' })} />away from
            zero</label
          >
        </fieldset>
        ${this.textField('k', 'Compare with confounders k times as strong, k =', f.k, (v) => ({ k: v }), 'e.g. 1, 2, 3')}
      </fieldset>
      <fieldset>
        <legend>A confounder to try</legend>
        <div class="pair">
          ${this.textField('r2dz', 'Partial R² with the treatment', f.r2dz, (v) => ({ r2dz: v }), 'e.g. 5% or 0.05')}
          ${this.textField('r2yz', 'Partial R² with the outcome', f.r2yz, (v) => ({ r2yz: v }))}
        </div>
        ${this.textField('plotMax', 'Plots up to (partial R²)', f.plotMax, (v) => ({ plotMax: v }), 'Empty: chosen from the results')}
      </fieldset>
    `;
  }

  private textField(field: string, label: string, value: string, change: (text: string) => Partial<OvbFormInputs>, hint = ''): TemplateResult {
    const id = fieldId(field);
    const problem = this.problemFor(field);
    const numeric = !/name|benchmarks|categorical|summary|outcome$|treatment$/.test(field) || /T$/.test(field);
    return textField({ id: id, label, value, problem, hint, inputMode: numeric ? 'decimal' : 'text', onInput: (text) => this.edit(change(text)) });
  }

  /** The problem to show beside a field: "required" only once the user has started, everything else at once. */
  private problemFor(field: string): InputProblem | undefined {
    return shownProblems(this.outcome.problems, this.outcome.started).find((p) => p.field === field);
  }

  // ——— results ———

  private results(): TemplateResult {
    const result = this.outcome.result;
    if (!result) {
      const shown = shownProblems(this.outcome.problems, this.outcome.started);
      return html`<p class="hint">
          ${this.outcome.started && shown.length > 0
            ? 'Correct the marked fields to see the analysis.'
            : 'Enter the regression’s numbers, or read its data, to see how strong a hidden confounder would have to be.'}
        </p>
        ${shown.filter((p) => !FORM_FIELDS.test(p.field)).map((p) => html`<p class="field-error" role="alert">${p.message}</p>`)}
        <p class="caution" role="note">${OVB_CAUTION}</p>`;
    }
    const study = this.labels();
    const reading = ovbReading(result, study);
    const specs = this.specs!;
    return html`
      <div class="numbers">
        <div><span class="label">Partial R² of treatment with outcome</span><span class="number" id="partial-r2">${formatPercent(result.partialR2)}</span></div>
        <div><span class="label">Robustness value RV${result.q === 1 ? '' : ` (q = ${plainNumber(result.q)})`}</span><span class="number" id="rv">${formatPercent(result.rv)}</span></div>
        <div><span class="label">RV at α = ${plainNumber(result.alpha)}</span><span class="number" id="rv-alpha">${formatPercent(result.rvAlpha)}</span></div>
      </div>
      <p class="headline" id="reading">${reading[1]}</p>
      ${reading.slice(2).map((s) => html`<p>${s}</p>`)}
      <p class="hint">${reading[0]}</p>
      ${result.warnings.map((w) => html`<p class="warning" role="note">${w}</p>`)}
      <p class="caution" role="note">${OVB_CAUTION}</p>
      ${result.scenario ? this.scenarioLine(result) : nothing} ${this.benchmarkTable(result)}
      <div class="plots">
        <p class="hint" id="plot-hint">Point at a contour plot to read the adjusted values there; click to try that confounder.</p>
        <lurk-plot
          id="plot-estimate"
          aria-describedby="plot-hint"
          .spec=${specs.estimate}
          .readout=${this.readouts.estimate ?? ''}
          @lurk-plot-pointer=${(e: CustomEvent<PlotPointerDetail>) => this.onPointer('estimate', e)}
          @click=${this.onPlotClick}
        ></lurk-plot>
        <lurk-plot
          id="plot-t"
          aria-describedby="plot-hint"
          .spec=${specs.t}
          .readout=${this.readouts.t ?? ''}
          @lurk-plot-pointer=${(e: CustomEvent<PlotPointerDetail>) => this.onPointer('t', e)}
          @click=${this.onPlotClick}
        ></lurk-plot>
        <lurk-plot id="plot-extreme" .spec=${specs.extreme}></lurk-plot>
      </div>
    `;
  }

  private scenarioLine(result: OvbResult): TemplateResult {
    const s = result.scenario!;
    return html`<p id="scenario">
      A confounder with partial R² ${formatPercent(s.r2dz)} with the treatment and ${formatPercent(s.r2yz)} with the outcome would give an adjusted estimate of
      <span class="number">${formatNumber(s.correctedEstimate, { significant: 4 })}</span> (standard error ${formatNumber(s.correctedSe, { significant: 3 })}, t =
      ${formatNumber(s.correctedT, { digits: 2 })}).
    </p>`;
  }

  private benchmarkTable(result: OvbResult): TemplateResult | typeof nothing {
    if (result.benchmarks.length === 0) return nothing;
    return html`<h3>Confounders as strong as measured covariates</h3>
      <div class="table-scroll" tabindex="0" role="region" aria-label="Benchmark table (scrolls sideways)">
        <table id="benchmarks">
          <caption class="visually-hidden">Bounds on a confounder k times as strong as each covariate, and the estimate adjusted for it</caption>
          <thead>
            <tr>
              <th scope="col">Covariate</th>
              <th scope="col">k</th>
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
                    <td>${plainNumber(b.k)}</td>
                    <td class="unavailable" colspan="5">Not available: ${b.unavailable}</td>
                  </tr>`
                : html`<tr>
                    <th scope="row">${b.covariate}</th>
                    <td>${plainNumber(b.k)}</td>
                    <td>${formatPercent(b.r2dz)}</td>
                    <td>${formatPercent(b.r2yz)}${b.capped ? ' (capped)' : ''}</td>
                    <td>${formatNumber(b.correctedEstimate, { significant: 4 })}</td>
                    <td>${formatNumber(b.correctedSe, { significant: 3 })}</td>
                    <td>${formatNumber(b.correctedT, { digits: 2 })}</td>
                  </tr>`,
            )}
          </tbody>
        </table>
      </div>`;
  }

  // ——— behaviour ———

  private labels(): Partial<StudyLabels> {
    const f = this.form;
    const fromData = f.source !== 'reported';
    return {
      ...this.study,
      exposure: this.study.exposure?.trim() || (fromData && f.treatment ? f.treatment : ''),
      outcome: this.study.outcome?.trim() || (fromData && f.outcome ? f.outcome : ''),
    };
  }

  private evaluate(): void {
    this.outcome = evaluateOvbForm(this.form, this.form.source === 'file' ? this.fileData : null);
    this.evaluatedFor = this.form;
    const result = this.outcome.result;
    if (!result) {
      this.specs = null;
      return;
    }
    const study = this.labels();
    const max = this.outcome.plotMax;
    const axes = max !== undefined ? { maxR2dz: max, maxR2yz: max } : {};
    this.specs = {
      estimate: ovbContourPlot(result, { kind: 'estimate', study, ...axes }),
      t: ovbContourPlot(result, { kind: 't', study, ...axes }),
      extreme: ovbExtremeScenarioPlot(result, { study, ...(max !== undefined ? { maxR2dz: max } : {}) }),
    };
  }

  /** Applies a user's edit: keep the text, recompute, and tell the page. */
  private edit(change: Partial<OvbFormInputs>): void {
    this.form = Object.freeze({ ...this.form, ...change });
    this.inputs = this.form;
    this.evaluate();
    this.readouts = {};
    this.dispatchEvent(new CustomEvent('lurk-inputs-change', { detail: { inputs: this.form }, bubbles: true, composed: true }));
    this.announceResult();
  }

  private announceResult(): void {
    const detail: OvbResultDetail = { result: this.outcome.result, problems: this.outcome.problems };
    this.dispatchEvent(new CustomEvent('lurk-result', { detail, bubbles: true, composed: true }));
  }

  private covariateEdit(index: number, change: Partial<OvbFormInputs['covariateTs'][number]>): Partial<OvbFormInputs> {
    return { covariateTs: this.form.covariateTs.map((row, i) => (i === index ? { ...row, ...change } : row)) };
  }

  private addCovariate(): void {
    this.edit({ covariateTs: [...this.form.covariateTs, { name: '', outcomeT: '', treatmentT: '' }] });
    const index = this.form.covariateTs.length - 1;
    void this.updateComplete.then(() => (this.renderRoot.querySelector(`#${fieldId(`covariateTs[${index}].name`)}`) as HTMLElement | null)?.focus());
  }

  /** Choosing the outcome or treatment takes that column out of the covariates; the fitted data no longer applies. */
  private chooseRole(key: 'outcome' | 'treatment', column: string): void {
    this.fileData = null;
    this.dataNote = '';
    this.edit({ [key]: column, covariates: this.form.covariates.filter((c) => c !== column) });
  }

  /** An edit that changes how the file is read: the fitted data no longer applies. */
  private refitNeeded(change: Partial<OvbFormInputs>): Partial<OvbFormInputs> {
    this.fileData = null;
    this.dataNote = '';
    return change;
  }

  private toggleCovariate(column: string, checked: boolean): void {
    this.fileData = null;
    this.dataNote = '';
    const chosen = checked ? [...this.form.covariates.filter((c) => c !== column), column] : this.form.covariates.filter((c) => c !== column);
    // keep the file's column order
    this.edit({ covariates: this.columns.filter((c) => chosen.includes(c)) });
  }

  private async onFile(event: Event): Promise<void> {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    this.abort?.abort();
    this.file = file;
    this.fileData = null;
    this.dataNote = '';
    try {
      const head = await file.slice(0, HEAD_BYTES).text();
      const complete = file.size > HEAD_BYTES ? head.slice(0, Math.max(head.lastIndexOf('\n'), 0)) : head;
      const table = readCsvText(complete || head, 'file');
      this.columns = table.columns;
      this.fileProblem = '';
      const keep = (c: string) => (table.columns.includes(c) ? c : '');
      const outcome = keep(this.form.outcome);
      const treatment = keep(this.form.treatment);
      const kept = this.form.covariates.filter((c) => table.columns.includes(c) && c !== outcome && c !== treatment);
      // By default every other column is a covariate.
      const covariates = kept.length > 0 ? kept : table.columns.filter((c) => c !== outcome && c !== treatment);
      this.edit({ fileName: file.name, outcome, treatment, covariates });
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      this.columns = [];
      this.fileProblem = `${file.name}: ${error.problems.map((p) => p.message).join('; ')}`;
      this.edit({ fileName: file.name });
    }
  }

  /** Reads the whole file in a Web Worker, chunk by chunk, and fits the regressions. */
  private async fit(): Promise<void> {
    const f = this.form;
    if (!this.file || !f.outcome || !f.treatment) return;
    this.abort?.abort();
    const abort = new AbortController();
    this.abort = abort;
    this.progress = { fraction: 0, rows: 0 };
    this.fileProblem = '';
    try {
      const data = await runRegressionInWorker(
        this.file,
        {
          outcome: f.outcome,
          treatment: f.treatment,
          covariates: f.covariates.filter((c) => c !== f.outcome && c !== f.treatment),
          categorical: f.categorical.split(',').map((c) => c.trim()).filter((c) => c !== ''),
        },
        {
          signal: abort.signal,
          onProgress: (p) => (this.progress = { fraction: p.totalBytes ? Math.min(1, p.bytesRead / p.totalBytes) : 0, rows: p.rowsRead }),
        },
      );
      if (abort.signal.aborted) return;
      this.fileData = { design: data.design, spec: ovbSpecFromRegressionData(data) };
      const coded = data.categorical.map((c) => `${c.column} is dummy-coded with reference level “${c.reference}”`);
      this.dataNote =
        `${data.rowsUsed.toLocaleString('en')} rows used of ${data.rowsRead.toLocaleString('en')}` +
        (data.rowsDropped > 0 ? `; ${data.rowsDropped.toLocaleString('en')} dropped for a missing value` : '') +
        '.' +
        (coded.length > 0 ? ` ${coded.join('; ')}.` : '') +
        (data.warnings.length > 0 ? ` ${data.warnings.join(' ')}` : '');
      this.evaluate();
      this.announceResult();
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError') this.fileProblem = 'Reading was cancelled.';
      else if (error instanceof InputError) this.fileProblem = error.problems.map((p) => p.message).join(' ');
      else this.fileProblem = error instanceof Error ? error.message : String(error);
    } finally {
      if (this.abort === abort) {
        this.abort = null;
        this.progress = null;
      }
    }
  }

  private cancel(): void {
    this.abort?.abort();
  }

  /** A click on a contour plot (not on its buttons) takes the strength under the pointer as the one to try. */
  private onPlotClick(event: MouseEvent): void {
    const onFigure = event.composedPath().some((node) => node instanceof SVGSVGElement);
    const at = this.lastPointer;
    if (!onFigure || !at) return;
    const percent = (v: number) => `${(Math.round(v * 1000) / 10).toString()}%`;
    this.edit({ r2dz: percent(at.x), r2yz: percent(at.y) });
  }

  private onPointer(kind: 'estimate' | 't', event: CustomEvent<PlotPointerDetail>): void {
    const result = this.outcome.result;
    const { x, y, inside } = event.detail;
    this.lastPointer = inside && x >= 0 && x < 1 && y >= 0 && y < 1 ? { x, y } : null;
    if (!result || !inside || !(x >= 0 && x < 1 && y >= 0 && y <= 1)) {
      this.readouts = { ...this.readouts, [kind]: '' };
      return;
    }
    const a = adjustForConfounder({ estimate: result.estimate, se: result.se, df: result.df }, { r2dz: x, r2yz: y }, result.direction);
    this.readouts = {
      ...this.readouts,
      [kind]: `R² with treatment ${formatPercent(x)}, with outcome ${formatPercent(y)}: adjusted estimate ${formatNumber(a.estimate, {
        significant: 3,
      })}, SE ${formatNumber(a.se, { significant: 3 })}, t ${formatNumber(a.t, { digits: 2 })}`,
    };
  }
}

/** Fields that have their own place in the form (their problems are shown there, not in the results). */
const FORM_FIELDS = /^(estimate|se|df|n|parameters|covariateTs|q|alpha|k|r2dz|r2yz|plotMax|outcome|treatment|covariates|benchmarks|summaryTable|summaryColumns|summaryResult|file)/;

/** An element id from a field path: `covariateTs[1].name` → `covariateTs-1-name`. */
function fieldId(field: string): string {
  return field.replace(/[[\].]+/g, '-').replace(/-$/, '');
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-ovb': LurkOvb;
  }
}

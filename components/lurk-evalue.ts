import { LitElement, html, nothing } from 'lit';
import type { TemplateResult } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { boundingFactor } from '../src/core/boundingFactor';
import type { EValueResult } from '../src/core/eValueAnalysis';
import { InputError } from '../src/core/inputProblem';
import type { InputProblem } from '../src/core/inputProblem';
import type { EffectMeasure } from '../src/core/riskRatioScale';
import { columnLevels, readCsvText } from '../src/data/csv';
import type { CsvTable } from '../src/data/csv';
import { emptyEValueForm, evaluateEValueForm, normaliseEValueForm } from '../src/methods/evalue/request';
import type { ConfounderText, EValueFormInputs, EValueFormOutcome, EValueSource } from '../src/methods/evalue/request';
import {
  MEASURE_LABELS,
  describeEValue,
  describeReferenceConfounder,
  describeStrengthPair,
  formatEValue,
  formatLevel,
  formatMeasureValue,
  formatPlain,
} from '../src/methods/evalue/text';
import { emptyStudy } from '../src/format/studyLabels';
import { eValueSummary, type EValueSummary } from '../src/workspace/calculatorSummaries';
import type { ReferenceConfounderAssessment } from '../src/core/referenceConfounder';
import type { StudyLabels } from '../src/format/studyLabels';
import { guessYesValues } from '../src/methods/evalue/twoByTwoFromCsv';
import { shownProblems } from '../src/format/shownProblems';
import { jointStrengthPlot } from '../src/methods/evalue/jointStrengthPlot';
import type { PlotSpec } from '../src/plot/plotSpec';
import type { PlotPointerDetail } from './lurk-plot';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { eValueStyles } from './styles/evalue';
import './lurk-plot';
import { sourceChoice } from './sourceChoice';
import { textField } from './textField';

/** Detail of `lurk-result`: the new result, or null with the problems that prevent one. */
export interface EValueResultDetail {
  readonly result: EValueResult | null;
  readonly problems: readonly InputProblem[];
}

const SOURCES: ReadonlyArray<{ id: EValueSource; label: string }> = [
  { id: 'reported', label: 'A reported estimate' },
  { id: 'counts', label: 'A 2×2 table of counts' },
  { id: 'file', label: 'A CSV file, one row per person' },
];

const MEASURE_CHOICES: ReadonlyArray<{ id: EffectMeasure; label: string }> = [
  { id: 'rr', label: 'Risk ratio' },
  { id: 'or', label: 'Odds ratio' },
  { id: 'hr', label: 'Hazard ratio' },
  { id: 'smd', label: 'Standardized mean difference (d)' },
  { id: 'md', label: 'Mean difference' },
];

const CELLS = [
  { cell: 'a', row: 'Exposed', column: 'had the outcome' },
  { cell: 'b', row: 'Exposed', column: 'did not' },
  { cell: 'c', row: 'Unexposed', column: 'had the outcome' },
  { cell: 'd', row: 'Unexposed', column: 'did not' },
] as const;

/**
 * @summary The E-value calculator: from a reported estimate (risk, odds or hazard ratio, standardized or raw
 * mean difference, with its interval or SE), a 2×2 table, or a CSV file, to the E-values, a plain reading,
 * the joint-strength plot and a comparison with reference confounders.
 *
 * @property inputs - the form as typed (EValueFormInputs: text, never parsed numbers); partial or older objects
 *   are completed. A CSV's rows are never part of it, only its name and the column choices.
 * @property study - the finding's labels (exposure, outcome, units) used in the text and the plot.
 * @fires lurk-inputs-change - {inputs} after every edit by the user.
 * @fires lurk-result - {result, problems} when the user's edit gives a new result (result null while the form
 *   has problems).
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
@customElement('lurk-evalue')
export class LurkEValue extends LitElement {
  static override styles = [baseStyles, calculatorLayoutStyles, eValueStyles];

  @property({ attribute: false }) inputs: EValueFormInputs | Record<string, unknown> | null = null;
  @property({ attribute: false }) study: StudyLabels = emptyStudy;

  @state() private form: EValueFormInputs = emptyEValueForm();
  @state() private table: CsvTable | null = null;
  @state() private fileProblem = '';
  @state() private readout = '';

  private outcome: EValueFormOutcome = evaluateEValueForm(this.form, null);
  private spec: PlotSpec | null = null;
  private evaluatedFor: unknown = undefined;

  /** Headline numbers of the current result, for the workspace's appraisal file, statement and bottom line. */
  get summary(): EValueSummary | null {
    const result = this.outcome.result;
    if (!result) return null;
    return eValueSummary(result, this.outcome.confounders.filter((c): c is ReferenceConfounderAssessment => c !== null));
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('inputs') && this.inputs !== this.form) {
      this.form = normaliseEValueForm(this.inputs);
    }
    if (this.evaluatedFor !== this.form || changed.has('table') || changed.has('study')) this.evaluate();
  }

  override render() {
    return html`
      <div class="layout">
        <form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="E-value inputs">
          ${sourceChoice('Start from', SOURCES, this.form.source, (source) => this.edit({ source }))}
          ${this.form.source === 'reported' ? this.reportedFields() : this.form.source === 'counts' ? this.countFields() : this.fileFields()}
          ${this.sharedFields()} ${this.confounderFields()}
        </form>
        <section part="results" aria-label="E-value results">${this.results()}</section>
      </div>
    `;
  }

  // ——— inputs ———

  private reportedFields(): TemplateResult {
    const f = this.form;
    const ratio = f.measure === 'rr' || f.measure === 'or' || f.measure === 'hr';
    return html`
      <div class="field">
        <label for="measure">Effect measure</label>
        <select id="measure" @change=${(e: Event) => this.edit({ measure: (e.target as HTMLSelectElement).value as EffectMeasure })}>
          ${MEASURE_CHOICES.map((m) => html`<option value=${m.id} ?selected=${f.measure === m.id}>${m.label}</option>`)}
        </select>
      </div>
      ${this.textField('estimate', 'Estimate', f.estimate, (v) => ({ estimate: v }), ratio ? 'As reported, e.g. 1.8' : 'As reported, e.g. 0.4')}
      <fieldset>
        <legend>Its uncertainty</legend>
        <label class="choice"
          ><input type="radio" name="interval-by" .checked=${f.intervalBy === 'limits'} @change=${() => this.edit({ intervalBy: 'limits' })} />Confidence
          limits</label
        >
        <label class="choice"
          ><input type="radio" name="interval-by" .checked=${f.intervalBy === 'se'} @change=${() => this.edit({ intervalBy: 'se' })} />Standard error</label
        >
        ${f.intervalBy === 'limits'
          ? html`<div class="pair">
              ${this.textField('lower', 'Lower limit', f.lower, (v) => ({ lower: v }))} ${this.textField('upper', 'Upper limit', f.upper, (v) => ({ upper: v }))}
            </div>`
          : this.textField(
              'se',
              'Standard error',
              f.se,
              (v) => ({ se: v }),
              ratio ? 'Of the log ratio' : f.measure === 'smd' ? 'Of d' : 'Of the difference, in the outcome’s units',
            )}
        <p class="hint">Optional: without it only the estimate gets an E-value.</p>
      </fieldset>
      ${f.measure === 'or' || f.measure === 'hr' ? this.prevalenceField() : nothing}
      ${f.measure === 'md' ? this.textField('sd', 'Standard deviation of the outcome', f.sd, (v) => ({ sd: v }), 'Turns the difference into d') : nothing}
    `;
  }

  private countFields(): TemplateResult {
    const f = this.form;
    return html`
      <fieldset>
        <legend>Counts of people</legend>
        <table class="counts">
          <thead>
            <tr>
              <td></td>
              <th scope="col">Had the outcome</th>
              <th scope="col">Did not</th>
            </tr>
          </thead>
          <tbody>
            ${(['Exposed', 'Unexposed'] as const).map(
              (row) => html`<tr>
                <th scope="row">${row}</th>
                ${CELLS.filter((c) => c.row === row).map((c) => html`<td>${this.countInput(c.cell, `${c.row}, ${c.column}`)}</td>`)}
              </tr>`,
            )}
          </tbody>
        </table>
        ${CELLS.map((c) => this.errorFor(`counts.${c.cell}`, `count-${c.cell}-error`, `${c.row}, ${c.column}: `))}
        ${this.errorFor('counts', 'counts-error')}
      </fieldset>
      ${this.tableMeasureField()}
    `;
  }

  private countInput(cell: 'a' | 'b' | 'c' | 'd', label: string): TemplateResult {
    const problem = this.problemFor(`counts.${cell}`);
    return html`<label class="visually-hidden" for="count-${cell}">${label} (${cell})</label
      ><input
        id="count-${cell}"
        inputmode="numeric"
        .value=${this.form.counts[cell]}
        aria-invalid=${problem ? 'true' : 'false'}
        aria-describedby="count-${cell}-error counts-error"
        @input=${(e: Event) => this.edit({ counts: { ...this.form.counts, [cell]: (e.target as HTMLInputElement).value } })}
      />`;
  }

  private fileFields(): TemplateResult {
    const f = this.form;
    const table = this.table;
    const columnSelect = (id: 'exposure' | 'outcome', label: string, value: string, key: 'exposureColumn' | 'outcomeColumn') => {
      const problem = this.problemFor(id);
      return html`<div class="field">
        <label for="column-${id}">${label}</label>
        <select
          id="column-${id}"
          aria-invalid=${problem ? 'true' : 'false'}
          aria-describedby="${id}-error"
          @change=${(e: Event) => this.edit({ [key]: (e.target as HTMLSelectElement).value, [key === 'exposureColumn' ? 'exposedValues' : 'outcomeValues']: [] })}
        >
          <option value="" ?selected=${value === ''}>Choose a column</option>
          ${table?.columns.map((c) => html`<option value=${c} ?selected=${value === c}>${c}</option>`)}
        </select>
        ${this.errorFor(id, `${id}-error`)}
      </div>`;
    };
    return html`
      <div class="field">
        <label for="file">CSV file</label>
        <input
          id="file"
          type="file"
          accept=".csv,.tsv,.txt,text/csv,text/plain"
          aria-describedby="file-hint file-error"
          aria-invalid=${this.fileProblem || (this.outcome.started && this.problemFor('file')) ? 'true' : 'false'}
          @change=${this.onFile}
        />
        <div class="hint" id="file-hint">
          ${table
            ? `${f.fileName}: ${table.rows.length} rows, columns ${table.columns.join(', ')}. It stays in this browser.`
            : f.fileName
              ? `Choose ${f.fileName} again: the rows of a file are never saved, only the choices below.`
              : 'A header row, then one row per person; comma, semicolon or tab separated. It stays in this browser.'}
        </div>
        <div class="field-error" id="file-error">${this.fileProblem}</div>
      </div>
      ${table
        ? html`<div class="pair">
              ${columnSelect('exposure', 'Exposure column', f.exposureColumn, 'exposureColumn')}
              ${columnSelect('outcome', 'Outcome column', f.outcomeColumn, 'outcomeColumn')}
            </div>
            ${this.valueChoices('exposedValues', 'Values that mean exposed', f.exposureColumn)}
            ${this.valueChoices('outcomeValues', 'Values that mean the outcome happened', f.outcomeColumn)}
            ${this.outcome.csv
              ? html`<p class="hint" id="counted">
                  Counted: a ${this.outcome.csv.counts.a}, b ${this.outcome.csv.counts.b}, c ${this.outcome.csv.counts.c}, d
                  ${this.outcome.csv.counts.d} from ${this.outcome.csv.rowsUsed} rows.
                </p>`
              : nothing}
            ${this.errorFor('counts', 'counts-error')}`
        : nothing}
      ${this.tableMeasureField()}
    `;
  }

  private valueChoices(key: 'exposedValues' | 'outcomeValues', legend: string, column: string): TemplateResult | typeof nothing {
    const table = this.table;
    if (!table || !column || !table.columns.includes(column)) return nothing;
    const levels = columnLevels(table, column, key).map((l) => l.value);
    const chosen = this.form[key].length > 0 ? this.form[key] : (guessYesValues(levels) ?? []);
    const problem = this.problemFor(key);
    return html`<fieldset aria-describedby="${key}-error" class=${problem ? 'invalid' : ''}>
      <legend>${legend}</legend>
      <div class="values">
        ${levels.slice(0, 40).map(
          (level) => html`<label class="choice"
            ><input
              type="checkbox"
              .checked=${chosen.includes(level)}
              @change=${(e: Event) => {
                const on = (e.target as HTMLInputElement).checked;
                const next = on ? [...chosen.filter((v) => v !== level), level] : chosen.filter((v) => v !== level);
                this.edit({ [key]: next });
              }}
            />${level}</label
          >`,
        )}
      </div>
      ${levels.length > 40 ? html`<p class="hint">Showing 40 of ${levels.length} values.</p>` : nothing}
      ${this.errorFor(key, `${key}-error`)}
    </fieldset>`;
  }

  private tableMeasureField(): TemplateResult {
    const f = this.form;
    return html`
      <div class="field">
        <label for="table-measure">Ratio to compute</label>
        <select id="table-measure" @change=${(e: Event) => this.edit({ tableMeasure: (e.target as HTMLSelectElement).value as 'rr' | 'or' })}>
          <option value="rr" ?selected=${f.tableMeasure === 'rr'}>Risk ratio (cohort data)</option>
          <option value="or" ?selected=${f.tableMeasure === 'or'}>Odds ratio (case-control data)</option>
        </select>
      </div>
      ${f.tableMeasure === 'or' ? this.prevalenceField() : nothing}
    `;
  }

  private prevalenceField(): TemplateResult {
    const problem = this.problemFor('outcomePrevalence');
    return html`<div class="field">
      <label for="prevalence">How common is the outcome?</label>
      <select
        id="prevalence"
        aria-invalid=${problem ? 'true' : 'false'}
        aria-describedby="prevalence-hint outcomePrevalence-error"
        @change=${(e: Event) => this.edit({ outcomePrevalence: (e.target as HTMLSelectElement).value as '' | 'rare' | 'common' })}
      >
        <option value="" ?selected=${this.form.outcomePrevalence === ''}>Choose…</option>
        <option value="rare" ?selected=${this.form.outcomePrevalence === 'rare'}>Rare (under about 15%)</option>
        <option value="common" ?selected=${this.form.outcomePrevalence === 'common'}>Common (15% or more)</option>
      </select>
      <div class="hint" id="prevalence-hint">Decides how the ratio is put on the risk-ratio scale; it is never assumed.</div>
      ${this.errorFor('outcomePrevalence', 'outcomePrevalence-error')}
    </div>`;
  }

  private sharedFields(): TemplateResult {
    const f = this.form;
    const showLevel = f.source !== 'reported' || f.intervalBy === 'se' || f.lower !== '' || f.upper !== '';
    const nullText = f.source === 'reported' && (f.measure === 'smd' || f.measure === 'md') ? '0' : '1';
    return html`<div class="pair">
      ${showLevel ? this.textField('level', 'Confidence level (%)', f.level, (v) => ({ level: v }), 'e.g. 95') : nothing}
      ${this.textField('target', 'Shift to (optional)', f.target, (v) => ({ target: v }), `Empty: the null, ${nullText}`)}
    </div>`;
  }

  private confounderFields(): TemplateResult {
    const rows = this.form.confounders;
    return html`<fieldset>
      <legend>Reference confounders</legend>
      <p class="hint">Confounders of known strength to compare with, e.g. a measured covariate: its risk ratio with the exposure and with the outcome.</p>
      ${rows.map(
        (row, i) => html`<div class="confounder">
          ${this.textField(`confounders[${i}].name`, 'Confounder name', row.name, (v) => this.confounderEdit(i, { name: v }))}
          ${this.textField(`confounders[${i}].rrExposure`, 'RR with exposure', row.rrExposure, (v) => this.confounderEdit(i, { rrExposure: v }))}
          ${this.textField(`confounders[${i}].rrOutcome`, 'RR with outcome', row.rrOutcome, (v) => this.confounderEdit(i, { rrOutcome: v }))}
          <button type="button" class="secondary" aria-label="Remove ${row.name || `confounder ${i + 1}`}" @click=${() => this.removeConfounder(i)}>
            Remove
          </button>
        </div>`,
      )}
      <button type="button" class="secondary" @click=${this.addConfounder}>Add a reference confounder</button>
    </fieldset>`;
  }

  /** A labelled text input with its hint and its error, tied together by aria-describedby. */
  private textField(field: string, label: string, value: string, change: (text: string) => Partial<EValueFormInputs>, hint = ''): TemplateResult {
    const id = fieldId(field);
    const problem = this.problemFor(field);
    return textField({ id: id, label, value, problem, hint, inputMode: field.endsWith('name') ? 'text' : 'decimal', onInput: (text) => this.edit(change(text)) });
  }

  private errorFor(field: string, id: string, prefix = ''): TemplateResult {
    const problem = this.problemFor(field);
    return html`<div class="field-error" id=${id}>${problem ? prefix + problem.message : ''}</div>`;
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
      return html`<p class="waiting" role="status">
        ${shown.length > 0
          ? `Fix the ${shown.length === 1 ? 'field' : `${shown.length} fields`} marked in the form to see the E-values.`
          : this.form.source === 'file'
            ? 'Choose a CSV file and its two columns to see the E-values.'
            : 'Enter an estimate to see its E-values.'}
      </p>`;
    }
    const reading = describeEValue(result, this.study);
    const units = this.study.units;
    const own = (x: number) => formatMeasureValue(x, result.measure, units);
    const rr = result.riskRatioScale;
    const intervalText = (lower: number | null, upper: number | null, show: (x: number) => string) =>
      lower === null || upper === null ? '' : ` (${formatLevel(result.level)} interval ${show(lower)} to ${show(upper)})`;
    const confounders = this.form.confounders
      .map((row, i) => ({ row, assessment: this.outcome.confounders[i] }))
      .filter((c) => c.assessment);
    return html`
      <div class="evalues" role="group" aria-label="E-values">
        <div class="evalue">
          <span class="label" id="evalue-estimate-label">E-value for the estimate</span>
          <span class="number" id="evalue-estimate" aria-labelledby="evalue-estimate-label">${formatEValue(result.eValueEstimate)}</span>
        </div>
        <div class="evalue">
          <span class="label" id="evalue-interval-label">E-value for the interval</span>
          <span class="number" id="evalue-interval" aria-labelledby="evalue-interval-label"
            >${result.eValueInterval === null ? 'no interval' : formatEValue(result.eValueInterval)}</span
          >
          ${result.intervalLimitUsed && result.intervalLimitUsed !== 'none'
            ? html`<span class="label">from the ${result.intervalLimitUsed} limit</span>`
            : result.intervalLimitUsed === 'none'
              ? html`<span class="label">the interval includes the ${result.targetIsNull ? 'null' : 'target'}</span>`
              : nothing}
        </div>
      </div>
      <p class="scale">
        ${MEASURE_LABELS[result.measure].replace(/^./, (c) => c.toUpperCase())} ${own(result.input.estimate)}${intervalText(
          result.interval?.lower ?? null,
          result.interval?.upper ?? null,
          own,
        )}${result.conversion.kind === 'none' ? '' : html`; on the risk-ratio scale ${formatPlain(rr.estimate)}${intervalText(rr.lower, rr.upper, formatPlain)}`}${result.targetIsNull
          ? ''
          : `; target ${own(result.target)}`}.
        <span class="hint">${result.conversion.note}</span>
      </p>
      <p class="headline" id="reading-estimate">${reading.estimate}</p>
      ${reading.interval ? html`<p id="reading-interval">${reading.interval}</p>` : nothing}
      ${result.warnings.map((w) => html`<p class="warning" role="note">${w}</p>`)}
      <p class="caution" role="note">${reading.caution}</p>
      ${confounders.length > 0
        ? html`<h3>Compared with the reference confounders</h3>
            <ul class="verdicts">
              ${confounders.map((c) => html`<li>${describeReferenceConfounder(c.assessment!, result, this.study)}</li>`)}
            </ul>`
        : nothing}
      <lurk-plot .spec=${this.spec} .readout=${this.readout} @lurk-plot-pointer=${this.onPointer}></lurk-plot>
    `;
  }

  // ——— behaviour ———

  private evaluate(): void {
    this.outcome = evaluateEValueForm(this.form, this.form.source === 'file' ? this.table : null);
    this.evaluatedFor = this.form;
    const result = this.outcome.result;
    const confounders = this.outcome.confounders.filter((c) => c !== null);
    this.spec = result ? jointStrengthPlot(result, { study: this.study, confounders }) : null;
  }

  /** Applies a user's edit: keep the text, recompute, and tell the page. */
  private edit(change: Partial<EValueFormInputs>): void {
    this.form = Object.freeze({ ...this.form, ...change });
    this.inputs = this.form;
    this.evaluate();
    this.readout = '';
    this.dispatchEvent(new CustomEvent('lurk-inputs-change', { detail: { inputs: this.form }, bubbles: true, composed: true }));
    const detail: EValueResultDetail = { result: this.outcome.result, problems: this.outcome.problems };
    this.dispatchEvent(new CustomEvent('lurk-result', { detail, bubbles: true, composed: true }));
  }

  private confounderEdit(index: number, change: Partial<ConfounderText>): Partial<EValueFormInputs> {
    return { confounders: this.form.confounders.map((row, i) => (i === index ? { ...row, ...change } : row)) };
  }

  private addConfounder(): void {
    this.edit({ confounders: [...this.form.confounders, { name: '', rrExposure: '', rrOutcome: '' }] });
    const index = this.form.confounders.length - 1;
    void this.updateComplete.then(() => (this.renderRoot.querySelector(`#${fieldId(`confounders[${index}].name`)}`) as HTMLElement | null)?.focus());
  }

  private removeConfounder(index: number): void {
    this.edit({ confounders: this.form.confounders.filter((_, i) => i !== index) });
  }

  private async onFile(event: Event): Promise<void> {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    try {
      const table = readCsvText(await file.text(), 'file');
      this.table = table;
      this.fileProblem = '';
      const keep = (column: string) => (table.columns.includes(column) ? column : '');
      this.edit({
        fileName: file.name,
        exposureColumn: keep(this.form.exposureColumn),
        outcomeColumn: keep(this.form.outcomeColumn),
      });
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      this.table = null;
      this.fileProblem = `${file.name}: ${error.problems.map((p) => p.message).join('; ')}`;
      this.edit({ fileName: file.name });
    }
  }

  private onPointer(event: CustomEvent<PlotPointerDetail>): void {
    const result = this.outcome.result;
    const { x, y, inside } = event.detail;
    this.readout = result && inside ? describeStrengthPair(x, y, boundingFactor(x, y), result) : '';
  }
}

/** An element id from a field path: `confounders[1].name` → `confounders-1-name`. */
function fieldId(field: string): string {
  return field.replace(/[[\].]+/g, '-').replace(/-$/, '');
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-evalue': LurkEValue;
  }
  interface GlobalEventHandlersEventMap {
    'lurk-inputs-change': CustomEvent<{ inputs: Record<string, unknown> }>;
    'lurk-result': CustomEvent<{ result: unknown; problems?: readonly InputProblem[] }>;
  }
}

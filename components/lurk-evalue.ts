import { html, type TemplateResult } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { EValueResult } from '../src/core/eValueAnalysis';
import type { InputProblem } from '../src/core/inputProblem';
import type { CsvTable } from '../src/data/csv';
import { emptyStudy } from '../src/format/studyLabels';
import { evalueMethod } from '../src/methods/evalue/method';
import type { ConfounderText, EValueFormInputs, EValueFormOutcome } from '../src/methods/evalue/request';
import { readChosenFile, runEValue, strengthPairReadout } from '../src/methods/evalue/runner';
import type { EValueSummary } from '../src/methods/evalue/summary';
import type { PlotSpec } from '../src/plot/plotSpec';
import { CalculatorElement } from './calculatorBase';
import { eValueForm } from './evalue/formFields';
import { eValueResults } from './evalue/results';
import type { EValueView } from './evalue/view';
import type { PlotPointerDetail } from './lurk-plot';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { queryBoxStyles } from './queryBox';
import { eValueStyles } from './styles/evalue';

/** Detail of `lurk-result`: the new result, or null with the problems that prevent one. */
export interface EValueResultDetail {
  readonly result: EValueResult | null;
  readonly problems: readonly InputProblem[];
}

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
export class LurkEValue extends CalculatorElement<EValueFormInputs, EValueFormOutcome> {
  static override styles = [baseStyles, calculatorLayoutStyles, eValueStyles, queryBoxStyles];

  protected readonly method = evalueMethod;
  protected outcome: EValueFormOutcome;
  @state() private table: CsvTable | null = null;
  @state() private fileProblem = '';
  @state() private readout = '';
  private plot: PlotSpec | null = null;

  constructor() {
    super();
    this.form = this.method.form.empty();
    this.outcome = runEValue(this.form, null, emptyStudy).outcome;
  }

  /** Headline numbers of the current result, for the workspace's appraisal file, statement and bottom line. */
  override get summary(): EValueSummary | null {
    return this.method.workspace.summarise(this.outcome);
  }

  override render(): TemplateResult {
    const view = this.view();
    return html`
      <div class="layout">
        ${eValueForm(view)}
        <section part="results" aria-label="E-value results">${eValueResults(view)}</section>
      </div>
    `;
  }

  protected override evaluate(): void {
    const run = runEValue(this.form, this.table, this.study);
    this.outcome = run.outcome;
    this.plot = run.plot;
  }

  protected override dataChanged(changed: Map<string, unknown>): boolean {
    return changed.has('table');
  }

  /** A user's edit also clears the plot's readout. */
  protected override edit(change: Partial<EValueFormInputs>): void {
    this.readout = '';
    super.edit(change);
  }

  /** What the form and results templates read and call back into. */
  private view(): EValueView {
    return {
      form: this.form,
      outcome: this.outcome,
      table: this.table,
      fileProblem: this.fileProblem,
      study: this.study,
      plot: this.plot,
      readout: this.readout,
      shown: () => this.shown(),
      problemFor: (field) => this.problemFor(field),
      field: (field, label, value, change, hint, inputMode) => this.field(field, label, value, change, hint, inputMode),
      errorLine: (field, id, prefix = '') => {
        const problem = this.problemFor(field);
        return html`<div class="field-error" id=${id}>${problem ? prefix + problem.message : ''}</div>`;
      },
      edit: (change) => this.edit(change),
      confounderEdit: (index, change) => this.confounderEdit(index, change),
      addConfounder: () => this.addConfounder(),
      removeConfounder: (index) => this.removeConfounder(index),
      onFile: (event) => void this.onFile(event),
      onPointer: (event) => this.onPointer(event),
    };
  }

  private confounderEdit(index: number, change: Partial<ConfounderText>): Partial<EValueFormInputs> {
    return { confounders: this.form.confounders.map((row, i) => (i === index ? { ...row, ...change } : row)) };
  }

  private addConfounder(): void {
    this.edit({ confounders: [...this.form.confounders, { name: '', rrExposure: '', rrOutcome: '' }] });
    this.focusField(`confounders[${this.form.confounders.length - 1}].name`);
  }

  private removeConfounder(index: number): void {
    this.edit({ confounders: this.form.confounders.filter((_, i) => i !== index) });
  }

  private async onFile(event: Event): Promise<void> {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    const { table, problem } = await readChosenFile(file);
    this.table = table;
    this.fileProblem = problem;
    if (table) {
      const keep = (column: string) => (table.columns.includes(column) ? column : '');
      this.edit({ fileName: file.name, exposureColumn: keep(this.form.exposureColumn), outcomeColumn: keep(this.form.outcomeColumn) });
    } else this.edit({ fileName: file.name });
  }

  private onPointer(event: CustomEvent<PlotPointerDetail>): void {
    const { x, y, inside } = event.detail;
    this.readout = strengthPairReadout(this.outcome.result, x, y, inside);
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-evalue': LurkEValue;
  }
}

import { html, type TemplateResult } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { InputProblem } from '../src/core/inputProblem';
import type { OvbResult } from '../src/core/ovbAnalysis';
import type { StudyLabels } from '../src/format/studyLabels';
import { regressionMethod } from '../src/methods/regression/method';
import { evaluateOvbForm, type FileRegression, type OvbFormInputs, type OvbFormOutcome } from '../src/methods/regression/request';
import { fitFailureMessage, fitFileInWorker, ovbPlots, ovbPointReadout, readFileColumns } from '../src/methods/regression/runner';
import type { OvbSummary } from '../src/methods/regression/summary';
import type { PlotSpec } from '../src/plot/plotSpec';
import { CalculatorElement } from './calculatorBase';
import type { PlotPointerDetail } from './lurk-plot';
import { fileFields, reportedFields, settingFields, summaryFields, type OvbFormView } from './regression/formTemplates';
import { results, type OvbResultsView } from './regression/resultTemplates';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { queryBoxStyles } from './queryBox';
import { ovbStyles } from './styles/ovb';
import './lurk-plot';
import { sourceChoice } from './sourceChoice';

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
export class LurkOvb extends CalculatorElement<OvbFormInputs, OvbFormOutcome> {
  static override styles = [baseStyles, calculatorLayoutStyles, ovbStyles, queryBoxStyles];

  protected readonly method = regressionMethod;
  protected outcome: OvbFormOutcome = evaluateOvbForm(regressionMethod.form.empty(), null);

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
  private specs: { estimate: PlotSpec; t: PlotSpec; extreme: PlotSpec } | null = null;

  /** Headline numbers of the current result, for the workspace's appraisal, statement and bottom line. */
  override get summary(): OvbSummary | null {
    return this.outcome.result ? (this.method.workspace.summarise(this.outcome) as OvbSummary | null) : null;
  }

  /** The current analysis (null while the inputs give none). */
  get result(): OvbResult | null {
    return this.outcome.result;
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.abort?.abort();
  }

  protected override dataChanged(changed: Map<string, unknown>): boolean {
    return changed.has('fileData');
  }

  protected evaluate(): void {
    this.outcome = evaluateOvbForm(this.form, this.form.source === 'file' ? this.fileData : null);
    const result = this.outcome.result;
    this.specs = result ? ovbPlots(result, this.labels(), this.outcome.plotMax) : null;
  }

  protected override edit(change: Partial<OvbFormInputs>): void {
    this.readouts = {};
    super.edit(change);
  }

  override render() {
    const f = this.form;
    const view = this.formView();
    return html`
      <div class="layout">
        <form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="Regression sensitivity inputs">
          ${sourceChoice('Start from', SOURCES, f.source, (source) => this.edit({ source }))}
          ${f.source === 'reported' ? reportedFields(view) : f.source === 'file' ? fileFields(view) : summaryFields(view)} ${settingFields(view)}
        </form>
        <section part="results" aria-label="Regression sensitivity results" aria-live="polite">${results(this.resultsView())}</section>
      </div>
    `;
  }

  private formView(): OvbFormView {
    return {
      form: this.form,
      started: this.outcome.started,
      file: this.file,
      columns: this.columns,
      progress: this.progress,
      dataNote: this.dataNote,
      fileProblem: this.fileProblem,
      field: (field, label, value, change, hint = '') => {
        const numeric = !/name|benchmarks|categorical|summary|outcome$|treatment$|direction/.test(field) || /T$/.test(field);
        return this.field(field, label, value, change, hint, numeric ? 'decimal' : 'text');
      },
      problemFor: (field) => this.problemFor(field),
      edit: (change) => this.edit(change),
      covariateEdit: (index, change) => ({ covariateTs: this.form.covariateTs.map((row, i) => (i === index ? { ...row, ...change } : row)) }),
      addCovariate: () => this.addCovariate(),
      chooseRole: (key, column) => this.chooseRole(key, column),
      toggleCovariate: (column, checked) => this.toggleCovariate(column, checked),
      refitNeeded: (change) => this.refitNeeded(change),
      onFile: (event) => void this.onFile(event),
      fit: () => void this.fit(),
      cancel: () => this.abort?.abort(),
    };
  }

  private resultsView(): OvbResultsView {
    return {
      result: this.outcome.result,
      started: this.outcome.started,
      shown: this.shown(),
      study: this.labels(),
      specs: this.specs,
      readouts: this.readouts,
      onPointer: (kind, event) => this.onPointer(kind, event),
      onPlotClick: (event) => this.onPlotClick(event),
    };
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

  private addCovariate(): void {
    this.edit({ covariateTs: [...this.form.covariateTs, { name: '', outcomeT: '', treatmentT: '' }] });
    this.focusField(`covariateTs[${this.form.covariateTs.length - 1}].name`);
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
    const { columns, problem } = await readFileColumns(file);
    this.columns = columns;
    this.fileProblem = problem;
    if (problem) {
      this.edit({ fileName: file.name });
      return;
    }
    const keep = (c: string) => (columns.includes(c) ? c : '');
    const outcome = keep(this.form.outcome);
    const treatment = keep(this.form.treatment);
    const kept = this.form.covariates.filter((c) => columns.includes(c) && c !== outcome && c !== treatment);
    // By default every other column is a covariate.
    const covariates = kept.length > 0 ? kept : columns.filter((c) => c !== outcome && c !== treatment);
    this.edit({ fileName: file.name, outcome, treatment, covariates });
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
      const fitted = await fitFileInWorker(this.file, f, {
        signal: abort.signal,
        onProgress: (p) => (this.progress = { fraction: p.totalBytes ? Math.min(1, p.bytesRead / p.totalBytes) : 0, rows: p.rowsRead }),
      });
      if (abort.signal.aborted) return;
      this.fileData = fitted.fileData;
      this.dataNote = fitted.note;
      this.reevaluate();
      this.fireResult();
    } catch (error) {
      this.fileProblem = fitFailureMessage(error);
    } finally {
      if (this.abort === abort) {
        this.abort = null;
        this.progress = null;
      }
    }
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
    this.readouts = { ...this.readouts, [kind]: result && inside ? ovbPointReadout(result, x, y) : '' };
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-ovb': LurkOvb;
  }
}

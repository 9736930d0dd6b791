import { html } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { WeightingResult } from '../src/core/weightingAnalysis';
import { weightingMethod } from '../src/methods/weighting/method';
import { weightingPlots } from '../src/methods/weighting/plots';
import type { WeightingFormInputs } from '../src/methods/weighting/request';
import { guessWeightingColumns, planWeighting, readWeightingFileColumns, runWeightingPlan, type WeightingOutcome, type WeightingProgress } from '../src/methods/weighting/runner';
import type { WeightingSummary } from '../src/methods/weighting/summary';
import { CalculatorElement } from './calculatorBase';
import { weightingFormTemplate } from './weighting/weightingFormView';
import { weightingResultsTemplate, type WeightingPlotSpecs } from './weighting/weightingResultsView';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { weightingStyles } from './styles/weighting';

const NO_OUTCOME: WeightingOutcome = Object.freeze({ result: null, standardErrors: Object.freeze([]), read: null, problems: Object.freeze([]), started: false });
const NO_PLOTS: WeightingPlotSpecs = { bounds: null, overlap: null, weights: null };

/**
 * @summary The weighting calculator: sensitivity of an inverse-probability-weighted estimate to hidden
 * confounding under the marginal sensitivity model — bounds and percentile-bootstrap sensitivity intervals by
 * Λ, both tipping values, the propensity model, overlap and weights — from a CSV with one row per person. The
 * file is read, the model fitted and the bootstrap run in a Web Worker, with a progress bar and Cancel.
 *
 * @property inputs - the form as typed (WeightingFormInputs: text, never parsed numbers); partial or older objects are
 *   completed. A file's rows are never part of it, only its name and the column choices.
 * @property study - the finding's labels (exposure, outcome, units).
 * @fires lurk-inputs-change - {inputs} after every edit by the user.
 * @fires lurk-result - {result, problems} when a user's edit gives a new result (result null while there are problems).
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
@customElement('lurk-weighting')
export class LurkWeighting extends CalculatorElement<WeightingFormInputs, WeightingOutcome> {
  static override styles = [baseStyles, calculatorLayoutStyles, weightingStyles];

  protected readonly method = weightingMethod;
  @state() protected outcome: WeightingOutcome = NO_OUTCOME;
  @state() private columns: readonly string[] = [];
  @state() private fileProblem = '';
  @state() private progress: WeightingProgress | null = null;

  private file: File | null = null;
  private abort: AbortController | null = null;
  private userStarted = false;
  private resultOwed = false;
  private evaluatedKey: { form: WeightingFormInputs; file: File | null } | null = null;
  private plottedFor: WeightingResult | null | undefined = undefined;
  private specs: WeightingPlotSpecs = NO_PLOTS;

  override get summary(): WeightingSummary | null {
    return this.outcome.result ? weightingMethod.workspace.summarise(this.outcome) : null;
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    super.willUpdate(changed);
    if (this.plottedFor !== this.outcome.result) this.makePlots();
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.abort?.abort();
  }

  override render() {
    const fileError = this.fileProblem || (this.outcome.started ? (this.problemFor('fileName')?.message ?? '') : '');
    return html`
      <div class="layout">
        ${weightingFormTemplate({
          form: this.form,
          columns: this.columns,
          chosenFile: this.file?.name ?? null,
          fileError,
          problemFor: (field) => this.problemFor(field),
          field: (...args) => this.field(...args),
          edit: (change) => this.edit(change),
          onFile: (event) => void this.onFile(event),
        })}
        <section part="results" aria-label="Weighting results">
          ${weightingResultsTemplate({
            outcome: this.outcome,
            shown: this.shown(),
            progress: this.progress,
            specs: this.specs,
            cancel: () => this.abort?.abort(),
            runAgain: () => {
              this.evaluatedKey = null;
              this.evaluate();
            },
          })}
        </section>
      </div>
    `;
  }

  /** A problem of a Λ value is shown under the Λ list. */
  protected override problemFor(field: string) {
    return super.problemFor(field) ?? (field === 'lambdas' ? this.shown().find((p) => p.field.startsWith('lambdas[')) : undefined);
  }

  protected override edit(change: Partial<WeightingFormInputs>): void {
    this.userStarted = true;
    super.edit(change);
  }

  /** While the worker runs, the result event waits for its end. */
  protected override fireResult(): void {
    if (this.abort) this.resultOwed = true;
    else super.fireResult();
  }

  /** Reads the settings; with a file and no problems, runs the Web Worker (the outcome comes later). */
  protected evaluate(): void {
    const key = { form: this.form, file: this.file };
    if (this.evaluatedKey && key.form === this.evaluatedKey.form && key.file === this.evaluatedKey.file) return;
    this.evaluatedKey = key;
    this.abort?.abort();
    this.abort = null;
    this.progress = null;
    this.resultOwed = false;
    const plan = planWeighting(this.form, this.file, this.userStarted);
    if (plan.kind === 'done') {
      this.outcome = plan.outcome;
      return;
    }
    this.outcome = Object.freeze({ ...NO_OUTCOME, started: plan.started });
    const controller = new AbortController();
    this.abort = controller;
    this.progress = { phase: 'reading', bytesRead: 0, totalBytes: this.file?.size ?? 0, rowsRead: 0, resamplesDone: 0, resamplesTotal: 0 };
    void runWeightingPlan(plan, { signal: controller.signal, onProgress: (p) => (this.progress = p) }).then((outcome) => {
      if (this.abort !== controller) return; // a newer evaluation took over
      this.abort = null;
      this.progress = null;
      this.outcome = outcome;
      if (this.resultOwed) {
        this.resultOwed = false;
        super.fireResult();
      }
    });
  }

  private async onFile(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    if (!file) return;
    this.file = file;
    const { columns, problem } = await readWeightingFileColumns(file);
    this.columns = columns;
    this.fileProblem = problem || (columns.length === 0 ? `${file.name} is empty or has no header row.` : '');
    const f = this.form;
    const keep = columns.includes(f.treatment) && columns.includes(f.outcome);
    this.edit({ fileName: file.name, ...(keep ? {} : { ...guessWeightingColumns(columns), covariates: '', categorical: '' }) });
  }

  private makePlots(): void {
    const r = this.outcome.result;
    this.plottedFor = r;
    this.specs = r ? weightingPlots(r) : NO_PLOTS;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-weighting': LurkWeighting;
  }
}

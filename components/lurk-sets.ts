import { html } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { InputProblem } from '../src/core/inputProblem';
import type { MatchedSetsResult } from '../src/core/matchedSetsAnalysis';
import { setsMethod } from '../src/methods/sets/method';
import { setsAmplificationPlot, setsEstimatePlot, setsPValuePlot } from '../src/methods/sets/plots';
import { guessSetsColumns, type SetsFormInputs } from '../src/methods/sets/request';
import { csvHeaderOf, planSets, runSetsPlan, SETS_WORKER_FILE_BYTES, type SetsOutcome } from '../src/methods/sets/runner';
import type { SetsSummary } from '../src/methods/sets/summary';
import type { SetsWorkerProgress } from '../src/methods/sets/setsWorkerClient';
import { CalculatorElement } from './calculatorBase';
import { setsFormTemplate } from './sets/setsFormView';
import { setsResultsTemplate, type SetsPlotSpecs } from './sets/setsResultsView';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { pairsStyles } from './styles/pairs';

const NO_OUTCOME: SetsOutcome = Object.freeze({ result: null, read: null, problems: Object.freeze([]), started: false });
const NO_PLOTS: SetsPlotSpecs = { pValue: null, estimate: null, amplification: null };

/**
 * @summary The matched-sets calculator (one treated unit and one or more controls per set): Rosenbaum bounds for
 * the m-statistic with Huber's ψ (continuous outcome) or the count of treated events (binary outcome), the
 * tipping Γ, the m-estimate's range and sensitivity interval under each Γ, and amplification — from a CSV file
 * with one row per unit. Files over 1 MiB are read and analysed in a Web Worker with a progress bar.
 *
 * @property inputs - the form as typed (SetsFormInputs: text, never parsed numbers); partial or older objects are
 *   completed. A file's rows are never part of it, only its name and the column choices.
 * @property study - the finding's labels (exposure, outcome, units) used in the text and the plots.
 * @fires lurk-inputs-change - {inputs} after every edit by the user.
 * @fires lurk-result - {result, problems} when a user's edit gives a new result (result null while there are problems).
 * @csspart results - the results column.
 */
@customElement('lurk-sets')
export class LurkSets extends CalculatorElement<SetsFormInputs, SetsOutcome> {
  static override styles = [baseStyles, calculatorLayoutStyles, pairsStyles];

  protected readonly method = setsMethod;
  @state() protected outcome: SetsOutcome = NO_OUTCOME;
  @state() private columns: readonly string[] = [];
  @state() private fileProblem = '';
  @state() private progress: SetsWorkerProgress | null = null;

  private file: File | null = null;
  private fileText: string | null = null;
  private abort: AbortController | null = null;
  /** Whether the user has edited the form (a restored form shows no "required" problems until then). */
  private userStarted = false;
  /** A user's edit started a worker run: `lurk-result` is fired when it ends. */
  private resultOwed = false;
  private evaluatedKey: { form: SetsFormInputs; file: File | null; text: string | null } | null = null;
  private plottedFor: MatchedSetsResult | null | undefined = undefined;
  private specs: SetsPlotSpecs = NO_PLOTS;

  /** Headline numbers of the current result, for the workspace (null while there is none). */
  override get summary(): SetsSummary | null {
    return this.outcome.result ? setsMethod.workspace.summarise(this.outcome) : null;
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    super.willUpdate(changed);
    if (this.plottedFor !== this.outcome.result || changed.has('study')) this.makePlots();
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.abort?.abort();
  }

  override render() {
    const fileError = this.fileProblem || (this.outcome.started ? (this.problemFor('file')?.message ?? '') : '');
    return html`
      <div class="layout">
        ${setsFormTemplate({
          form: this.form,
          columns: this.columns,
          chosenFile: this.file?.name ?? null,
          fileError,
          problemFor: (field) => this.problemFor(field),
          field: (...args) => this.field(...args),
          edit: (change) => this.edit(change),
          onFile: (event) => void this.onFile(event),
        })}
        <section part="results" aria-label="Matched-sets results">
          ${setsResultsTemplate({
            outcome: this.outcome,
            shown: this.shown(),
            progress: this.progress,
            study: this.study,
            specs: this.specs,
            cancel: () => this.abort?.abort(),
          })}
        </section>
      </div>
    `;
  }

  /** A problem of the Γ list is shown under the list, whichever value it names. */
  protected override problemFor(field: string): InputProblem | undefined {
    return super.problemFor(field) ?? (field === 'gammas' ? this.shown().find((p) => p.field.startsWith('gammas[')) : undefined);
  }

  protected override edit(change: Partial<SetsFormInputs>): void {
    this.userStarted = true;
    super.edit(change);
  }

  /** While the worker runs, the result event waits for its end. */
  protected override fireResult(): void {
    if (this.abort) this.resultOwed = true;
    else super.fireResult();
  }

  /** Reads the form with the method's runner: at once, or in the Web Worker (then the outcome comes later). */
  protected evaluate(): void {
    const key = { form: this.form, file: this.file, text: this.fileText };
    if (this.evaluatedKey && key.form === this.evaluatedKey.form && key.file === this.evaluatedKey.file && key.text === this.evaluatedKey.text) return;
    this.evaluatedKey = key;
    this.abort?.abort();
    this.abort = null;
    this.progress = null;
    this.resultOwed = false;
    const plan = planSets(this.form, { file: this.file, fileText: this.fileText }, this.userStarted);
    if (plan.kind === 'done') {
      this.outcome = plan.outcome;
      return;
    }
    this.outcome = Object.freeze({ result: null, read: null, problems: Object.freeze([]), started: plan.started });
    const controller = new AbortController();
    this.abort = controller;
    this.progress = { phase: 'reading', bytesRead: 0, totalBytes: this.file?.size ?? null, rowsRead: 0 };
    void runSetsPlan(plan, { signal: controller.signal, onProgress: (p) => (this.progress = p) }).then((outcome) => {
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
    this.fileProblem = '';
    this.file = file;
    this.fileText = null;
    try {
      this.columns = csvHeaderOf(await file.slice(0, 64 * 1024).text());
      if (file.size <= SETS_WORKER_FILE_BYTES) this.fileText = await file.text();
    } catch {
      this.fileProblem = `${file.name} could not be read.`;
      this.columns = [];
    }
    if (this.columns.length === 0 && !this.fileProblem) this.fileProblem = `${file.name} is empty or has no header row.`;
    const f = this.form;
    const has = (c: string) => c !== '' && this.columns.includes(c);
    const keep = has(f.setColumn) && has(f.treatedColumn) && has(f.outcomeColumn);
    this.edit({ fileName: file.name, ...(keep ? {} : guessSetsColumns(this.columns)) });
  }

  private makePlots(): void {
    const r = this.outcome.result;
    this.plottedFor = r;
    const labels = { study: this.study };
    this.specs = r ? { pValue: setsPValuePlot(r, labels), estimate: setsEstimatePlot(r, labels), amplification: setsAmplificationPlot(r, labels) } : NO_PLOTS;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-sets': LurkSets;
  }
}

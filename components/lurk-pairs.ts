import { html } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { InputProblem } from '../src/core/inputProblem';
import type { PairsResult } from '../src/core/pairsAnalysis';
import { pairsMethod } from '../src/methods/pairs/method';
import { guessPairsColumns, type PairsFormInputs } from '../src/methods/pairs/request';
import { csvHeaderOf, planPairs, runPairsPlan, WORKER_FILE_BYTES, type PairsOutcome } from '../src/methods/pairs/runner';
import type { PairsSummary } from '../src/methods/pairs/summary';
import type { PairsWorkerProgress } from '../src/methods/pairs/pairsWorkerClient';
import { amplificationPlot } from '../src/methods/pairs/amplificationPlot';
import { estimateRangePlot } from '../src/methods/pairs/estimateRangePlot';
import { pValueByGammaPlot } from '../src/methods/pairs/pValueByGammaPlot';
import { CalculatorElement } from './calculatorBase';
import { pairsFormTemplate } from './pairs/pairsFormView';
import { pairsResultsTemplate, type PairsPlotSpecs } from './pairs/pairsResultsView';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { queryBoxStyles } from './queryBox';
import { pairsStyles } from './styles/pairs';

/** Detail of `lurk-result`: the new result, or null with the problems that prevent one. */
export interface PairsResultDetail {
  readonly result: PairsResult | null;
  readonly problems: readonly InputProblem[];
}

const NO_OUTCOME: PairsOutcome = Object.freeze({ result: null, read: null, problems: Object.freeze([]), started: false });
const NO_PLOTS: PairsPlotSpecs = { pValue: null, estimate: null, amplification: null };

/**
 * @summary The matched-pairs calculator: Rosenbaum bounds for the signed-rank or sign test, the tipping Γ,
 * the Hodges–Lehmann estimate range and sensitivity interval under each Γ, and amplification — from a CSV of
 * pairs, pasted numbers or discordant counts. Large files and analyses run in a Web Worker with a progress bar.
 *
 * @property inputs - the form as typed (PairsFormInputs: text, never parsed numbers); partial or older objects are
 *   completed. A file's rows are never part of it, only its name and the column choices.
 * @property study - the finding's labels (exposure, outcome, units) used in the text and the plots.
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
@customElement('lurk-pairs')
export class LurkPairs extends CalculatorElement<PairsFormInputs, PairsOutcome> {
  static override styles = [baseStyles, calculatorLayoutStyles, pairsStyles, queryBoxStyles];

  protected readonly method = pairsMethod;
  @state() protected outcome: PairsOutcome = NO_OUTCOME;
  @state() private columns: readonly string[] = [];
  @state() private fileProblem = '';
  @state() private progress: PairsWorkerProgress | null = null;

  private file: File | null = null;
  private fileText: string | null = null;
  private abort: AbortController | null = null;
  /** Whether the user has edited the form (a restored form shows no "required" problems until then). */
  private userStarted = false;
  /** A user's edit started a worker run: `lurk-result` is fired when it ends. */
  private resultOwed = false;
  private evaluatedKey: { form: PairsFormInputs; file: File | null; text: string | null } | null = null;
  private plottedFor: PairsResult | null | undefined = undefined;
  private specs: PairsPlotSpecs = NO_PLOTS;

  /** Headline numbers of the current result, for the workspace (null while there is none). */
  override get summary(): PairsSummary | null {
    return this.outcome.result ? pairsMethod.workspace.summarise(this.outcome) : null;
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
        ${pairsFormTemplate({
          form: this.form,
          columns: this.columns,
          chosenFile: this.file?.name ?? null,
          fileError,
          problemFor: (field) => this.problemFor(field),
          field: (...args) => this.field(...args),
          edit: (change) => this.edit(change),
          onFile: (event) => void this.onFile(event),
        })}
        <section part="results" aria-label="Matched-pairs results">
          ${pairsResultsTemplate({
            outcome: this.outcome,
            shown: this.shown(),
            progress: this.progress,
            source: this.form.source,
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

  protected override edit(change: Partial<PairsFormInputs>): void {
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
    // A change of the study's labels alone needs no new analysis (nor a new worker run).
    const key = { form: this.form, file: this.file, text: this.fileText };
    if (this.evaluatedKey && key.form === this.evaluatedKey.form && key.file === this.evaluatedKey.file && key.text === this.evaluatedKey.text) return;
    this.evaluatedKey = key;
    this.abort?.abort();
    this.abort = null;
    this.progress = null;
    this.resultOwed = false;
    const plan = planPairs(this.form, { file: this.file, fileText: this.fileText }, this.userStarted);
    if (plan.kind === 'done') {
      this.outcome = plan.outcome;
      return;
    }
    this.outcome = Object.freeze({ result: null, read: plan.read, problems: Object.freeze([]), started: plan.started });
    const controller = new AbortController();
    this.abort = controller;
    this.progress = { phase: plan.phase, bytesRead: 0, totalBytes: this.file?.size ?? null, rowsRead: 0 };
    void runPairsPlan(plan, { signal: controller.signal, onProgress: (p) => (this.progress = p) }).then((outcome) => {
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
      if (file.size <= WORKER_FILE_BYTES) this.fileText = await file.text();
    } catch {
      this.fileProblem = `${file.name} could not be read.`;
      this.columns = [];
    }
    if (this.columns.length === 0 && !this.fileProblem) this.fileProblem = `${file.name} is empty or has no header row.`;
    const keep = this.columns.length > 0 && this.columnsStillThere();
    this.edit({ fileName: file.name, ...(keep ? {} : guessPairsColumns(this.columns)) });
  }

  /** Whether the form's column choice names columns of the new file (then it is kept). */
  private columnsStillThere(): boolean {
    const f = this.form;
    const has = (c: string) => c !== '' && this.columns.includes(c);
    return f.columnsBy === 'difference' ? has(f.differenceColumn) : has(f.treatedColumn) && has(f.controlColumn);
  }

  private makePlots(): void {
    const r = this.outcome.result;
    this.plottedFor = r;
    const labels = { study: this.study };
    this.specs = r ? { pValue: pValueByGammaPlot(r, labels), estimate: estimateRangePlot(r, labels), amplification: amplificationPlot(r, labels) } : NO_PLOTS;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-pairs': LurkPairs;
  }
}

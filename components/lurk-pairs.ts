import { html } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { InputProblem } from '../src/core/inputProblem';
import type { PairsResult } from '../src/core/pairsAnalysis';
import { pairsMethod } from '../src/methods/pairs/method';
import { guessPairsColumns, type PairsFormInputs } from '../src/methods/pairs/request';
import { csvHeaderOf, planPairs, runPairsPlan, WORKER_FILE_BYTES, type PairsOutcome } from '../src/methods/pairs/runner';
import type { PairsWorkerProgress } from '../src/methods/pairs/pairsWorkerClient';
import { amplificationPlot } from '../src/methods/pairs/amplificationPlot';
import { estimateRangePlot } from '../src/methods/pairs/estimateRangePlot';
import { pValueByGammaPlot } from '../src/methods/pairs/pValueByGammaPlot';
import type { PairsSummary } from '../src/methods/pairs/summary';
import { FileCalculatorElement, readCsvHead, type ChosenFileRead, type FileRunPlan } from './fileCalculatorBase';
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
export class LurkPairs extends FileCalculatorElement<PairsFormInputs, PairsOutcome, PairsWorkerProgress, PairsPlotSpecs, PairsSummary> {
  static override styles = [baseStyles, calculatorLayoutStyles, pairsStyles, queryBoxStyles];

  protected readonly method = pairsMethod;
  @state() protected outcome: PairsOutcome = NO_OUTCOME;
  protected readonly listField = 'gammas';
  protected readonly fileField = 'file';

  override render() {
    return html`
      <div class="layout">
        ${pairsFormTemplate(this.formHooks())}
        <section part="results" aria-label="Matched-pairs results">
          ${pairsResultsTemplate({
            outcome: this.outcome,
            shown: this.shown(),
            progress: this.progress,
            source: this.form.source,
            study: this.study,
            specs: this.specs,
            cancel: () => this.cancel(),
          })}
        </section>
      </div>
    `;
  }

  protected planRun(): FileRunPlan<PairsOutcome, PairsWorkerProgress> {
    const plan = planPairs(this.form, { file: this.file, fileText: this.fileText }, this.userStarted);
    if (plan.kind === 'done') return plan;
    return {
      kind: 'worker',
      waiting: Object.freeze({ result: null, read: plan.read, problems: Object.freeze([]), started: plan.started }),
      progress: { phase: plan.phase, bytesRead: 0, totalBytes: this.file?.size ?? null, rowsRead: 0 },
      run: (options) => runPairsPlan(plan, options),
    };
  }

  protected readFile(file: File): Promise<ChosenFileRead> {
    return readCsvHead(file, WORKER_FILE_BYTES, csvHeaderOf);
  }

  /** The form's column choice is kept when it names columns of the new file. */
  protected columnsFor(columns: readonly string[]): Partial<PairsFormInputs> {
    const f = this.form;
    const has = (c: string) => c !== '' && columns.includes(c);
    const keep = columns.length > 0 && (f.columnsBy === 'difference' ? has(f.differenceColumn) : has(f.treatedColumn) && has(f.controlColumn));
    return keep ? {} : guessPairsColumns(columns);
  }

  protected plotsFor(r: PairsResult | null): PairsPlotSpecs {
    const labels = { study: this.study };
    return r ? { pValue: pValueByGammaPlot(r, labels), estimate: estimateRangePlot(r, labels), amplification: amplificationPlot(r, labels) } : NO_PLOTS;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-pairs': LurkPairs;
  }
}

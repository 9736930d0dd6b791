import { html } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { MatchedSetsResult } from '../src/core/matchedSetsAnalysis';
import { setsMethod } from '../src/methods/sets/method';
import { setsAmplificationPlot, setsEstimatePlot, setsPValuePlot } from '../src/methods/sets/plots';
import { guessSetsColumns, type SetsFormInputs } from '../src/methods/sets/request';
import { csvHeaderOf, planSets, runSetsPlan, SETS_WORKER_FILE_BYTES, type SetsOutcome } from '../src/methods/sets/runner';
import type { SetsWorkerProgress } from '../src/methods/sets/setsWorkerClient';
import type { SetsSummary } from '../src/methods/sets/summary';
import { FileCalculatorElement, readCsvHead, type ChosenFileRead, type FileRunPlan } from './fileCalculatorBase';
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
export class LurkSets extends FileCalculatorElement<SetsFormInputs, SetsOutcome, SetsWorkerProgress, SetsPlotSpecs, SetsSummary> {
  static override styles = [baseStyles, calculatorLayoutStyles, pairsStyles];

  protected readonly method = setsMethod;
  @state() protected outcome: SetsOutcome = NO_OUTCOME;
  protected readonly listField = 'gammas';
  protected readonly fileField = 'file';

  override render() {
    return html`
      <div class="layout">
        ${setsFormTemplate(this.formHooks())}
        <section part="results" aria-label="Matched-sets results">
          ${setsResultsTemplate({
            outcome: this.outcome,
            shown: this.shown(),
            progress: this.progress,
            study: this.study,
            specs: this.specs,
            cancel: () => this.cancel(),
          })}
        </section>
      </div>
    `;
  }

  protected planRun(): FileRunPlan<SetsOutcome, SetsWorkerProgress> {
    const plan = planSets(this.form, { file: this.file, fileText: this.fileText }, this.userStarted);
    if (plan.kind === 'done') return plan;
    return {
      kind: 'worker',
      waiting: Object.freeze({ result: null, read: null, problems: Object.freeze([]), started: plan.started }),
      progress: { phase: 'reading', bytesRead: 0, totalBytes: this.file?.size ?? null, rowsRead: 0 },
      run: (options) => runSetsPlan(plan, options),
    };
  }

  protected readFile(file: File): Promise<ChosenFileRead> {
    return readCsvHead(file, SETS_WORKER_FILE_BYTES, csvHeaderOf);
  }

  /** The form's column choices are kept when the new file has all three. */
  protected columnsFor(columns: readonly string[]): Partial<SetsFormInputs> {
    const f = this.form;
    const has = (c: string) => c !== '' && columns.includes(c);
    return has(f.setColumn) && has(f.treatedColumn) && has(f.outcomeColumn) ? {} : guessSetsColumns(columns);
  }

  protected plotsFor(r: MatchedSetsResult | null): SetsPlotSpecs {
    const labels = { study: this.study };
    return r ? { pValue: setsPValuePlot(r, labels), estimate: setsEstimatePlot(r, labels), amplification: setsAmplificationPlot(r, labels) } : NO_PLOTS;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-sets': LurkSets;
  }
}

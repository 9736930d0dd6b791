import { html } from 'lit';
import { customElement, state } from 'lit/decorators.js';
import type { WeightingResult } from '../src/core/weightingAnalysis';
import { weightingMethod } from '../src/methods/weighting/method';
import { weightingPlots } from '../src/methods/weighting/plots';
import type { WeightingFormInputs } from '../src/methods/weighting/request';
import { guessWeightingColumns, planWeighting, readWeightingFileColumns, runWeightingPlan, type WeightingOutcome, type WeightingProgress } from '../src/methods/weighting/runner';
import type { WeightingSummary } from '../src/methods/weighting/summary';
import { FileCalculatorElement, type ChosenFileRead, type FileRunPlan } from './fileCalculatorBase';
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
export class LurkWeighting extends FileCalculatorElement<WeightingFormInputs, WeightingOutcome, WeightingProgress, WeightingPlotSpecs, WeightingSummary> {
  static override styles = [baseStyles, calculatorLayoutStyles, weightingStyles];

  protected readonly method = weightingMethod;
  @state() protected outcome: WeightingOutcome = NO_OUTCOME;
  protected readonly listField = 'lambdas';
  protected readonly fileField = 'fileName';
  protected override readonly plotsShowStudy = false;

  override render() {
    return html`
      <div class="layout">
        ${weightingFormTemplate(this.formHooks())}
        <section part="results" aria-label="Weighting results">
          ${weightingResultsTemplate({
            outcome: this.outcome,
            shown: this.shown(),
            progress: this.progress,
            specs: this.specs,
            cancel: () => this.cancel(),
            runAgain: () => this.runAgain(),
          })}
        </section>
      </div>
    `;
  }

  /** Reads the settings; with a file and no problems, runs the Web Worker (the outcome comes later). */
  protected planRun(): FileRunPlan<WeightingOutcome, WeightingProgress> {
    const plan = planWeighting(this.form, this.file, this.userStarted);
    if (plan.kind === 'done') return plan;
    return {
      kind: 'worker',
      waiting: Object.freeze({ ...NO_OUTCOME, started: plan.started }),
      progress: { phase: 'reading', bytesRead: 0, totalBytes: this.file?.size ?? 0, rowsRead: 0, resamplesDone: 0, resamplesTotal: 0 },
      run: (options) => runWeightingPlan(plan, options),
    };
  }

  protected async readFile(file: File): Promise<ChosenFileRead> {
    return { ...(await readWeightingFileColumns(file)), text: null };
  }

  /** The treatment and outcome are kept when the new file has both; otherwise guessed, with no covariates. */
  protected columnsFor(columns: readonly string[]): Partial<WeightingFormInputs> {
    const f = this.form;
    return columns.includes(f.treatment) && columns.includes(f.outcome) ? {} : { ...guessWeightingColumns(columns), covariates: '', categorical: '' };
  }

  protected plotsFor(r: WeightingResult | null): WeightingPlotSpecs {
    return r ? weightingPlots(r) : NO_PLOTS;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-weighting': LurkWeighting;
  }
}

import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import type { WeightingOutcome, WeightingProgress } from '../../src/methods/weighting/runner';
import { coveragePercent, formatEffectValue, formatLambda, tippingWords, WEIGHTING_CAUTION, weightingReading } from '../../src/methods/weighting/text';
import { readNote } from '../../src/methods/weighting/analysis';
import { formatNumber } from '../../src/format/formatNumber';
import { conventionsBlock } from '../conventionsBlock';
import type { PlotSpec } from '../../src/plot/plotSpec';
import { notesBlock, plotColumn, waitingLine } from '../resultParts';

/** The three figures of a result (null without a result). */
export interface WeightingPlotSpecs {
  readonly bounds: PlotSpec | null;
  readonly overlap: PlotSpec | null;
  readonly weights: PlotSpec | null;
}

export interface WeightingResultsView {
  readonly outcome: WeightingOutcome;
  readonly shown: readonly InputProblem[];
  readonly progress: WeightingProgress | null;
  readonly specs: WeightingPlotSpecs;
  cancel(): void;
  runAgain(): void;
}

function progressTemplate(p: WeightingProgress, cancel: () => void): TemplateResult {
  const [label, fraction] =
    p.phase === 'reading'
      ? [`Reading the file: ${p.rowsRead.toLocaleString('en')} rows`, p.totalBytes > 0 ? p.bytesRead / p.totalBytes : 0]
      : p.phase === 'fitting'
        ? ['Fitting the propensity model…', 0]
        : [`Bootstrap: ${p.resamplesDone.toLocaleString('en')} of ${p.resamplesTotal.toLocaleString('en')} resamples`, p.resamplesTotal > 0 ? p.resamplesDone / p.resamplesTotal : 1];
  return html`<div class="busy" role="status" aria-live="polite">
    <label for="weighting-progress" id="progress-label">${label}</label>
    <progress id="weighting-progress" max="1" .value=${fraction}></progress>
    <button type="button" class="secondary" id="cancel" @click=${cancel}>Cancel</button>
  </div>`;
}

export function weightingResultsTemplate(v: WeightingResultsView): TemplateResult {
  if (v.progress) return progressTemplate(v.progress, () => v.cancel());
  const result = v.outcome.result;
  if (!result && v.outcome.problems.some((p) => p.code === 'cancelled')) {
    return html`<p class="waiting" role="status" id="cancelled">The analysis was cancelled.</p>
      <button type="button" id="run-again" @click=${() => v.runAgain()}>Run again</button>`;
  }
  if (!result) return waitingLine(v.shown, 'Choose a CSV file, its treatment and outcome columns to see the bounds.');
  const pct = coveragePercent(result.inputs.alpha);
  const c = result.counts;
  const notes = [...(v.outcome.read?.warnings ?? []), ...result.warnings];
  const pointTip = result.tippingPointStatus === 'found' ? formatLambda(result.tippingLambdaPoint) : result.tippingPointStatus === 'beyond-range' ? `> ${formatLambda(result.inputs.lambdaSearchLimit)}` : '1';
  const intervalTip =
    result.tippingIntervalStatus === 'found' ? formatLambda(result.tippingLambdaInterval) : result.tippingIntervalStatus === 'beyond-range' ? `> ${formatLambda(result.inputs.lambdaSearchLimit)}` : result.tippingIntervalStatus === 'includes-zero-at-one' ? '1' : 'none';
  return html`
    <div class="headlines" role="group" aria-label="Headline numbers">
      <div class="headline-box">
        <span class="label" id="effect-label">Weighted effect (${result.estimand.toUpperCase()}) at Λ = 1</span>
        <span class="number small" id="effect" aria-labelledby="effect-label">${formatEffectValue(result.estimate.effect)}</span>
      </div>
      <div class="headline-box">
        <span class="label" id="tip-point-label">Tipping Λ of the bounds</span>
        <span class="number" id="tipping-point" aria-labelledby="tip-point-label">${pointTip}</span>
      </div>
      <div class="headline-box">
        <span class="label" id="tip-interval-label">Tipping Λ of the ${pct}% interval</span>
        <span class="number" id="tipping-interval" aria-labelledby="tip-interval-label">${intervalTip}</span>
      </div>
    </div>
    <p class="method" id="weighting-counts">
      ${v.outcome.read ? html`${readNote(v.outcome.read)} ` : nothing}${c.used.toLocaleString('en')} people used (${c.treated.toLocaleString('en')} treated,
      ${c.control.toLocaleString('en')} control)${c.droppedMissing > 0 ? `, ${c.droppedMissing.toLocaleString('en')} left out for a missing value` : ''}${c.trimmedBelow + c.trimmedAbove > 0
        ? `, ${(c.trimmedBelow + c.trimmedAbove).toLocaleString('en')} trimmed`
        : ''}. Bootstrap: ${result.bootstrap.used} of ${result.bootstrap.requested} resamples used (seed ${result.bootstrap.seed}).
    </p>
    <div class="reading">${weightingReading(result).map((s) => html`<p>${s}</p>`)}</div>
    <p class="method">
      Point bounds: ${tippingWords(result.tippingLambdaPoint, result.tippingPointStatus, result.inputs.lambdaSearchLimit, 'point bounds')}. Interval:
      ${tippingWords(result.tippingLambdaInterval, result.tippingIntervalStatus, result.inputs.lambdaSearchLimit, 'interval')}.
    </p>
    ${notesBlock(notes, 'weighting-warnings')}
    <div class="table-scroll" tabindex="0" role="region" aria-label="Bounds table (scrolls sideways)">
      <table id="bounds-table">
        <caption>Bounds on the weighted effect and the ${pct}% sensitivity interval by Λ</caption>
        <thead>
          <tr>
            <th scope="col">Λ</th>
            <th scope="col">lowest effect</th>
            <th scope="col">highest effect</th>
            <th scope="col">interval low</th>
            <th scope="col">interval high</th>
          </tr>
        </thead>
        <tbody>
          ${result.rows.map(
            (r) =>
              html`<tr>
                <th scope="row">${formatLambda(r.lambda)}</th>
                <td>${formatEffectValue(r.lowerBound)}</td>
                <td>${formatEffectValue(r.upperBound)}</td>
                <td>${formatEffectValue(r.intervalLower)}</td>
                <td>${formatEffectValue(r.intervalUpper)}</td>
              </tr>`,
          )}
        </tbody>
      </table>
    </div>
    <div class="table-scroll" tabindex="0" role="region" aria-label="Propensity model table (scrolls sideways)">
      <table id="model-table">
        <caption>
          Propensity model: ${result.propensityModel.iterations} iterations, ${result.propensityModel.converged ? 'converged' : 'not converged'}
        </caption>
        <thead>
          <tr>
            <th scope="col">term</th>
            <th scope="col">coefficient</th>
            <th scope="col">standard error</th>
          </tr>
        </thead>
        <tbody>
          ${result.propensityModel.coefficients.map(
            (k, i) =>
              html`<tr>
                <th scope="row">${k.name}</th>
                <td>${formatNumber(k.value, { significant: 4 })}</td>
                <td>${formatNumber(v.outcome.standardErrors[i], { significant: 3 })}</td>
              </tr>`,
          )}
        </tbody>
      </table>
    </div>
    ${plotColumn([v.specs.bounds, v.specs.overlap, v.specs.weights])}
    ${conventionsBlock(result.conventions)}
    <p class="caution" role="note">${WEIGHTING_CAUTION}</p>
  `;
}

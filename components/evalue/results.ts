import { html, nothing, type TemplateResult } from 'lit';
import { MEASURE_LABELS, describeEValue, describeReferenceConfounder, formatEValue, formatLevel, formatMeasureValue, formatPlain } from '../../src/methods/evalue/text';
import type { EValueView } from './view';
import { echoTyped } from '../../src/format/formatNumber';
import { conventionsBlock } from '../conventionsBlock';
import '../lurk-plot';

/** The E-value calculator's results: the two E-values, the scale line, the readings, warnings, comparisons and plot. */
export function eValueResults(v: EValueView): TemplateResult {
  const result = v.outcome.result;
  if (!result) {
    const shown = v.shown();
    return html`<p class="waiting" role="status">
      ${shown.length > 0
        ? `Fix the ${shown.length === 1 ? 'field' : `${shown.length} fields`} marked in the form to see the E-values.`
        : v.form.source === 'summary'
          ? 'Paste the result of the counting query to see the E-values.'
          : v.form.source === 'file'
          ? 'Choose a CSV file and its two columns to see the E-values.'
          : 'Enter an estimate to see its E-values.'}
    </p>`;
  }
  const reading = describeEValue(result, v.study, v.form.target);
  const units = v.study.units;
  const own = (x: number) => formatMeasureValue(x, result.measure, units);
  // Numbers the user typed are echoed as typed ("1.10", not "1.1").
  const typed = v.outcome.typed;
  const echo = (x: number | null, text: string | undefined) =>
    x === null ? '' : echoTyped(x, text, (y) => formatPlain(y)) + (result.measure === 'md' && units.trim() ? ` ${units.trim()}` : '');
  const limitsTyped = result.interval?.source === 'limits' && v.form.source === 'reported';
  const rr = result.riskRatioScale;
  const intervalText = (lower: number | null, upper: number | null, show: (x: number) => string) =>
    lower === null || upper === null ? '' : ` (${formatLevel(result.level)} interval ${show(lower)} to ${show(upper)})`;
  const confounders = v.form.confounders.map((row, i) => ({ row, assessment: v.outcome.confounders[i] })).filter((c) => c.assessment);
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
      ${MEASURE_LABELS[result.measure].replace(/^./, (c) => c.toUpperCase())} ${v.form.source === 'reported' ? echo(result.input.estimate, typed?.estimate) : own(result.input.estimate)}${limitsTyped && result.interval
        ? ` (${formatLevel(result.level)} interval ${echo(result.interval.lower, typed?.lower)} to ${echo(result.interval.upper, typed?.upper)})`
        : intervalText(result.interval?.lower ?? null, result.interval?.upper ?? null, own)}${result.conversion.kind === 'none' ? '' : html`; on the risk-ratio scale ${formatPlain(rr.estimate)}${intervalText(rr.lower, rr.upper, formatPlain)}`}${result.targetIsNull
        ? ''
        : `; target ${echo(result.target, typed?.target)}`}.
      <span class="hint">${result.conversion.note}</span>
    </p>
    ${reading.sentences.map((s, i) =>
      s === reading.estimate
        ? html`<p class=${i === 0 ? 'headline' : ''} id="reading-estimate">${s}</p>`
        : s === reading.interval
          ? html`<p class=${i === 0 ? 'headline' : ''} id="reading-interval">${s}</p>`
          : html`<p>${s}</p>`,
    )}
    ${result.warnings.map((w) => html`<p class="warning" role="note">${w}</p>`)}
    ${conventionsBlock(result.conventions)}
    <p class="caution" role="note">${reading.caution}</p>
    ${confounders.length > 0
      ? html`<h3>Compared with the reference confounders</h3>
          <ul class="verdicts">
            ${confounders.map((c) => html`<li>${describeReferenceConfounder(c.assessment!, result, v.study)}</li>`)}
          </ul>`
      : nothing}
    <lurk-plot .spec=${v.plot} .readout=${v.readout} @lurk-plot-pointer=${(e: CustomEvent) => v.onPointer(e)}></lurk-plot>
  `;
}

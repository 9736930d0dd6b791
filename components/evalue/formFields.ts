import { html, nothing, type TemplateResult } from 'lit';
import type { EffectMeasure } from '../../src/core/riskRatioScale';
import { columnLevels } from '../../src/data/csv';
import type { EValueSource } from '../../src/methods/evalue/request';
import { guessYesValues } from '../../src/methods/evalue/twoByTwoFromCsv';
import { columnSelect, csvFileInput } from '../fileFields';
import { sourceChoice } from '../sourceChoice';
import type { EValueView } from './view';
import { eValueSummaryFields } from './summaryFields';

const SOURCES: ReadonlyArray<{ id: EValueSource; label: string }> = [
  { id: 'reported', label: 'A reported estimate' },
  { id: 'counts', label: 'A 2×2 table of counts' },
  { id: 'file', label: 'A CSV file, one row per person' },
  { id: 'summary', label: 'Summary statistics from your database' },
];

const MEASURE_CHOICES: ReadonlyArray<{ id: EffectMeasure; label: string }> = [
  { id: 'rr', label: 'Risk ratio' },
  { id: 'or', label: 'Odds ratio' },
  { id: 'hr', label: 'Hazard ratio' },
  { id: 'smd', label: 'Standardized mean difference (d)' },
  { id: 'md', label: 'Mean difference' },
];

const CELLS = [
  { cell: 'a', row: 'Exposed', column: 'had the outcome' },
  { cell: 'b', row: 'Exposed', column: 'did not' },
  { cell: 'c', row: 'Unexposed', column: 'had the outcome' },
  { cell: 'd', row: 'Unexposed', column: 'did not' },
] as const;

/** The E-value calculator's form: the source, its fields, the shared level and target, the reference confounders. */
export function eValueForm(v: EValueView): TemplateResult {
  const source = v.form.source;
  return html`<form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="E-value inputs">
    ${sourceChoice('Start from', SOURCES, source, (s) => v.edit({ source: s }))}
    ${source === 'reported' ? reportedFields(v) : source === 'counts' ? countFields(v) : source === 'summary' ? eValueSummaryFields(v) : fileFields(v)}
    ${sharedFields(v)} ${confounderFields(v)}
  </form>`;
}

function reportedFields(v: EValueView): TemplateResult {
  const f = v.form;
  const ratio = f.measure === 'rr' || f.measure === 'or' || f.measure === 'hr';
  return html`
    <div class="field">
      <label for="measure">Effect measure</label>
      <select id="measure" @change=${(e: Event) => v.edit({ measure: (e.target as HTMLSelectElement).value as EffectMeasure })}>
        ${MEASURE_CHOICES.map((m) => html`<option value=${m.id} ?selected=${f.measure === m.id}>${m.label}</option>`)}
      </select>
    </div>
    ${v.field('estimate', 'Estimate', f.estimate, (t) => ({ estimate: t }), ratio ? 'As reported, e.g. 1.8' : 'As reported, e.g. 0.4')}
    <fieldset>
      <legend>Its uncertainty</legend>
      <label class="choice"
        ><input type="radio" name="interval-by" .checked=${f.intervalBy === 'limits'} @change=${() => v.edit({ intervalBy: 'limits' })} />Confidence
        limits</label
      >
      <label class="choice"
        ><input type="radio" name="interval-by" .checked=${f.intervalBy === 'se'} @change=${() => v.edit({ intervalBy: 'se' })} />Standard error</label
      >
      ${f.intervalBy === 'limits'
        ? html`<div class="pair">
            ${v.field('lower', 'Lower limit', f.lower, (t) => ({ lower: t }))} ${v.field('upper', 'Upper limit', f.upper, (t) => ({ upper: t }))}
          </div>`
        : v.field('se', 'Standard error', f.se, (t) => ({ se: t }), ratio ? 'Of the log ratio' : f.measure === 'smd' ? 'Of d' : 'Of the difference, in the outcome’s units')}
      <p class="hint">Optional: without it only the estimate gets an E-value.</p>
    </fieldset>
    ${f.measure === 'or' || f.measure === 'hr' ? prevalenceField(v) : nothing}
    ${f.measure === 'md' ? v.field('sd', 'Standard deviation of the outcome', f.sd, (t) => ({ sd: t }), 'Turns the difference into d') : nothing}
  `;
}

function countFields(v: EValueView): TemplateResult {
  return html`
    <fieldset>
      <legend>Counts of people</legend>
      <table class="counts">
        <thead>
          <tr>
            <td></td>
            <th scope="col">Had the outcome</th>
            <th scope="col">Did not</th>
          </tr>
        </thead>
        <tbody>
          ${(['Exposed', 'Unexposed'] as const).map(
            (row) => html`<tr>
              <th scope="row">${row}</th>
              ${CELLS.filter((c) => c.row === row).map((c) => html`<td>${countInput(v, c.cell, `${c.row}, ${c.column}`)}</td>`)}
            </tr>`,
          )}
        </tbody>
      </table>
      ${CELLS.map((c) => v.errorLine(`counts.${c.cell}`, `count-${c.cell}-error`, `${c.row}, ${c.column}: `))} ${v.errorLine('counts', 'counts-error')}
    </fieldset>
    ${tableMeasureField(v)}
  `;
}

function countInput(v: EValueView, cell: 'a' | 'b' | 'c' | 'd', label: string): TemplateResult {
  const problem = v.problemFor(`counts.${cell}`);
  return html`<label class="visually-hidden" for="count-${cell}">${label} (${cell})</label
    ><input
      id="count-${cell}"
      inputmode="numeric"
      .value=${v.form.counts[cell]}
      aria-invalid=${problem ? 'true' : 'false'}
      aria-describedby="count-${cell}-error counts-error"
      @input=${(e: Event) => v.edit({ counts: { ...v.form.counts, [cell]: (e.target as HTMLInputElement).value } })}
    />`;
}

function fileFields(v: EValueView): TemplateResult {
  const f = v.form;
  const table = v.table;
  const pickColumn = (id: 'exposure' | 'outcome', label: string, value: string, key: 'exposureColumn' | 'outcomeColumn') =>
    columnSelect({
      id: `column-${id}`,
      errorId: `${id}-error`,
      label,
      value,
      columns: table?.columns ?? [],
      problem: v.problemFor(id),
      onChange: (column) => v.edit({ [key]: column, [key === 'exposureColumn' ? 'exposedValues' : 'outcomeValues']: [] }),
    });
  const csv = v.outcome.csv;
  return html`
    ${csvFileInput({
      chosenHint: table ? `${f.fileName}: ${table.rows.length} rows, columns ${table.columns.join(', ')}. It stays in this browser.` : null,
      savedName: f.fileName,
      emptyHint: 'A header row, then one row per person; comma, semicolon or tab separated. It stays in this browser.',
      invalid: Boolean(v.fileProblem || (v.outcome.started && v.problemFor('file'))),
      error: v.fileProblem,
      onFile: (e) => v.onFile(e),
    })}
    ${table
      ? html`<div class="pair">
            ${pickColumn('exposure', 'Exposure column', f.exposureColumn, 'exposureColumn')}
            ${pickColumn('outcome', 'Outcome column', f.outcomeColumn, 'outcomeColumn')}
          </div>
          ${valueChoices(v, 'exposedValues', 'Values that mean exposed', f.exposureColumn)}
          ${valueChoices(v, 'outcomeValues', 'Values that mean the outcome happened', f.outcomeColumn)}
          ${csv
            ? html`<p class="hint" id="counted">
                Counted: a ${csv.counts.a}, b ${csv.counts.b}, c ${csv.counts.c}, d ${csv.counts.d} from ${csv.rowsUsed} rows.
              </p>`
            : nothing}
          ${v.errorLine('counts', 'counts-error')}`
      : nothing}
    ${tableMeasureField(v)}
  `;
}

function valueChoices(v: EValueView, key: 'exposedValues' | 'outcomeValues', legend: string, column: string): TemplateResult | typeof nothing {
  const table = v.table;
  if (!table || !column || !table.columns.includes(column)) return nothing;
  const levels = columnLevels(table, column, key).map((l) => l.value);
  const chosen = v.form[key].length > 0 ? v.form[key] : (guessYesValues(levels) ?? []);
  const problem = v.problemFor(key);
  return html`<fieldset aria-describedby="${key}-error" class=${problem ? 'invalid' : ''}>
    <legend>${legend}</legend>
    <div class="values">
      ${levels.slice(0, 40).map(
        (level) => html`<label class="choice"
          ><input
            type="checkbox"
            .checked=${chosen.includes(level)}
            @change=${(e: Event) => {
              const on = (e.target as HTMLInputElement).checked;
              const next = on ? [...chosen.filter((x) => x !== level), level] : chosen.filter((x) => x !== level);
              v.edit({ [key]: next });
            }}
          />${level}</label
        >`,
      )}
    </div>
    ${levels.length > 40 ? html`<p class="hint">Showing 40 of ${levels.length} values.</p>` : nothing} ${v.errorLine(key, `${key}-error`)}
  </fieldset>`;
}

/** The choice of a risk or odds ratio for a 2×2 table (counts, a file, or a database's counts). */
export function tableMeasureField(v: EValueView): TemplateResult {
  const f = v.form;
  return html`
    <div class="field">
      <label for="design">How the table was sampled</label>
      <select
        id="design"
        aria-describedby="design-hint design-error"
        @change=${(e: Event) => v.edit({ design: (e.target as HTMLSelectElement).value as '' | 'cohort' | 'case-control' })}
      >
        <option value="cohort" ?selected=${f.design === '' || f.design === 'cohort'}>Cohort, trial or cross-section (by exposure)</option>
        <option value="case-control" ?selected=${f.design === 'case-control'}>Case-control (by outcome)</option>
      </select>
      <p class="hint" id="design-hint">A case-control table gives only an odds ratio; a cohort table with a common outcome uses its own risk ratio.</p>
      ${v.errorLine('design', 'design-error')}
    </div>
    <div class="field">
      <label for="table-measure">Ratio to compute</label>
      <select id="table-measure" @change=${(e: Event) => v.edit({ tableMeasure: (e.target as HTMLSelectElement).value as 'rr' | 'or' })}>
        <option value="rr" ?selected=${f.tableMeasure === 'rr'}>Risk ratio (cohort data)</option>
        <option value="or" ?selected=${f.tableMeasure === 'or'}>Odds ratio (case-control data)</option>
      </select>
    </div>
    ${f.tableMeasure === 'or' ? prevalenceField(v) : nothing}
  `;
}

function prevalenceField(v: EValueView): TemplateResult {
  const problem = v.problemFor('outcomePrevalence');
  return html`<div class="field">
    <label for="prevalence">How common is the outcome?</label>
    <select
      id="prevalence"
      aria-invalid=${problem ? 'true' : 'false'}
      aria-describedby="prevalence-hint outcomePrevalence-error"
      @change=${(e: Event) => v.edit({ outcomePrevalence: (e.target as HTMLSelectElement).value as '' | 'rare' | 'common' })}
    >
      <option value="" ?selected=${v.form.outcomePrevalence === ''}>Choose…</option>
      <option value="rare" ?selected=${v.form.outcomePrevalence === 'rare'}>Rare (under about 15%)</option>
      <option value="common" ?selected=${v.form.outcomePrevalence === 'common'}>Common (15% or more)</option>
    </select>
    <div class="hint" id="prevalence-hint">Decides how the ratio is put on the risk-ratio scale; it is never assumed.</div>
    ${v.errorLine('outcomePrevalence', 'outcomePrevalence-error')}
  </div>`;
}

function sharedFields(v: EValueView): TemplateResult {
  const f = v.form;
  const showLevel = f.source !== 'reported' || f.intervalBy === 'se' || f.lower !== '' || f.upper !== '';
  const nullText = f.source === 'reported' && (f.measure === 'smd' || f.measure === 'md') ? '0' : '1';
  return html`<div class="pair">
    ${showLevel ? v.field('level', 'Confidence level (%)', f.level, (t) => ({ level: t }), 'e.g. 95') : nothing}
    ${v.field('target', 'Shift to (optional)', f.target, (t) => ({ target: t }), `Empty: the null, ${nullText}`)}
  </div>`;
}

function confounderFields(v: EValueView): TemplateResult {
  const rows = v.form.confounders;
  return html`<fieldset>
    <legend>Reference confounders</legend>
    <p class="hint">Confounders of known strength to compare with, e.g. a measured covariate: its risk ratio with the exposure and with the outcome.</p>
    ${rows.map(
      (row, i) => html`<div class="confounder">
        ${v.field(`confounders[${i}].name`, 'Confounder name', row.name, (t) => v.confounderEdit(i, { name: t }), '', 'text')}
        ${v.field(`confounders[${i}].rrExposure`, 'RR with exposure', row.rrExposure, (t) => v.confounderEdit(i, { rrExposure: t }))}
        ${v.field(`confounders[${i}].rrOutcome`, 'RR with outcome', row.rrOutcome, (t) => v.confounderEdit(i, { rrOutcome: t }))}
        <button type="button" class="secondary" aria-label="Remove ${row.name || `confounder ${i + 1}`}" @click=${() => v.removeConfounder(i)}>Remove</button>
      </div>`,
    )}
    <button type="button" class="secondary" @click=${() => v.addConfounder()}>Add a reference confounder</button>
  </fieldset>`;
}

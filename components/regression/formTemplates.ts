import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import { ovbSummarySql, type OvbFormInputs } from '../../src/methods/regression/request';
import { columnSelect, csvFileInput } from '../fileFields';
import { queryBox } from '../queryBox';

const categoricalOf = (text: string) => text.split(',').some((s) => s.trim() !== '');

/** The pasted rows of the levels query (the summary query needs the levels of the categorical covariates). */
function levelsBox(v: OvbFormView): TemplateResult {
  const problem = v.problemFor('summaryLevels');
  return html`<div class="field">
    <label for="summaryLevels">Rows of the levels query</label>
    <textarea
      id="summaryLevels"
      spellcheck="false"
      aria-describedby="summaryLevels-hint summaryLevels-error"
      aria-invalid=${problem ? 'true' : 'false'}
      .value=${v.form.summaryLevels ?? ''}
      @input=${(e: Event) => v.edit({ summaryLevels: (e.target as HTMLTextAreaElement).value })}
    ></textarea>
    <div class="hint" id="summaryLevels-hint">As CSV with its header line, or JSON. The summary query then appears above.</div>
    <div class="field-error" id="summaryLevels-error">${problem ? problem.message : ''}</div>
  </div>`;
}

/** What the regression form's templates need from the element: the form, its state and its actions. */
export interface OvbFormView {
  readonly form: OvbFormInputs;
  readonly started: boolean;
  readonly file: File | null;
  readonly columns: readonly string[];
  readonly progress: { fraction: number; rows: number } | null;
  readonly dataNote: string;
  readonly fileProblem: string;
  field(field: string, label: string, value: string, change: (text: string) => Partial<OvbFormInputs>, hint?: string): TemplateResult;
  problemFor(field: string): InputProblem | undefined;
  edit(change: Partial<OvbFormInputs>): void;
  covariateEdit(index: number, change: Partial<OvbFormInputs['covariateTs'][number]>): Partial<OvbFormInputs>;
  addCovariate(): void;
  chooseRole(key: 'outcome' | 'treatment', column: string): void;
  toggleCovariate(column: string, checked: boolean): void;
  refitNeeded(change: Partial<OvbFormInputs>): Partial<OvbFormInputs>;
  onFile(event: Event): void;
  fit(): void;
  cancel(): void;
}

/** The form's fields for reported numbers, a CSV file, or summary statistics, and the settings. */

export function reportedFields(v: OvbFormView): TemplateResult {
  const f = v.form;
  return html`
    <div class="pair">
      ${v.field('estimate', 'Estimate (coefficient)', f.estimate, (t) => ({ estimate: t }), 'Of the treatment, as reported')}
      ${v.field('se', 'Standard error', f.se, (t) => ({ se: t }))}
    </div>
    ${seKindField(v)}
    <fieldset>
      <legend>Residual degrees of freedom</legend>
      <label class="choice"><input type="radio" name="df-by" .checked=${f.dfBy === 'df'} @change=${() => v.edit({ dfBy: 'df' })} />As reported</label>
      <label class="choice"
        ><input type="radio" name="df-by" .checked=${f.dfBy === 'n'} @change=${() => v.edit({ dfBy: 'n' })} />From n and the number of coefficients</label
      >
      ${f.dfBy === 'df'
        ? v.field('df', 'Degrees of freedom', f.df, (t) => ({ df: t }), 'n minus the number of coefficients (intercept included)')
        : html`<div class="pair">
            ${v.field('n', 'Observations n', f.n, (t) => ({ n: t }))}
            ${v.field('parameters', 'Coefficients', f.parameters, (t) => ({ parameters: t }), 'Intercept, treatment and covariates')}
          </div>`}
    </fieldset>
    <fieldset>
      <legend>Covariates to compare with (optional)</legend>
      <p class="hint">
        From the paper’s tables: a covariate’s t in the outcome regression and, if printed, its t in the regression of the treatment on the
        covariates. Bounds need both.
      </p>
      ${f.covariateTs.map(
        (c, i) => html`<div class="covariate">
          ${v.field(`covariateTs[${i}].name`, 'Covariate', c.name, (t) => v.covariateEdit(i, { name: t }))}
          <div class="triple">
          ${v.field(`covariateTs[${i}].outcomeT`, 't (outcome)', c.outcomeT, (t) => v.covariateEdit(i, { outcomeT: t }))}
          ${v.field(`covariateTs[${i}].treatmentT`, 't (treatment)', c.treatmentT, (t) => v.covariateEdit(i, { treatmentT: t }))}
          <div class="field">
            <button type="button" class="secondary small" aria-label="Remove covariate ${i + 1}" @click=${() => v.edit({ covariateTs: f.covariateTs.filter((_, j) => j !== i) })}>
              Remove
            </button>
          </div>
          </div>
        </div>`,
      )}
      <button type="button" class="secondary small" @click=${v.addCovariate}>Add a covariate</button>
    </fieldset>
  `;
}


export function fileFields(v: OvbFormView): TemplateResult {
  const f = v.form;
  const fileError = v.fileProblem || (v.started ? (v.problemFor('file')?.message ?? '') : '');
  const select = (key: 'outcome' | 'treatment', label: string) =>
    columnSelect({ id: `column-${key}`, label, value: f[key], columns: v.columns, problem: v.problemFor(key), onChange: (column) => v.chooseRole(key, column) });
  const candidates = v.columns.filter((c) => c !== f.outcome && c !== f.treatment);
  const covariateProblem = v.problemFor('covariates');
  return html`
    ${csvFileInput({
      chosenHint: v.file ? `${v.file.name}: ${v.columns.length} columns. It is read in this browser, in chunks; nothing is uploaded.` : null,
      savedName: f.fileName,
      emptyHint: 'A header row, then one row per observation. Read in this browser, in chunks; nothing is uploaded.',
      invalid: fileError !== '',
      error: fileError,
      alert: true,
      onFile: (e) => v.onFile(e),
    })}
    ${v.columns.length > 0
      ? html`<div class="pair">${select('outcome', 'Outcome')} ${select('treatment', 'Treatment (exposure)')}</div>
          <fieldset aria-describedby="covariates-error">
            <legend>Covariates</legend>
            <div class="columns">
              ${candidates.map(
                (c) => html`<label class="choice"
                  ><input type="checkbox" .checked=${f.covariates.includes(c)} @change=${(e: Event) => v.toggleCovariate(c, (e.target as HTMLInputElement).checked)} />${c}</label
                >`,
              )}
            </div>
            <div class="field-error" id="covariates-error">${covariateProblem ? covariateProblem.message : ''}</div>
            <p class="hint">Text columns are dummy-coded; rows with a missing value in a chosen column are dropped and counted.</p>
          </fieldset>
          <div class="run">
            <button type="button" id="fit" ?disabled=${!v.file || !f.outcome || !f.treatment || v.progress !== null} @click=${v.fit}>Fit the regression</button>
            ${v.progress ? html`<button type="button" class="secondary" id="cancel" @click=${v.cancel}>Cancel</button>` : nothing}
          </div>
          ${v.progress
            ? html`<label for="progress" class="hint">Reading… ${v.progress.rows.toLocaleString('en')} rows</label>
                <progress id="progress" max="1" .value=${v.progress.fraction}></progress>`
            : nothing}
          ${v.dataNote ? html`<p class="hint" id="data-note">${v.dataNote}</p>` : nothing}
          ${v.field('categorical', 'Numeric columns that are categories', f.categorical, (t) => v.refitNeeded({ categorical: t }), 'e.g. a region code; separated by commas')}
          ${v.field('benchmarks', 'Covariates to compare with', f.benchmarks, (t) => ({ benchmarks: t }), 'Default: each covariate. Names separated by commas; a group as a+b.')}`
      : nothing}
  `;
}


export function summaryFields(v: OvbFormView): TemplateResult {
  const f = v.form;
  const { sql, problem, stage } = ovbSummarySql(f);
  const resultProblem = v.problemFor('summaryResult');
  return html`
    <p class="hint">For data too large or too private to move: run one query in your own database and paste its single result row here.</p>
    ${v.field('summaryTable', 'Table or view', f.summaryTable, (t) => ({ summaryTable: t }), 'e.g. research.visits')}
    <div class="pair">
      ${v.field('outcome', 'Outcome column', f.outcome, (t) => ({ outcome: t }))}
      ${v.field('treatment', 'Treatment column', f.treatment, (t) => ({ treatment: t }))}
    </div>
    ${v.field('summaryColumns', 'Covariate columns', f.summaryColumns, (t) => ({ summaryColumns: t }), 'Separated by commas')}
    ${v.field('categorical', 'Categorical covariates', f.categorical, (t) => ({ categorical: t }), 'Covariates that are categories (e.g. region); the first level in character order is the reference')}
    ${categoricalOf(f.categorical) && stage === 'levels' ? html`<p class="hint">First run this query for the levels of the categorical covariates and paste all its rows below.</p>` : nothing}
    ${sql ? queryBox(sql, undefined) : html`<p class="hint">${problem?.message ? `The query appears here once you fix this: ${problem.message.replace(/\.$/, '')}.` : ''}</p>`}
    ${categoricalOf(f.categorical) ? levelsBox(v) : nothing}
    <div class="field">
      <label for="summaryResult">Its result row</label>
      <textarea
        id="summaryResult"
        aria-describedby="summaryResult-hint summaryResult-error"
        aria-invalid=${resultProblem ? 'true' : 'false'}
        .value=${f.summaryResult}
        @input=${(e: Event) => v.edit({ summaryResult: (e.target as HTMLTextAreaElement).value })}
      ></textarea>
      <div class="hint" id="summaryResult-hint">As CSV (the header line and the one row) or as a JSON object.</div>
      <div class="field-error" id="summaryResult-error">${resultProblem ? resultProblem.message : ''}</div>
    </div>
    ${v.field('benchmarks', 'Covariates to compare with', f.benchmarks, (t) => ({ benchmarks: t }), 'Default: each covariate. A group as a+b.')}
  `;
}


export function settingFields(v: OvbFormView): TemplateResult {
  const f = v.form;
  return html`
    <fieldset>
      <legend>What would change the conclusion</legend>
      <div class="pair">
        ${v.field('q', 'Fraction of the estimate q', f.q, (t) => ({ q: t }), '1: all of it (down to zero)')}
        ${v.field('alpha', 'Significance level α', f.alpha, (t) => ({ alpha: t }))}
      </div>
      <fieldset>
        <legend>The confounder moves the estimate</legend>
        <label class="choice"
          ><input type="radio" name="direction" .checked=${f.direction === 'toward-zero'} @change=${() => v.edit({ direction: 'toward-zero' })} />toward zero (usual)</label
        >
        <label class="choice"
          ><input type="radio" name="direction" .checked=${f.direction === 'away-from-zero'} @change=${() => v.edit({ direction: 'away-from-zero' })} />away from
          zero</label
        >
      </fieldset>
      ${v.field('k', 'Compare with confounders this many times as strong as each covariate', f.k, (t) => ({ k: t }), 'e.g. 1, 2, 3')}
      ${v.field('kOutcome', 'Outcome side, times as strong (one per value above)', f.kOutcome ?? '', (t) => ({ kOutcome: t }), 'Empty: the same on both sides')}
    </fieldset>
    <fieldset>
      <legend>A confounder to try</legend>
      <div class="pair">
        ${v.field('r2dz', 'Partial R² with the treatment', f.r2dz, (t) => ({ r2dz: t }), 'e.g. 5% or 0.05')}
        ${v.field('r2yz', 'Partial R² with the outcome', f.r2yz, (t) => ({ r2yz: t }))}
      </div>
      ${v.field('plotMax', 'Plots up to (partial R²)', f.plotMax, (t) => ({ plotMax: t }), 'Empty: chosen from the results')}
    </fieldset>
  `;
}

/** How the reported standard error was computed: the bias formula assumes the classical one. */
function seKindField(v: OvbFormView): TemplateResult {
  const kind = v.form.seKind ?? '';
  const problem = v.problemFor('seKind');
  return html`<div class="field">
    <label for="se-kind">How the SE was computed</label>
    <select
      id="se-kind"
      aria-describedby="se-kind-hint"
      aria-invalid=${problem ? 'true' : 'false'}
      @change=${(e: Event) => v.edit({ seKind: (e.target as HTMLSelectElement).value })}
    >
      <option value="" ?selected=${kind === '' || kind === 'classical'}>Classical (OLS)</option>
      <option value="robust" ?selected=${kind === 'robust'}>Robust (heteroskedasticity-consistent)</option>
      <option value="clustered" ?selected=${kind === 'clustered'}>Clustered</option>
      <option value="unknown" ?selected=${kind === 'unknown'}>Not known</option>
    </select>
    <p class="hint" id="se-kind-hint">
      The bias formula assumes a classical standard error; with any other kind the adjusted estimates hold but the adjusted standard errors and
      t-values do not.
    </p>
  </div>`;
}

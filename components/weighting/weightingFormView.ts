import { html, nothing, type TemplateResult } from 'lit';
import { columnList, type WeightingFormInputs } from '../../src/methods/weighting/request';
import { chosenFileInput, columnSelect, type FileFormView } from '../fileFields';

/** What the weighting form needs from its element: the form, the file's columns, problems and the edit hooks. */
export type WeightingFormView = FileFormView<WeightingFormInputs>;

/** The weighting form: the file, its columns, and the analysis settings. */
export function weightingFormTemplate(v: WeightingFormView): TemplateResult {
  return html`<form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="Weighting inputs">
    ${fileField(v)} ${v.columns.length > 0 ? columnFields(v) : nothing} ${settingsFields(v)}
  </form>`;
}

function fileField(v: WeightingFormView): TemplateResult {
  return chosenFileInput(v, 'A header row, then one row per person: a 0/1 treatment, a numeric outcome and covariates. It stays in this browser.', 'count');
}

function weightingColumnSelect(v: WeightingFormView, key: 'treatment' | 'outcome', label: string): TemplateResult {
  return columnSelect({ id: `column-${key}`, label, value: v.form[key], columns: v.columns, problem: v.problemFor(key), onChange: (column) => v.edit({ [key]: column }) });
}

function columnFields(v: WeightingFormView): TemplateResult {
  const f = v.form;
  const others = v.columns.filter((c) => c !== f.treatment && c !== f.outcome);
  const chosen = columnList(f.covariates);
  const all = chosen.length === 0;
  const toggle = (column: string, on: boolean) => {
    const current = all ? others : chosen.filter((c) => others.includes(c));
    const next = on ? [...current, column] : current.filter((c) => c !== column);
    v.edit({ covariates: next.length === others.length ? '' : next.join(', ') });
  };
  const problem = v.problemFor('covariates');
  return html`
    ${weightingColumnSelect(v, 'treatment', 'Treatment column (0 = control, 1 = treated)')} ${weightingColumnSelect(v, 'outcome', 'Outcome column (numbers)')}
    <fieldset aria-describedby="covariates-hint covariates-error">
      <legend>Covariates of the propensity model</legend>
      <div class="hint" id="covariates-hint">Text columns are dummy-coded. All ticked = every other column.</div>
      <div class="checks">
        ${others.map(
          (c, i) =>
            html`<label class="choice"><input type="checkbox" id="covariate-${i}" .checked=${all || chosen.includes(c)} @change=${(e: Event) => toggle(c, (e.target as HTMLInputElement).checked)} />${c}</label>`,
        )}
      </div>
      <div class="field-error" id="covariates-error">${problem ? problem.message : ''}</div>
    </fieldset>
    ${v.field('categorical', 'Numeric columns to treat as categories', f.categorical, (t) => ({ categorical: t }), 'Column names separated by commas, e.g. a site code.', 'text')}
  `;
}

function settingsFields(v: WeightingFormView): TemplateResult {
  const f = v.form;
  const estimandProblem = v.problemFor('estimand');
  return html`<fieldset>
    <legend>Analysis</legend>
    <div class="field">
      <label for="estimand">Estimand</label>
      <select id="estimand" aria-describedby="estimand-error" @change=${(e: Event) => v.edit({ estimand: (e.target as HTMLSelectElement).value })}>
        <option value="ate" ?selected=${f.estimand.trim().toLowerCase() !== 'att'}>Average effect in everyone (ATE)</option>
        <option value="att" ?selected=${f.estimand.trim().toLowerCase() === 'att'}>Average effect in the treated (ATT)</option>
      </select>
      <div class="field-error" id="estimand-error">${estimandProblem ? estimandProblem.message : ''}</div>
    </div>
    ${v.field('lambdas', 'Λ values', f.lambdas, (t) => ({ lambdas: t }), 'Each 1 or more, separated by commas; empty for 1, 1.25, 1.5, 2, 3.', 'text')}
    ${v.field('bootstrap', 'Bootstrap resamples', f.bootstrap, (t) => ({ bootstrap: t }), '0 for the bounds only; 1000 is usual.', 'numeric')}
    ${v.field('seed', 'Seed', f.seed, (t) => ({ seed: t }), 'The same seed gives the same interval.', 'numeric')}
    ${v.field('alpha', 'α (1 − coverage of the interval)', f.alpha, (t) => ({ alpha: t }), 'e.g. 0.05 for a 95% interval.')}
    ${v.field('trimBelow', 'Trim below propensity', f.trimBelow, (t) => ({ trimBelow: t }), 'Optional: leave out people with a lower estimated propensity (e.g. 0.05).')}
    ${v.field('trimAbove', 'Trim above propensity', f.trimAbove, (t) => ({ trimAbove: t }), 'Optional, with the one above (e.g. 0.95).')}
  </fieldset>`;
}

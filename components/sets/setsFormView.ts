import { html, type TemplateResult } from 'lit';
import type { SetsFormInputs } from '../../src/methods/sets/request';
import { chosenFileInput, columnSelect, columnsFieldset, type FileFormView } from '../fileFields';

/** What the matched-sets form needs from its element: the form, the file's columns, problems and the edit hooks. */
export type SetsFormView = FileFormView<SetsFormInputs>;

/** The matched-sets form: the file and its three columns, then the analysis settings. */
export function setsFormTemplate(v: SetsFormView): TemplateResult {
  return html`<form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="Matched-sets inputs">${fileFields(v)} ${analysisFields(v)}</form>`;
}

type ColumnKey = 'setColumn' | 'treatedColumn' | 'outcomeColumn';

function setsColumnSelect(v: SetsFormView, key: ColumnKey, label: string): TemplateResult {
  return columnSelect({ id: key, label, value: v.form[key], columns: v.columns, problem: v.problemFor(key), onChange: (column) => v.edit({ [key]: column }) });
}

function fileFields(v: SetsFormView): TemplateResult {
  const f = v.form;
  return html`
    ${chosenFileInput(v, 'A header row, then one row per unit: its matched set, 1 if treated or 0 if a control, and the outcome. Each set has one treated unit and one or more controls. It stays in this browser.', 'names')}
    ${columnsFieldset(
      v.columns,
      html`
        ${setsColumnSelect(v, 'setColumn', 'Matched set')} ${setsColumnSelect(v, 'treatedColumn', 'Treated (1) or control (0)')}
        ${setsColumnSelect(v, 'outcomeColumn', 'Outcome')}
        <p class="hint">An empty outcome (or NA) is missing: that row is left out and counted.</p>
      `,
    )}
  `;
}

function analysisFields(v: SetsFormView): TemplateResult {
  const f = v.form;
  const choose = (key: 'alternative' | 'outcomeKind' | 'tail') => (e: Event) => v.edit({ [key]: (e.target as HTMLSelectElement).value });
  const option = (value: string, label: string, current: string) => html`<option value=${value} ?selected=${current === value}>${label}</option>`;
  return html`<fieldset>
    <legend>Analysis</legend>
    <div class="field">
      <label for="alternative">The finding</label>
      <select id="alternative" @change=${choose('alternative')}>
        ${option('greater', 'Treatment raises the outcome', f.alternative)} ${option('less', 'Treatment lowers the outcome', f.alternative)}
      </select>
    </div>
    <div class="pair">
      <div class="field">
        <label for="outcomeKind">Kind of outcome</label>
        <select id="outcomeKind" @change=${choose('outcomeKind')}>
          ${option('auto', 'Automatic (0/1 is binary)', f.outcomeKind)} ${option('continuous', 'Continuous', f.outcomeKind)}
          ${option('binary', 'Binary (0 or 1)', f.outcomeKind)}
        </select>
        <div class="field-error" id="outcomeKind-error">${v.problemFor('outcomeKind')?.message ?? ''}</div>
      </div>
      <div class="field">
        <label for="tail">Tail probabilities (binary outcome)</label>
        <select id="tail" @change=${choose('tail')}>
          ${option('', 'Automatic (exact)', f.tail)} ${option('exact', 'Exact', f.tail)} ${option('normal', 'Normal approximation', f.tail)}
        </select>
      </div>
    </div>
    <div class="pair">
      ${v.field('alpha', 'Significance level α', f.alpha, (t) => ({ alpha: t }), 'One-sided, e.g. 0.05')}
      ${v.field('trim', 'Trimming c of Huber’s ψ', f.trim, (t) => ({ trim: t }), 'In units of σ, e.g. 2.5 (continuous outcome)')}
    </div>
    ${v.field('gammas', 'Γ values to tabulate', f.gammas, (t) => ({ gammas: t }), 'e.g. 1, 1.5, 2, 3; empty: from 1 to just past the tipping point')}
  </fieldset>`;
}

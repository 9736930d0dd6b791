import { html, nothing, type TemplateResult } from 'lit';
import type { PairsFormInputs, PairsSource } from '../../src/methods/pairs/request';
import { chosenFileInput, columnSelect, columnsFieldset, type FileFormView } from '../fileFields';
import { sourceChoice } from '../sourceChoice';
import { pairsSummaryFields } from './pairsSummaryFields';

/** What the matched-pairs form needs from its element: the form, the file's columns, problems and the edit hooks. */
export type PairsFormView = FileFormView<PairsFormInputs>;

const SOURCES: ReadonlyArray<{ id: PairsSource; label: string }> = [
  { id: 'file', label: 'A CSV file of pairs' },
  { id: 'pasted', label: 'Numbers pasted in' },
  { id: 'discordant', label: 'Discordant counts (binary outcome)' },
  { id: 'summary', label: 'Summary statistics from your database' },
];

/** The matched-pairs form: the source of the pairs, its fields, and the analysis settings. */
export function pairsFormTemplate(v: PairsFormView): TemplateResult {
  const source = v.form.source;
  return html`<form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="Matched-pairs inputs">
    ${sourceChoice('The pairs', SOURCES, source, (s) => v.edit({ source: s }))}
    ${source === 'file' ? fileFields(v) : source === 'pasted' ? pastedFields(v) : source === 'summary' ? pairsSummaryFields(v) : discordantFields(v)}
    ${analysisFields(v)}
  </form>`;
}

function pairsColumnSelect(v: PairsFormView, id: string, label: string, value: string, key: 'treatedColumn' | 'controlColumn' | 'differenceColumn', field: string): TemplateResult {
  return columnSelect({ id: `column-${id}`, label, value, columns: v.columns, problem: v.problemFor(field), onChange: (column) => v.edit({ [key]: column }) });
}

function fileFields(v: PairsFormView): TemplateResult {
  const f = v.form;
  return html`
    ${chosenFileInput(v, 'A header row, then one row per pair: the treated and the control outcome, or their difference. It stays in this browser.', 'names')}
    ${columnsFieldset(
      v.columns,
      html`
        <label class="choice"
          ><input type="radio" name="columns-by" .checked=${f.columnsBy === 'outcomes'} @change=${() => v.edit({ columnsBy: 'outcomes' })} />Treated and control outcomes</label
        >
        <label class="choice"
          ><input type="radio" name="columns-by" .checked=${f.columnsBy === 'difference'} @change=${() => v.edit({ columnsBy: 'difference' })} />One column of differences</label
        >
        ${f.columnsBy === 'outcomes'
          ? html`<div class="pair">
              ${pairsColumnSelect(v, 'treated', 'Treated outcome', f.treatedColumn, 'treatedColumn', 'treated')}
              ${pairsColumnSelect(v, 'control', 'Control outcome', f.controlColumn, 'controlColumn', 'control')}
            </div>`
          : pairsColumnSelect(v, 'difference', 'Difference (treated − control)', f.differenceColumn, 'differenceColumn', 'difference')}
        <p class="hint">Two columns holding only 0 and 1 are read as a binary outcome (discordant pairs).</p>
      `,
    )}
  `;
}

function pastedFields(v: PairsFormView): TemplateResult {
  const problem = v.problemFor('pasted');
  return html`<div class="field">
    <label for="pasted">Pairs</label>
    <textarea
      id="pasted"
      spellcheck="false"
      .value=${v.form.pasted}
      aria-invalid=${problem ? 'true' : 'false'}
      aria-describedby="pasted-hint pasted-error"
      @input=${(e: Event) => v.edit({ pasted: (e.target as HTMLTextAreaElement).value })}
    ></textarea>
    <div class="hint" id="pasted-hint">
      One line per pair: the difference (treated − control), or the treated and the control outcome separated by a tab, space,
      semicolon or comma. NA marks a missing value.
    </div>
    <div class="field-error" id="pasted-error">${problem ? problem.message : ''}</div>
  </div>`;
}

function discordantFields(v: PairsFormView): TemplateResult {
  return html`<fieldset>
    <legend>Pairs where exactly one unit had the event</legend>
    <div class="pair">
      ${v.field('treatedOnly', 'Only the treated unit', v.form.treatedOnly, (t) => ({ treatedOnly: t }), '', 'numeric')}
      ${v.field('controlOnly', 'Only the control unit', v.form.controlOnly, (t) => ({ controlOnly: t }), '', 'numeric')}
    </div>
    <p class="hint">Pairs where both or neither had the event carry no information about the effect (McNemar).</p>
  </fieldset>`;
}

function analysisFields(v: PairsFormView): TemplateResult {
  const f = v.form;
  const choose = (key: 'test' | 'alternative' | 'method' | 'zeros') => (e: Event) => v.edit({ [key]: (e.target as HTMLSelectElement).value });
  return html`<fieldset>
    <legend>Analysis</legend>
    <div class="field">
      <label for="test">Test</label>
      <select id="test" @change=${choose('test')}>
        <option value="signrank" ?selected=${f.test === 'signrank'}>Wilcoxon signed-rank</option>
        <option value="sign" ?selected=${f.test === 'sign'}>Sign test</option>
      </select>
    </div>
    <div class="field">
      <label for="alternative">The finding</label>
      <select id="alternative" @change=${choose('alternative')}>
        <option value="greater" ?selected=${f.alternative === 'greater'}>Treatment raises the outcome</option>
        <option value="less" ?selected=${f.alternative === 'less'}>Treatment lowers the outcome</option>
      </select>
    </div>
    <div class="pair">
      ${v.field('alpha', 'Significance level α', f.alpha, (t) => ({ alpha: t }), 'One-sided, e.g. 0.05')}
      <div class="field">
        <label for="method">Tail probabilities</label>
        <select id="method" @change=${choose('method')}>
          <option value="auto" ?selected=${f.method === 'auto'}>Automatic</option>
          <option value="exact" ?selected=${f.method === 'exact'}>Exact</option>
          <option value="normal" ?selected=${f.method === 'normal'}>Normal approximation</option>
        </select>
      </div>
    </div>
    ${f.test === 'signrank'
      ? html`<div class="field">
          <label for="zeros">Pairs with a zero difference</label>
          <select id="zeros" @change=${choose('zeros')}>
            <option value="wilcoxon" ?selected=${(f.zeros || 'wilcoxon') === 'wilcoxon'}>Left out of the test (Wilcoxon)</option>
            <option value="pratt" ?selected=${f.zeros === 'pratt'}>Ranked, scored 0 (Pratt)</option>
          </select>
        </div>`
      : nothing}
    ${v.field('gammas', 'Γ values to tabulate', f.gammas, (t) => ({ gammas: t }), 'e.g. 1, 1.5, 2, 3; empty: from 1 to just past the tipping point')}
  </fieldset>`;
}

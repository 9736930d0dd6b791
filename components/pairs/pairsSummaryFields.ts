import { html, type TemplateResult } from 'lit';
import { pairsQueryOfForm } from '../../src/methods/pairs/pairsFromSummary';
import { queryBox, resultBox } from '../queryBox';
import type { PairsFormView } from './pairsFormView';

/** Summary statistics from the user's database: the table and columns → the query (copy) → the pasted result. */
export function pairsSummaryFields(v: PairsFormView): TemplateResult {
  const f = v.form;
  const { sql, problems } = pairsQueryOfForm({ ...f, summaryTable: f.summaryTable ?? '' });
  const column = (key: 'treatedColumn' | 'controlColumn' | 'differenceColumn', label: string) => v.field(key, label, f[key], (t) => ({ [key]: t }));
  return html`
    <p class="hint">
      For pairs too many or too private to move: run one query in your own database and paste its single result row here. The bounds use
      the normal approximation; the Hodges–Lehmann estimate needs the differences themselves.
    </p>
    ${v.field('summaryTable', 'Table or view', f.summaryTable ?? '', (t) => ({ summaryTable: t }), 'e.g. research.pairs')}
    <fieldset>
      <legend>Columns</legend>
      <label class="choice"
        ><input type="radio" name="summary-columns-by" .checked=${f.columnsBy === 'outcomes'} @change=${() => v.edit({ columnsBy: 'outcomes' })} />Treated and control outcomes</label
      >
      <label class="choice"
        ><input type="radio" name="summary-columns-by" .checked=${f.columnsBy === 'difference'} @change=${() => v.edit({ columnsBy: 'difference' })} />One column of differences</label
      >
      ${f.columnsBy === 'outcomes'
        ? html`<div class="pair">${column('treatedColumn', 'Treated outcome')} ${column('controlColumn', 'Control outcome')}</div>`
        : column('differenceColumn', 'Difference (treated − control)')}
    </fieldset>
    ${queryBox(sql, problems[0])}
    ${resultBox(f.summaryResult ?? '', v.problemFor('summaryResult'), (t) => v.edit({ summaryResult: t }), 'As CSV (the header line and the one row) or as a JSON object.')}
  `;
}

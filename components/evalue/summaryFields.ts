import { html, type TemplateResult } from 'lit';
import { eValueSummaryQuery } from '../../src/methods/evalue/summaryQuery';
import { queryBox, resultBox } from '../queryBox';
import type { EValueView } from './view';
import { tableMeasureField } from './formFields';

/** Summary statistics from the user's database: the table and columns → the counting query (copy) → its pasted result. */
export function eValueSummaryFields(v: EValueView): TemplateResult {
  const f = v.form;
  const { sql, problems } = eValueSummaryQuery(f);
  const list = (text: string) => text.split(',').map((s) => s.trim()).filter((s) => s !== '');
  return html`
    <p class="hint">For data too large or too private to move: run one query in your own database and paste its single result row here.</p>
    ${v.field('summaryTable', 'Table or view', f.summaryTable ?? '', (t) => ({ summaryTable: t }), 'e.g. research.cohort')}
    <div class="pair">
      ${v.field('exposure', 'Exposure column', f.exposureColumn, (t) => ({ exposureColumn: t }))}
      ${v.field('outcome', 'Outcome column', f.outcomeColumn, (t) => ({ outcomeColumn: t }))}
    </div>
    <div class="pair">
      ${v.field('exposedValues', 'Values meaning exposed', f.exposedValues.join(', '), (t) => ({ exposedValues: list(t) }), 'Empty: 1, yes, true or y')}
      ${v.field('outcomeValues', 'Values meaning the outcome', f.outcomeValues.join(', '), (t) => ({ outcomeValues: list(t) }), 'Empty: 1, yes, true or y')}
    </div>
    ${queryBox(sql, problems[0])}
    ${resultBox(f.summaryResult ?? '', v.problemFor('summaryResult'), (t) => v.edit({ summaryResult: t }), 'As CSV (the header line and the one row) or as a JSON object.')}
    ${tableMeasureField(v)}
  `;
}

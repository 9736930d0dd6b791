import { LitElement, css, html, nothing } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { InputError } from '../src/methods/problems';
import { appraiseBatchCsv, BATCH_COLUMNS, BATCH_RV_RULE, type BatchResult, type BatchRow } from '../src/workspace/batchFindings';
import { batchCsvText } from '../src/workspace/batchCsv';
import { formatNumber, formatPercent } from '../src/format/formatNumber';
import { parseTypedNumber } from '../src/data/numberText';
import { downloadBlob } from '../src/plot/figureExport.browser';
import { eValueHistogram } from '../src/workspace/batchHistogram';
import type { PlotSpec } from '../src/plot/plotSpec';
import { baseStyles } from './styles/base';
import './lurk-plot';

type SortKey = 'row' | 'label' | 'measure' | 'estimate' | 'eValueEstimate' | 'eValueInterval' | 'rv' | 'rvAlpha';

const COLUMNS: ReadonlyArray<{ key: SortKey; label: string; numeric: boolean }> = [
  { key: 'row', label: 'Row', numeric: true },
  { key: 'label', label: 'Finding', numeric: false },
  { key: 'measure', label: 'Measure', numeric: false },
  { key: 'estimate', label: 'Estimate', numeric: true },
  { key: 'eValueEstimate', label: 'E-value', numeric: true },
  { key: 'eValueInterval', label: 'E-value (CI)', numeric: true },
  { key: 'rv', label: 'RV', numeric: true },
  { key: 'rvAlpha', label: 'RV at α', numeric: true },
];

/** Measures whose row opens in a calculator (the E-value's, or a regression coefficient). */
const OPENABLE = new Set(['rr', 'or', 'hr', 'smd', 'md', 'coef']);

/** A fictional example so that the table can be tried at once. */
export const EXAMPLE_BATCH = `label,measure,estimate,lower,upper,se,df,outcome_prevalence
Fictional cohort A: commuting and sleep,rr,1.45,1.12,1.88,,,
Fictional cohort B: tea and migraine,or,0.82,0.70,0.96,,,rare
Fictional registry C: shift work and injury,hr,1.9,1.3,2.8,,,common
Fictional survey D: green space and mood,smd,0.21,0.05,0.37,,,
Fictional panel E: wage and hours (coefficient),coef,0.34,,,0.11,512,
Fictional cohort F: screen time and myopia,rr,2.6,1.7,4.0,,,
Fictional cohort G: coffee and tremor,rr,1.08,0.91,1.28,,,
`;

/**
 * @summary Batch appraisal: a CSV of many reported findings → a sortable table of E-values and robustness values,
 * a histogram of E-values, and a spreadsheet-safe CSV download.
 *
 * @property text - the CSV text (pasted or read from a file).
 * @property alpha - the significance level for RV at α, as typed.
 * @fires lurk-batch-change - {text, alpha} after the user changes the data or α.
 * @fires lurk-batch-open - {row} when the user opens a row (1-based, as numbered) in its calculator as a finding.
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
@customElement('lurk-batch')
export class LurkBatch extends LitElement {
  static override styles = [
    baseStyles,
    css`
      textarea {
        font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace;
        font-size: 0.85rem;
        min-height: 8rem;
      }
      .row-tools {
        display: flex;
        flex-wrap: wrap;
        gap: 0.5rem;
        align-items: end;
        margin: 0.5rem 0;
      }
      th button {
        background: none;
        border: none;
        color: inherit;
        font-weight: 700;
        padding: 0.1rem 0.2rem;
        min-height: 0;
      }
      th.text,
      td.text {
        text-align: left;
      }
      td.problem {
        text-align: left;
        color: var(--_error);
        font-size: 0.85rem;
      }
      .alpha {
        max-width: 8rem;
      }
      button.open {
        padding: 0.15rem 0.5rem;
        min-height: 1.9rem;
        font-size: 0.85rem;
      }
    `,
  ];

  @property() text = '';
  @property() alpha = '0.05';

  @state() private sortKey: SortKey = 'row';
  @state() private descending = false;
  @state() private fileProblem = '';

  private result: BatchResult | null = null;
  private problem = '';
  private alphaProblem = '';
  private spec: PlotSpec | null = null;

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('text') || changed.has('alpha')) this.evaluate();
  }

  private evaluate(): void {
    this.problem = '';
    this.alphaProblem = '';
    this.result = null;
    this.spec = null;
    const alpha = parseTypedNumber(this.alpha);
    if (!(alpha > 0 && alpha < 1)) {
      this.alphaProblem = `α must be a number between 0 and 1, got "${this.alpha}"`;
      return;
    }
    if (this.text.trim() === '') return;
    try {
      this.result = appraiseBatchCsv(this.text, alpha);
      this.spec = eValueHistogram(this.result.rows.map((r) => r.eValueEstimate));
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      this.problem = error.problems.map((p) => p.message).join('; ');
    }
  }

  override render() {
    return html`
      <p class="hint">
        One reported finding per row. Columns: ${BATCH_COLUMNS.join(', ')}. <code>measure</code> is rr, or, hr, smd, md or coef (a
        linear-regression coefficient); give <code>lower</code> and <code>upper</code> or <code>se</code>; odds and hazard ratios need
        <code>outcome_prevalence</code> (rare or common). ${BATCH_RV_RULE} A <code>coef</code> row needs <code>se</code> and <code>df</code>.
      </p>
      <div class="row-tools">
        <div class="field">
          <label for="batch-file">CSV file of findings</label>
          <input id="batch-file" type="file" accept=".csv,.tsv,.txt,text/csv" aria-describedby="batch-file-problem" @change=${this.onFile} />
          <div id="batch-file-problem" class="field-error" role="alert">${this.fileProblem}</div>
        </div>
        <div class="field alpha">
          <label for="batch-alpha">α for RV</label>
          <input
            id="batch-alpha"
            type="text"
            inputmode="decimal"
            .value=${this.alpha}
            aria-invalid=${this.alphaProblem ? 'true' : 'false'}
            aria-describedby="batch-alpha-problem"
            @input=${(e: Event) => this.change(this.text, (e.target as HTMLInputElement).value)}
          />
          <div id="batch-alpha-problem" class="field-error">${this.alphaProblem}</div>
        </div>
        <button class="secondary" type="button" @click=${() => this.change(EXAMPLE_BATCH, this.alpha)}>Load a fictional example</button>
      </div>
      <div class="field">
        <label for="batch-text">Or paste the CSV here</label>
        <textarea
          id="batch-text"
          .value=${this.text}
          spellcheck="false"
          aria-invalid=${this.problem ? 'true' : 'false'}
          aria-describedby="batch-text-problem"
          @input=${(e: Event) => this.change((e.target as HTMLTextAreaElement).value, this.alpha)}
        ></textarea>
        <div id="batch-text-problem" class="field-error" role="alert">${this.problem}</div>
      </div>
      ${this.result ? this.renderResult(this.result) : nothing}
    `;
  }

  private renderResult(result: BatchResult) {
    const rows = this.sorted(result.rows);
    return html`
      <p role="status">
        ${result.computed} of ${result.rows.length} findings have an E-value${result.withProblems ? html`; ${result.withProblems} have a problem (shown in its row)` : nothing}.
      </p>
      ${result.warnings.map((w) => html`<p class="warning">${w}</p>`)}
      <div class="row-tools">
        <button type="button" @click=${() => this.download(result)}>Download results as CSV</button>
      </div>
      <div class="table-scroll" tabindex="0" role="region" aria-label="Results table (scrolls sideways)">
        <table>
          <caption class="visually-hidden">E-values of each finding, and robustness values of coef rows only; choose a column heading to sort</caption>
          <thead>
            <tr>
              ${COLUMNS.map(
                (c) => html`<th scope="col" class=${c.numeric ? '' : 'text'} aria-sort=${this.sortKey === c.key ? (this.descending ? 'descending' : 'ascending') : 'none'}>
                  <button type="button" @click=${() => this.sortBy(c.key)}>${c.label}${this.sortKey === c.key ? (this.descending ? ' ▼' : ' ▲') : ''}</button>
                </th>`,
              )}
              <th scope="col">Problem</th>
              <th scope="col">Calculator</th>
            </tr>
          </thead>
          <tbody>
            ${rows.map(
              (r) => html`<tr>
                <td>${r.row}</td>
                <td class="text">${r.label}</td>
                <td class="text">${r.measure}</td>
                <td>${formatNumber(r.estimate, { missing: '—' })}</td>
                <td>${formatNumber(r.eValueEstimate, { digits: 2, missing: '—' })}</td>
                <td>${formatNumber(r.eValueInterval, { digits: 2, missing: '—' })}</td>
                <td>${formatPercent(r.rv, 1, '—')}</td>
                <td>${formatPercent(r.rvAlpha, 1, '—')}</td>
                <td class="problem">${r.problem}</td>
                <td>
                  ${OPENABLE.has(r.measure)
                    ? html`<button class="secondary open" type="button" aria-label="Open row ${r.row} (${r.label}) in its calculator" @click=${() => this.fire('lurk-batch-open', { row: r.row })}>Open</button>`
                    : nothing}
                </td>
              </tr>`,
            )}
          </tbody>
        </table>
      </div>
      <lurk-plot .spec=${this.spec}></lurk-plot>
    `;
  }

  private sorted(rows: readonly BatchRow[]): BatchRow[] {
    const key = this.sortKey;
    const numeric = COLUMNS.find((c) => c.key === key)?.numeric ?? false;
    const sign = this.descending ? -1 : 1;
    return [...rows].sort((a, b) => {
      const x = a[key];
      const y = b[key];
      // Missing values sort last whichever the direction.
      if (x === null && y === null) return a.row - b.row;
      if (x === null) return 1;
      if (y === null) return -1;
      const order = numeric ? (x as number) - (y as number) : String(x).localeCompare(String(y), 'en', { numeric: true });
      return order === 0 ? a.row - b.row : sign * order;
    });
  }

  private sortBy(key: SortKey): void {
    if (this.sortKey === key) this.descending = !this.descending;
    else {
      this.sortKey = key;
      this.descending = key !== 'row' && key !== 'label' && key !== 'measure';
    }
  }

  private change(text: string, alpha: string): void {
    this.text = text;
    this.alpha = alpha;
    this.fire('lurk-batch-change', { text, alpha });
  }

  private fire(name: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(name, { detail, bubbles: true, composed: true }));
  }

  private async onFile(event: Event): Promise<void> {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    try {
      this.fileProblem = '';
      this.change(await file.text(), this.alpha);
    } catch {
      this.fileProblem = `"${file.name}" could not be read as text`;
    }
  }

  private download(result: BatchResult): void {
    downloadBlob(new Blob([batchCsvText(result)], { type: 'text/csv' }), 'lurk-batch-results.csv');
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-batch': LurkBatch;
  }
  interface GlobalEventHandlersEventMap {
    'lurk-batch-change': CustomEvent<{ text: string; alpha: string }>;
    'lurk-batch-open': CustomEvent<{ row: number }>;
  }
}

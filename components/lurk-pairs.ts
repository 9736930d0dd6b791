import { LitElement, html, nothing } from 'lit';
import type { TemplateResult } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { InputError, type InputProblem } from '../src/core/inputProblem';
import { analysePairs, type PairsInput, type PairsResult } from '../src/core/pairsAnalysis';
import { pairsSummary, type PairsSummary } from '../src/workspace/calculatorSummaries';
import { CsvChunkReader } from '../src/data/csvChunkReader';
import { pairsFromCsvText, type PairsRead } from '../src/methods/pairs/pairsFromCsv';
import {
  emptyPairsForm,
  guessPairsColumns,
  normalisePairsForm,
  pairsColumnsOf,
  pairsInputFromForm,
  readPairsOptions,
  type PairsFormInputs,
  type PairsSource,
} from '../src/methods/pairs/request';
import { PAIRS_CAUTION, formatAsTyped, formatEffect, formatGamma, pPhrase, pairsReading, pairsTable } from '../src/methods/pairs/text';
import type { PairsReadSummary } from '../src/methods/pairs/pairsWorkerProtocol';
import { runPairsInWorker, type PairsWorkerProgress } from '../src/methods/pairs/pairsWorkerClient';
import { emptyStudy, type StudyLabels } from '../src/format/studyLabels';
import { shownProblems } from '../src/format/shownProblems';
import { amplificationPlot } from '../src/methods/pairs/amplificationPlot';
import { estimateRangePlot } from '../src/methods/pairs/estimateRangePlot';
import { pValueByGammaPlot } from '../src/methods/pairs/pValueByGammaPlot';
import type { PlotSpec } from '../src/plot/plotSpec';
import { baseStyles } from './styles/base';
import { calculatorLayoutStyles } from './styles/calculator';
import { pairsStyles } from './styles/pairs';
import './lurk-plot';
import { sourceChoice } from './sourceChoice';
import { textField } from './textField';

/** Detail of `lurk-result`: the new result, or null with the problems that prevent one. */
export interface PairsResultDetail {
  readonly result: PairsResult | null;
  readonly problems: readonly InputProblem[];
}

/** Files larger than this are read in a Web Worker (with progress and cancel). */
const WORKER_FILE_BYTES = 1 << 20;
/** Analyses with more pairs than this run in a Web Worker (the exact tails take a while). */
const WORKER_PAIRS = 300;

const SOURCES: ReadonlyArray<{ id: PairsSource; label: string }> = [
  { id: 'file', label: 'A CSV file of pairs' },
  { id: 'pasted', label: 'Numbers pasted in' },
  { id: 'discordant', label: 'Discordant counts (binary outcome)' },
];

/**
 * @summary The matched-pairs calculator: Rosenbaum bounds for the signed-rank or sign test, the tipping Γ,
 * the Hodges–Lehmann estimate range and sensitivity interval under each Γ, and amplification — from a CSV of
 * pairs, pasted numbers or discordant counts. Large files and analyses run in a Web Worker with a progress bar.
 *
 * @property inputs - the form as typed (PairsFormInputs: text, never parsed numbers); partial or older objects are
 *   completed. A file's rows are never part of it, only its name and the column choices.
 * @property study - the finding's labels (exposure, outcome, units) used in the text and the plots.
 * @fires lurk-inputs-change - {inputs} after every edit by the user.
 * @fires lurk-result - {result, problems} when a user's edit gives a new result (result null while there are problems).
 * @csspart results - the results column.
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
@customElement('lurk-pairs')
export class LurkPairs extends LitElement {
  static override styles = [baseStyles, calculatorLayoutStyles, pairsStyles];

  @property({ attribute: false }) inputs: PairsFormInputs | Record<string, unknown> | null = null;
  @property({ attribute: false }) study: StudyLabels = emptyStudy;

  @state() private form: PairsFormInputs = emptyPairsForm();
  @state() private columns: readonly string[] = [];
  @state() private fileProblem = '';
  @state() private result: PairsResult | null = null;
  @state() private read: PairsReadSummary | null = null;
  @state() private problems: readonly InputProblem[] = [];
  @state() private progress: PairsWorkerProgress | null = null;
  @state() private started = false;

  private file: File | null = null;
  private fileText: string | null = null;
  private abort: AbortController | null = null;
  private computedFor: unknown = undefined;
  private plottedFor: PairsResult | null | undefined = undefined;
  private specs: { pValue: PlotSpec | null; estimate: PlotSpec | null; amplification: PlotSpec | null } = { pValue: null, estimate: null, amplification: null };

  /** Headline numbers of the current result, for the workspace (null while there is none). */
  get summary(): PairsSummary | null {
    return this.result ? pairsSummary(this.result) : null;
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('inputs') && this.inputs !== this.form) {
      this.form = normalisePairsForm(this.inputs);
    }
    if (this.computedFor !== this.form) void this.compute(false);
    if (this.plottedFor !== this.result || changed.has('study')) this.makePlots();
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.abort?.abort();
  }

  override render() {
    return html`
      <div class="layout">
        <form @submit=${(e: Event) => e.preventDefault()} novalidate aria-label="Matched-pairs inputs">
          ${sourceChoice('The pairs', SOURCES, this.form.source, (source) => this.edit({ source }))}
          ${this.form.source === 'file' ? this.fileFields() : this.form.source === 'pasted' ? this.pastedFields() : this.discordantFields()}
          ${this.analysisFields()}
        </form>
        <section part="results" aria-label="Matched-pairs results">${this.results()}</section>
      </div>
    `;
  }

  // ——— inputs ———

  private fileFields(): TemplateResult {
    const f = this.form;
    const select = (id: string, label: string, value: string, key: 'treatedColumn' | 'controlColumn' | 'differenceColumn', field: string) => {
      const problem = this.problemFor(field);
      return html`<div class="field">
        <label for="column-${id}">${label}</label>
        <select
          id="column-${id}"
          aria-invalid=${problem ? 'true' : 'false'}
          aria-describedby="column-${id}-error"
          @change=${(e: Event) => this.edit({ [key]: (e.target as HTMLSelectElement).value })}
        >
          <option value="" ?selected=${value === ''}>Choose a column</option>
          ${this.columns.map((c) => html`<option value=${c} ?selected=${value === c}>${c}</option>`)}
        </select>
        <div class="field-error" id="column-${id}-error">${problem ? problem.message : ''}</div>
      </div>`;
    };
    const fileError = this.fileProblem || (this.started ? (this.problemFor('file')?.message ?? '') : '');
    return html`
      <div class="field">
        <label for="file">CSV file</label>
        <input
          id="file"
          type="file"
          accept=".csv,.tsv,.txt,text/csv,text/plain"
          aria-describedby="file-hint file-error"
          aria-invalid=${fileError ? 'true' : 'false'}
          @change=${this.onFile}
        />
        <div class="hint" id="file-hint">
          ${this.file
            ? `${this.file.name}: columns ${this.columns.join(', ')}. It stays in this browser.`
            : f.fileName
              ? `Choose ${f.fileName} again: the rows of a file are never saved, only the choices below.`
              : 'A header row, then one row per pair: the treated and the control outcome, or their difference. It stays in this browser.'}
        </div>
        <div class="field-error" id="file-error">${fileError}</div>
      </div>
      ${this.columns.length > 0
        ? html`<fieldset>
            <legend>Columns</legend>
            <label class="choice"
              ><input type="radio" name="columns-by" .checked=${f.columnsBy === 'outcomes'} @change=${() => this.edit({ columnsBy: 'outcomes' })} />Treated and control outcomes</label
            >
            <label class="choice"
              ><input type="radio" name="columns-by" .checked=${f.columnsBy === 'difference'} @change=${() => this.edit({ columnsBy: 'difference' })} />One column of differences</label
            >
            ${f.columnsBy === 'outcomes'
              ? html`<div class="pair">
                  ${select('treated', 'Treated outcome', f.treatedColumn, 'treatedColumn', 'treated')}
                  ${select('control', 'Control outcome', f.controlColumn, 'controlColumn', 'control')}
                </div>`
              : select('difference', 'Difference (treated − control)', f.differenceColumn, 'differenceColumn', 'difference')}
            <p class="hint">Two columns holding only 0 and 1 are read as a binary outcome (discordant pairs).</p>
          </fieldset>`
        : nothing}
    `;
  }

  private pastedFields(): TemplateResult {
    const problem = this.problemFor('pasted');
    return html`<div class="field">
      <label for="pasted">Pairs</label>
      <textarea
        id="pasted"
        spellcheck="false"
        .value=${this.form.pasted}
        aria-invalid=${problem ? 'true' : 'false'}
        aria-describedby="pasted-hint pasted-error"
        @input=${(e: Event) => this.edit({ pasted: (e.target as HTMLTextAreaElement).value })}
      ></textarea>
      <div class="hint" id="pasted-hint">
        One line per pair: the difference (treated − control), or the treated and the control outcome separated by a tab, space,
        semicolon or comma. NA marks a missing value.
      </div>
      <div class="field-error" id="pasted-error">${problem ? problem.message : ''}</div>
    </div>`;
  }

  private discordantFields(): TemplateResult {
    return html`<fieldset>
      <legend>Pairs where exactly one unit had the event</legend>
      <div class="pair">
        ${this.textField('treatedOnly', 'Only the treated unit', this.form.treatedOnly, (v) => ({ treatedOnly: v }), 'numeric')}
        ${this.textField('controlOnly', 'Only the control unit', this.form.controlOnly, (v) => ({ controlOnly: v }), 'numeric')}
      </div>
      <p class="hint">Pairs where both or neither had the event carry no information about the effect (McNemar).</p>
    </fieldset>`;
  }

  private analysisFields(): TemplateResult {
    const f = this.form;
    return html`<fieldset>
      <legend>Analysis</legend>
      <div class="field">
        <label for="test">Test</label>
        <select id="test" @change=${(e: Event) => this.edit({ test: (e.target as HTMLSelectElement).value as 'signrank' | 'sign' })}>
          <option value="signrank" ?selected=${f.test === 'signrank'}>Wilcoxon signed-rank</option>
          <option value="sign" ?selected=${f.test === 'sign'}>Sign test</option>
        </select>
      </div>
      <div class="field">
        <label for="alternative">The finding</label>
        <select id="alternative" @change=${(e: Event) => this.edit({ alternative: (e.target as HTMLSelectElement).value as 'greater' | 'less' })}>
          <option value="greater" ?selected=${f.alternative === 'greater'}>Treatment raises the outcome</option>
          <option value="less" ?selected=${f.alternative === 'less'}>Treatment lowers the outcome</option>
        </select>
      </div>
      <div class="pair">
        ${this.textField('alpha', 'Significance level α', f.alpha, (v) => ({ alpha: v }), 'decimal', 'One-sided, e.g. 0.05')}
        <div class="field">
          <label for="method">Tail probabilities</label>
          <select id="method" @change=${(e: Event) => this.edit({ method: (e.target as HTMLSelectElement).value as PairsFormInputs['method'] })}>
            <option value="auto" ?selected=${f.method === 'auto'}>Automatic</option>
            <option value="exact" ?selected=${f.method === 'exact'}>Exact</option>
            <option value="normal" ?selected=${f.method === 'normal'}>Normal approximation</option>
          </select>
        </div>
      </div>
      ${this.textField('gammas', 'Γ values to tabulate', f.gammas, (v) => ({ gammas: v }), 'decimal', 'e.g. 1, 1.5, 2, 3; empty: from 1 to just past the tipping point')}
    </fieldset>`;
  }

  private textField(
    field: string,
    label: string,
    value: string,
    change: (text: string) => Partial<PairsFormInputs>,
    mode: 'decimal' | 'numeric',
    hint = '',
  ): TemplateResult {
    const problem = this.problemFor(field) ?? (field === 'gammas' ? this.problems.find((p) => p.field.startsWith('gammas[')) : undefined);
    return textField({ id: field, label, value, problem, hint, inputMode: mode, onInput: (text) => this.edit(change(text)) });
  }

  /** The problem to show beside a field: "required" only once the user has started, everything else at once. */
  private problemFor(field: string): InputProblem | undefined {
    return shownProblems(this.problems, this.started).find((p) => p.field === field);
  }

  // ——— events and computation ———

  private edit(patch: Partial<PairsFormInputs>): void {
    this.form = Object.freeze({ ...this.form, ...patch });
    this.started = true;
    this.dispatchEvent(new CustomEvent('lurk-inputs-change', { detail: { inputs: this.form }, bubbles: true, composed: true }));
    void this.compute(true);
  }

  private async onFile(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    if (!file) return;
    this.fileProblem = '';
    this.file = file;
    this.fileText = null;
    try {
      const sample = await file.slice(0, 64 * 1024).text();
      this.columns = headerOf(sample);
      if (file.size <= WORKER_FILE_BYTES) this.fileText = await file.text();
    } catch {
      this.fileProblem = `${file.name} could not be read.`;
      this.columns = [];
    }
    if (this.columns.length === 0 && !this.fileProblem) this.fileProblem = `${file.name} is empty or has no header row.`;
    const keep = this.columns.length > 0 && this.columnsStillThere();
    this.edit({ fileName: file.name, ...(keep ? {} : guessPairsColumns(this.columns)) });
  }

  /** Whether the form's column choice names columns of the new file (then it is kept). */
  private columnsStillThere(): boolean {
    const f = this.form;
    const has = (c: string) => c !== '' && this.columns.includes(c);
    return f.columnsBy === 'difference' ? has(f.differenceColumn) : has(f.treatedColumn) && has(f.controlColumn);
  }

  private async compute(userAction: boolean): Promise<void> {
    const form = this.form;
    this.computedFor = form;
    this.abort?.abort();
    this.abort = null;
    this.progress = null;
    const problems: InputProblem[] = [];
    let read: PairsRead | null = null;
    let largeFile = false;
    if (form.source === 'file') {
      if (!this.file) {
        this.finish(null, null, [{ field: 'file', code: 'required', message: form.fileName ? `choose ${form.fileName} again` : 'choose a CSV file of pairs' }], userAction);
        return;
      }
      if (this.fileText === null) largeFile = true;
      else {
        try {
          read = pairsFromCsvText(this.fileText, pairsColumnsOf(form));
        } catch (error) {
          if (!(error instanceof InputError)) throw error;
          problems.push(...error.problems);
        }
      }
    }
    const prepared = largeFile ? null : pairsInputFromForm(form, read);
    if (largeFile) problems.push(...readPairsOptions(form).problems);
    if (problems.length > 0 || (prepared && !prepared.input)) {
      this.finish(null, prepared?.read ?? read, [...problems, ...(prepared?.problems ?? [])], userAction);
      return;
    }
    const pairsCount = prepared?.input ? countPairs(prepared.input) : Infinity;
    if (largeFile || (pairsCount > WORKER_PAIRS && form.method !== 'normal')) {
      const controller = new AbortController();
      this.abort = controller;
      this.progress = { phase: largeFile ? 'reading' : 'analysing', bytesRead: 0, totalBytes: this.file?.size ?? null, rowsRead: 0 };
      try {
        const typed = readPairsOptions(form);
        const options: Omit<PairsInput, 'data'> = prepared?.input
          ? withoutData(prepared.input)
          : { test: form.test, alternative: form.alternative, method: form.method, alpha: typed.alpha, gammas: typed.gammas };
        const source = largeFile ? { kind: 'file' as const, file: this.file!, columns: pairsColumnsOf(form) } : { kind: 'data' as const, data: prepared!.input!.data };
        const { result, read: summary } = await runPairsInWorker(
          { source, options },
          { signal: controller.signal, onProgress: (p) => (this.progress = p) },
        );
        if (this.computedFor !== form) return;
        this.finish(result, summary ?? prepared?.read ?? null, [], userAction);
      } catch (error) {
        if (this.computedFor !== form) return;
        if (error instanceof DOMException && error.name === 'AbortError') {
          this.finish(null, null, [{ field: 'analysis', code: 'cancelled', message: 'the analysis was cancelled; change any input to run it again' }], userAction);
        } else if (error instanceof InputError) {
          this.finish(null, null, error.problems, userAction);
        } else {
          this.finish(null, null, [{ field: 'file', code: 'failure', message: error instanceof Error ? error.message : String(error) }], userAction);
        }
      }
      return;
    }
    try {
      const result = analysePairs(prepared!.input!);
      this.finish(result, prepared!.read, [], userAction);
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      this.finish(null, prepared!.read, [...error.problems], userAction);
    }
  }

  private finish(result: PairsResult | null, read: PairsReadSummary | null, problems: readonly InputProblem[], userAction: boolean): void {
    this.abort = null;
    this.progress = null;
    this.result = result;
    this.read = read;
    this.problems = problems;
    if (userAction) {
      const detail: PairsResultDetail = { result, problems };
      this.dispatchEvent(new CustomEvent('lurk-result', { detail, bubbles: true, composed: true }));
    }
  }

  private cancel(): void {
    this.abort?.abort();
  }

  private makePlots(): void {
    const r = this.result;
    this.plottedFor = r;
    this.specs = r
      ? { pValue: pValueByGammaPlot(r, { study: this.study }), estimate: estimateRangePlot(r, { study: this.study }), amplification: amplificationPlot(r, { study: this.study }) }
      : { pValue: null, estimate: null, amplification: null };
  }

  // ——— results ———

  private results(): TemplateResult {
    if (this.progress) {
      const p = this.progress;
      const fraction = p.phase === 'reading' && p.totalBytes ? p.bytesRead / p.totalBytes : undefined;
      return html`<div class="busy" role="status" aria-live="polite">
        <label for="pairs-progress">${p.phase === 'reading' ? `Reading the file: ${p.rowsRead.toLocaleString('en')} rows` : 'Computing the bounds…'}</label>
        <progress id="pairs-progress" max="1" .value=${fraction ?? null}></progress>
        <button type="button" class="secondary" @click=${this.cancel}>Cancel</button>
      </div>`;
    }
    const result = this.result;
    if (!result && this.problems.some((p) => p.code === 'cancelled')) {
      return html`<p class="waiting" role="status">The analysis was cancelled; change any input to run it again.</p>`;
    }
    if (!result) {
      const shown = shownProblems(this.problems, this.started);
      return html`<p class="waiting" role="status">
        ${shown.length > 0
          ? `Fix the ${shown.length === 1 ? 'field' : `${shown.length} fields`} marked in the form to see the bounds.`
          : this.form.source === 'file'
            ? 'Choose a CSV file of pairs and its columns to see the bounds.'
            : this.form.source === 'pasted'
              ? 'Paste the pairs to see the bounds.'
              : 'Enter the two counts of discordant pairs to see the bounds.'}
      </p>`;
    }
    const table = pairsTable(result, this.study);
    const notes = [...(this.read?.warnings ?? []), ...result.warnings];
    const tipping =
      result.sensitivityStatus === 'found'
        ? formatGamma(result.sensitivityValue)
        : result.sensitivityStatus === 'not-significant'
          ? 'none'
          : `> ${formatAsTyped(result.searchedUpTo)}`;
    return html`
      <div class="headlines" role="group" aria-label="Headline numbers">
        <div class="headline-box">
          <span class="label" id="tipping-label">Tipping Γ (sensitivity value)</span>
          <span class="number" id="tipping-gamma" aria-labelledby="tipping-label">${tipping}</span>
          ${result.sensitivityStatus === 'not-significant' ? html`<span class="label">not significant at Γ = 1</span>` : nothing}
        </div>
        <div class="headline-box">
          <span class="label">p-value with no hidden bias</span>
          <span class="number small" id="p-value">${pPhrase(result.pValue).replace(/^p = /, '')}</span>
        </div>
        ${result.test === 'signrank'
          ? html`<div class="headline-box">
              <span class="label">Sign test tipping Γ</span>
              <span class="number small" id="sign-tipping-gamma">${result.signTestSensitivityValue === null ? 'none' : formatGamma(result.signTestSensitivityValue)}</span>
            </div>`
          : nothing}
        ${result.estimate !== null
          ? html`<div class="headline-box">
              <span class="label">Hodges–Lehmann estimate</span>
              <span class="number small" id="estimate">${formatEffect(result.estimate, this.study)}</span>
            </div>`
          : nothing}
      </div>
      <p class="method" id="pairs-counts">
        ${result.n.toLocaleString('en')} pairs used${result.droppedRows > 0 ? `, ${result.droppedRows.toLocaleString('en')} left out for a missing value` : ''};
        ${result.test === 'signrank' ? `${result.nonZero.toLocaleString('en')} with a non-zero difference` : `${result.nonZero.toLocaleString('en')} informative`}.
        Tails: ${result.tailMethodReason}.
      </p>
      <div class="reading">${pairsReading(result, this.study).map((s) => html`<p>${s}</p>`)}</div>
      ${notes.length > 0 ? html`<div class="warning" role="note">${notes.map((n) => html`<div>${n}</div>`)}</div>` : nothing}
      <div class="table-scroll" tabindex="0" role="region" aria-label="Sensitivity table (scrolls sideways)">
        <table id="bounds-table">
          <caption>
            Bounds on the one-sided p-value${result.estimates.length > 0 ? ', estimate range and sensitivity interval' : ''} by Γ
          </caption>
          <thead>
            <tr>
              ${table.header.map((h) => html`<th scope="col">${h}</th>`)}
            </tr>
          </thead>
          <tbody>
            ${table.rows.map((row) => html`<tr>${row.map((cell, i) => (i === 0 ? html`<th scope="row">${cell}</th>` : html`<td>${cell}</td>`))}</tr>`)}
          </tbody>
        </table>
      </div>
      <div class="plots">
        ${this.specs.pValue ? html`<lurk-plot .spec=${this.specs.pValue}></lurk-plot>` : nothing}
        ${this.specs.estimate ? html`<lurk-plot .spec=${this.specs.estimate}></lurk-plot>` : nothing}
        ${this.specs.amplification ? html`<lurk-plot .spec=${this.specs.amplification}></lurk-plot>` : nothing}
      </div>
      <p class="caution" role="note">${PAIRS_CAUTION}</p>
    `;
  }
}

/** The header row of a CSV sample (its first record). */
function headerOf(sample: string): string[] {
  let header: string[] = [];
  const reader = new CsvChunkReader((fields, record) => {
    if (record === 1) header = fields.map((f, i) => f.trim() || `column ${i + 1}`);
  });
  reader.push(sample);
  reader.end();
  return header;
}

function countPairs(input: PairsInput): number {
  const data = input.data;
  if (data.kind === 'discordant') return 0; // the sign test is cheap for any count
  return data.kind === 'differences' ? data.differences.length : data.treated.length;
}

function withoutData(input: PairsInput): Omit<PairsInput, 'data'> {
  const { data: _data, ...rest } = input;
  return rest;
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-pairs': LurkPairs;
  }
}

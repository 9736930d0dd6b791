import { LitElement, html, nothing, type TemplateResult } from 'lit';
import { html as staticHtml, unsafeStatic } from 'lit/static-html.js';
import { keyed } from 'lit/directives/keyed.js';
import { customElement, property, state } from 'lit/decorators.js';
import { emptyStudy, labelsOfFinding, type FindingLabels, type StudyLabels } from '../src/format/studyLabels';
import { createAppraisal, type Appraisal, type CalculatorSummary, type Finding } from '../src/workspace/appraisal';
import { withFindingChanged, withNewFinding, withoutFinding } from '../src/workspace/findingList';
import { findingOfBatchRow, withBatchRow } from '../src/workspace/batchRows';
import { BATCH_METHODS, METHOD_CHOICES, VIEWS, type ViewInfo } from './workspaceViews';
import { readAppraisalFile, saveAppraisalFile, shareAppraisal } from './appraisalActions';
import { baseStyles } from './styles/base';
import { appStyles } from './styles/app';
import { METHODS, methodById } from '../src/methods/registry';
import './lurk-study';
import './lurk-findings';
import './lurk-statement';
import './lurk-bottom-line';
import './lurk-batch';

/** Below this width the study header and the findings start folded and the tabs scroll sideways in their own strip. */
const NARROW_SCREEN = '(max-width: 640px)';

/** The views of the workspace, in tab order: a tab per method of the registry, then the workspace's own. */
export type WorkspaceView = string;

/** Where the reviewer is: the open tab and the finding shown in it (a calculator's tab), for a reload. */
export interface WorkspacePlace {
  readonly view: WorkspaceView;
  readonly finding: string;
}

/**
 * @summary The appraisal workspace: the study header, the paper's findings, and the calculators, each in its own
 * tab, editing the current finding of its method.
 *
 * @property study - the paper's labels, shared by every finding.
 * @property findings - the findings (id, method, name, inputs as typed, summary).
 * @property view - the open tab.
 * @property banner - a note above the calculators (e.g. that the study shown is fictional).
 * @property notice - a message about saving, opening or sharing.
 * @fires lurk-view-change - {view, finding} when the user opens another tab or finding.
 * @fires lurk-appraisal-change - {appraisal} after the user changed anything (the page keeps it for the next visit).
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
@customElement('lurk-app')
export class LurkApp extends LitElement {
  static override styles = [baseStyles, appStyles];

  @property({ attribute: false }) study: StudyLabels = emptyStudy;
  @property({ attribute: false }) findings: readonly Finding[] = [];
  @property({ reflect: true }) view: WorkspaceView = METHODS[0].id;
  @property() banner = '';
  @property() notice = '';

  /** Whether the study header is unfolded: folded at first on narrow screens, so the calculator shows first. */
  @state() private studyOpen = typeof matchMedia === 'function' ? !matchMedia(NARROW_SCREEN).matches : true;
  /** Whether the list of findings is unfolded: folded at first on narrow screens too (the tab shows the current one). */
  @state() private findingsOpen = this.studyOpen;
  @state() private batchText = '';
  @state() private batchAlpha = '0.05';
  /** The finding each calculator edits, by method id. */
  @state() private current: Record<string, string> = {};
  /** A note beside a calculator's finding (e.g. that it was added to the batch table), by method id. */
  @state() private barNotes: Record<string, string> = {};
  /** Bumped when a calculator is given another finding, so that it starts afresh (no file or state carried over). */
  private generation: Record<string, number> = {};
  /** Summaries of inputs (from the calculator that read them, else computed once), by the inputs object (replaced, never changed, on an edit). */
  private computed = new WeakMap<object, CalculatorSummary | null>();

  /** The appraisal as it stands: study labels, findings with the summaries of their results, the batch table. */
  get appraisal(): Appraisal {
    const batch = this.batchText !== '' || this.batchAlpha !== '0.05' ? { text: this.batchText, alpha: this.batchAlpha } : undefined;
    return createAppraisal(this.study, this.findings.map((f) => ({ ...f, summary: this.summaryOf(f) })), new Date(), batch);
  }

  /** Replaces the whole workspace with a saved appraisal (file, share link or local storage). */
  load(appraisal: Appraisal): void {
    this.study = appraisal.study;
    this.findings = appraisal.findings.map((f) => {
      const method = methodById(f.method);
      return { ...f, inputs: method ? (method.form.normalise(f.inputs) as Record<string, unknown>) : f.inputs };
    });
    this.batchText = appraisal.batch?.text ?? '';
    this.batchAlpha = appraisal.batch?.alpha ?? '0.05';
    this.current = {};
    for (const f of this.findings) this.current[f.method] ??= f.id;
    for (const m of METHODS) this.generation[m.id] = (this.generation[m.id] ?? 0) + 1;
    this.barNotes = {};
  }

  /** The open tab and, in a calculator's tab, its finding. */
  get place(): WorkspacePlace {
    return { view: this.view, finding: this.current[this.view] ?? '' };
  }

  /** Opens a tab and finding kept from before (ignored where they no longer exist). */
  set place(place: WorkspacePlace) {
    const finding = this.findings.find((f) => f.id === place.finding);
    if (finding) this.showFinding(finding.method, finding.id);
    if (VIEWS.some((v) => v.id === place.view)) this.view = place.view;
  }

  /** A finding's summary: from its inputs when they give one, else the one kept with it (a file's result). */
  private summaryOf(f: Finding): CalculatorSummary | null {
    const method = methodById(f.method);
    if (!method) return f.summary;
    const form = method.form.normalise(f.inputs);
    if (method.workspace.needsData(form)) return f.summary;
    if (!this.computed.has(f.inputs)) this.computed.set(f.inputs, method.workspace.summaryFromForm(form) as CalculatorSummary | null);
    return this.computed.get(f.inputs) ?? null;
  }

  override render() {
    const shown = this.findings.find((f) => f.id === this.current[this.view]);
    return html`
      <header class="app">
        <h1>Lurk</h1>
        <p>How strong would a hidden confounder have to be to overturn this finding?</p>
      </header>
      <p class="privacy">Everything is computed in this browser; nothing you type or load is sent anywhere.</p>
      <div class="toolbar" role="toolbar" aria-label="Appraisal file">
        <button class="secondary" type="button" @click=${this.save}>Save appraisal</button>
        <label class="file-button secondary" for="open-appraisal">Open appraisal…</label>
        <input id="open-appraisal" class="visually-hidden" type="file" accept=".json,application/json" @change=${this.openFile} />
        <button class="secondary" type="button" @click=${this.share}>Copy share link</button>
        <button class="secondary" type="button" @click=${this.clear}>Start a new appraisal</button>
        <span class="notice" role="status" aria-live="polite">${this.notice}</span>
      </div>
      ${this.banner ? html`<div class="demo-banner" role="note">${this.banner}</div>` : nothing}
      <details class="study-fold" ?open=${this.studyOpen} @toggle=${(e: Event) => (this.studyOpen = (e.currentTarget as HTMLDetailsElement).open)}>
        <summary><span class="fold-label">Study</span> <span class="fold-finding">${this.study.finding.trim() || 'not named yet'}</span></summary>
        <lurk-study .study=${this.study} @lurk-study-change=${this.onStudy}></lurk-study>
      </details>
      <details class="study-fold" ?open=${this.findingsOpen} @toggle=${(e: Event) => (this.findingsOpen = (e.currentTarget as HTMLDetailsElement).open)}>
        <summary><span class="fold-label">Findings (${this.findings.length})</span> <span class="fold-finding">${shown?.name.trim() || ''}</span></summary>
        <lurk-findings
          .findings=${this.findings}
          .methods=${METHOD_CHOICES}
          .current=${shown?.id ?? ''}
          .study=${this.study}
          @lurk-finding-labels=${(e: CustomEvent<{ id: string; labels: FindingLabels }>) => this.setFindings(withFindingChanged(this.findings, e.detail.id, { labels: e.detail.labels }))}
          @lurk-finding-select=${(e: CustomEvent<{ id: string }>) => this.select(e.detail.id)}
          @lurk-finding-rename=${(e: CustomEvent<{ id: string; name: string }>) => this.setFindings(withFindingChanged(this.findings, e.detail.id, { name: e.detail.name }))}
          @lurk-finding-remove=${(e: CustomEvent<{ id: string }>) => this.removeFinding(e.detail.id)}
          @lurk-finding-add=${(e: CustomEvent<{ method: string }>) => this.add(e.detail.method)}
        ></lurk-findings>
      </details>
      <div role="tablist" aria-label="Calculators" @keydown=${this.onTabKey}>
        ${VIEWS.map(
          (v) => html`<button
            role="tab"
            id="tab-${v.id}"
            aria-controls="panel-${v.id}"
            aria-selected=${this.view === v.id ? 'true' : 'false'}
            tabindex=${this.view === v.id ? 0 : -1}
            @click=${() => this.open(v.id)}
          >
            ${v.tab}
          </button>`,
        )}
      </div>
      ${VIEWS.map(
        (v) => html`<section role="tabpanel" id="panel-${v.id}" aria-labelledby="tab-${v.id}" ?hidden=${this.view !== v.id}>
          <h2>${v.heading}</h2>
          <p class="hint">${v.intro}</p>
          ${this.panel(v)}
        </section>`,
      )}
    `;
  }

  private panel(view: ViewInfo): TemplateResult {
    if (view.element) return this.calculator(view.id, view.element);
    switch (view.id) {
      case 'statement':
        return html`<lurk-statement .appraisal=${this.view === 'statement' ? this.appraisal : null}></lurk-statement>`;
      case 'bottom-line':
        return html`<lurk-bottom-line .appraisal=${this.view === 'bottom-line' ? this.appraisal : null}></lurk-bottom-line>`;
      default:
        return html`<lurk-batch
          .text=${this.batchText}
          .alpha=${this.batchAlpha}
          @lurk-batch-change=${(e: CustomEvent<{ text: string; alpha: string }>) => {
            this.batchText = e.detail.text;
            this.batchAlpha = e.detail.alpha;
            this.changed();
          }}
          @lurk-batch-open=${(e: CustomEvent<{ row: number }>) => this.openBatchRow(e.detail.row)}
        ></lurk-batch>`;
    }
  }

  /** A calculator's tab: the element, editing the current finding of its method, and the button that adds it to the batch table. */
  private calculator(method: string, element: string): TemplateResult {
    const finding = this.findings.find((f) => f.id === this.current[method]);
    const record = (e: CustomEvent<{ inputs?: Record<string, unknown> }>) => this.onCalculatorEvent(method, e);
    const tag = unsafeStatic(element);
    // Which finding the calculator edits shows in the list above the tabs; below the result, its one-click actions.
    const top = finding ? nothing : html`<p class="finding-bar">No finding of this kind yet: what you type below starts one.</p>`;
    const calc = keyed(
      `${method}:${this.generation[method] ?? 0}`,
      staticHtml`<${tag} data-calculator .study=${labelsOfFinding(this.study, finding?.labels)} .inputs=${finding?.inputs ?? null} @lurk-inputs-change=${record} @lurk-result=${record}></${tag}>`,
    );
    const bottom = html`<div class="finding-bar">
      ${finding ? html`<span>Finding <span class="editing">${finding.name.trim() || 'Unnamed finding'}</span></span>` : nothing}
      ${finding && BATCH_METHODS.has(method) ? html`<button class="secondary" type="button" @click=${() => this.addToBatch(finding)}>Add this finding to the batch table</button>` : nothing}
      <span class="hint" role="status">${this.barNotes[method] ?? ''}</span>
    </div>`;
    return html`${top}${calc}${bottom}`;
  }

  private onCalculatorEvent(method: string, event: CustomEvent<{ inputs?: Record<string, unknown> }>): void {
    // The element has just read its form: its summary stands for these inputs (no second run of the analysis).
    const summary = (event.target as { summary?: CalculatorSummary | null }).summary ?? null;
    if (event.type === 'lurk-inputs-change' && event.detail.inputs) {
      const id = this.current[method];
      this.computed.set(event.detail.inputs, summary);
      if (id && this.findings.some((f) => f.id === id)) {
        this.findings = withFindingChanged(this.findings, id, { inputs: event.detail.inputs, summary: null });
      } else {
        const made = withNewFinding(this.findings, method, undefined, event.detail.inputs);
        this.findings = made.findings;
        this.current = { ...this.current, [method]: made.finding.id };
      }
    }
    const finding = this.findings.find((f) => f.id === this.current[method]);
    if (event.type === 'lurk-result' && finding) {
      this.computed.set(finding.inputs, summary);
      this.findings = withFindingChanged(this.findings, finding.id, { summary });
    }
    this.changed();
  }

  /** Shows a finding in its calculator (a fresh element, so nothing of the previous finding is carried over). */
  private showFinding(method: string, id: string | undefined): void {
    const next = { ...this.current };
    if (id) next[method] = id;
    else delete next[method];
    this.current = next;
    this.generation[method] = (this.generation[method] ?? 0) + 1;
  }

  private select(id: string): void {
    const finding = this.findings.find((f) => f.id === id);
    if (!finding) return;
    if (this.current[finding.method] !== id) this.showFinding(finding.method, id);
    this.open(finding.method, true);
  }

  private add(method: string): void {
    const m = methodById(method);
    if (!m) return;
    const made = withNewFinding(this.findings, method, undefined, m.form.empty() as Record<string, unknown>);
    this.findings = made.findings;
    this.showFinding(method, made.finding.id);
    this.notice = `Added the finding “${made.finding.name}”: give it a name and fill in its calculator.`;
    this.open(method, true);
    this.changed();
  }

  private removeFinding(id: string): void {
    const finding = this.findings.find((f) => f.id === id);
    if (!finding) return;
    this.findings = withoutFinding(this.findings, id);
    if (this.current[finding.method] === id) this.showFinding(finding.method, this.findings.find((f) => f.method === finding.method)?.id);
    this.notice = `Removed the finding “${finding.name.trim() || 'Unnamed finding'}”.`;
    this.fireView();
    this.changed();
  }

  private setFindings(findings: Finding[]): void {
    this.findings = findings;
    this.changed();
  }

  private addToBatch(finding: Finding): void {
    const made = withBatchRow(this.batchText, finding.method, finding.name.trim() || 'Unnamed finding', finding.inputs);
    const note = 'reason' in made ? `Not added to the batch table: ${made.reason}.` : `Added to the batch table (tab “Many findings”).`;
    if (!('reason' in made)) this.batchText = made.text;
    this.barNotes = { ...this.barNotes, [finding.method]: note };
    this.changed();
  }

  private openBatchRow(row: number): void {
    const found = findingOfBatchRow(this.batchText, row, this.batchAlpha);
    if (!found) {
      this.notice = `Row ${row} of the batch table cannot be opened in a calculator (its measure is not one the calculators read).`;
      return;
    }
    const same = this.findings.find((f) => f.method === found.method && f.name === found.name && JSON.stringify(f.inputs) === JSON.stringify(found.inputs));
    if (same) this.select(same.id);
    else {
      const made = withNewFinding(this.findings, found.method, found.name, found.inputs as unknown as Record<string, unknown>);
      this.findings = made.findings;
      this.showFinding(found.method, made.finding.id);
      this.open(found.method, true);
      this.changed();
    }
    this.notice = `Opened row ${row} of the batch table as the finding “${found.name}”.`;
  }

  /** Tells the page the appraisal changed (it saves it for the next visit). */
  private changed(): void {
    this.dispatchEvent(new CustomEvent('lurk-appraisal-change', { detail: { appraisal: this.appraisal }, bubbles: true, composed: true }));
  }

  private fireView(): void {
    this.dispatchEvent(new CustomEvent('lurk-view-change', { detail: this.place, bubbles: true, composed: true }));
  }

  private save(): void {
    this.notice = saveAppraisalFile(this.appraisal);
  }

  private async openFile(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    const read = await readAppraisalFile(file);
    this.notice = read.notice;
    if (!read.appraisal) return;
    this.banner = '';
    this.load(read.appraisal);
    this.fireView();
    this.changed();
  }

  private async share(): Promise<void> {
    this.notice = await shareAppraisal(this.appraisal);
  }

  private clear(): void {
    if (!confirm('Start a new, empty appraisal? The current one is not kept unless you saved it.')) return;
    this.banner = '';
    this.load(createAppraisal(emptyStudy, []));
    this.notice = 'Started a new appraisal.';
    this.changed();
  }

  private onStudy(event: CustomEvent<{ study: StudyLabels }>): void {
    this.study = event.detail.study;
    this.changed();
  }

  private open(view: WorkspaceView, always = false): void {
    if (view === this.view && !always) return;
    this.view = view;
    this.fireView();
  }

  /** Arrow keys, Home and End move between tabs (WAI-ARIA Authoring Practices, tabs pattern). */
  private onTabKey(event: KeyboardEvent): void {
    const index = VIEWS.findIndex((v) => v.id === this.view);
    let next = index;
    if (event.key === 'ArrowRight') next = (index + 1) % VIEWS.length;
    else if (event.key === 'ArrowLeft') next = (index - 1 + VIEWS.length) % VIEWS.length;
    else if (event.key === 'Home') next = 0;
    else if (event.key === 'End') next = VIEWS.length - 1;
    else return;
    event.preventDefault();
    this.open(VIEWS[next].id);
    void this.updateComplete.then(() => (this.renderRoot.querySelector(`#tab-${VIEWS[next].id}`) as HTMLElement | null)?.focus());
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-app': LurkApp;
  }
  interface GlobalEventHandlersEventMap {
    'lurk-view-change': CustomEvent<WorkspacePlace>;
    'lurk-appraisal-change': CustomEvent<{ appraisal: Appraisal }>;
  }
}

import { LitElement, html, nothing, type TemplateResult } from 'lit';
import { html as staticHtml, unsafeStatic } from 'lit/static-html.js';
import { customElement, property, state } from 'lit/decorators.js';
import { emptyStudy, type StudyLabels } from '../src/format/studyLabels';
import { createAppraisal, readAppraisal, type Appraisal, type CalculatorEntry, type CalculatorName, type CalculatorSummary } from '../src/workspace/appraisal';
import { encodeShareFragment } from '../src/workspace/shareLink';
import { downloadBlob } from '../src/plot/figureExport.browser';
import { baseStyles } from './styles/base';
import { appStyles } from './styles/app';
import { METHODS } from '../src/methods/registry';
import './lurk-study';
import './lurk-statement';
import './lurk-bottom-line';
import './lurk-batch';

/** Below this width the study header starts folded and the tabs scroll sideways in their own strip. */
const NARROW_SCREEN = '(max-width: 640px)';

/** The views of the workspace, in tab order: a tab per method of the registry, then the workspace's own. */
export type WorkspaceView = string;

/** What a calculator element offers the workspace besides its events. */
interface CalculatorElement extends HTMLElement {
  /** Headline numbers of the current result (null while the inputs give none). */
  readonly summary?: CalculatorSummary | null;
  updateComplete?: Promise<boolean>;
}

interface ViewInfo {
  readonly id: WorkspaceView;
  readonly tab: string;
  readonly heading: string;
  readonly intro: string;
  /** The calculator element of a method's view. */
  readonly element?: string;
}

const VIEWS: readonly ViewInfo[] = [
  ...METHODS.map((m) => ({ id: m.id, tab: m.title, heading: m.view.heading, intro: m.view.intro, element: m.view.element })),
  {
    id: 'statement',
    tab: 'Robustness statement',
    heading: 'Robustness statement for a paper',
    intro: 'A paragraph per calculator used, with the numbers, the assumptions each method makes, and full references.',
  },
  {
    id: 'bottom-line',
    tab: 'Bottom line',
    heading: 'The bottom line: how sure are we?',
    intro: 'In plain words, for decision-makers.',
  },
  {
    id: 'batch',
    tab: 'Many findings',
    heading: 'Many reported findings at once',
    intro: 'For reviewers and evidence synthesis: E-values and robustness values for a table of reported estimates.',
  },
];

/** The calculators among the views, keyed as in an appraisal file (a method's view id is its id). */
const isCalculator = (view: WorkspaceView) => METHODS.some((m) => m.id === view);

/** What the workspace keeps of each calculator: the raw inputs as typed (never lost) and the last result. */
export interface CalculatorState {
  inputs: Record<string, unknown> | null;
  result: unknown;
}

/**
 * @summary The appraisal workspace: the study header and the calculators, each in its own tab.
 *
 * @property study - the finding's labels, shared by every calculator.
 * @property view - the open tab.
 * @property inputs - each calculator's inputs as typed, keyed by view.
 * @property banner - a note above the calculators (e.g. that the study shown is fictional).
 * @property notice - a message about saving, opening or sharing.
 * @fires lurk-view-change - {view} when the user opens another tab.
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
  @property({ reflect: true }) view: WorkspaceView = 'evalue';
  /** Inputs of each calculator (raw text as typed), keyed by view. */
  @property({ attribute: false }) inputs: Partial<Record<WorkspaceView, Record<string, unknown>>> = {};
  /** A note shown above the calculators, e.g. that the filled-in study is fictional. */
  @property() banner = '';

  /** A message about loading, saving or sharing, shown in the toolbar. */
  @property() notice = '';

  /** Whether the study header is unfolded: folded at first on narrow screens, so the calculator shows first. */
  @state() private studyOpen = typeof matchMedia === 'function' ? !matchMedia(NARROW_SCREEN).matches : true;
  @state() private batchText = '';
  @state() private batchAlpha = '0.05';

  /**
   * Summaries that came with a loaded appraisal. A calculator whose data are not in the file (a CSV file, or pasted
   * rows left out of a share link) cannot recompute its result, so its saved summary stands until the user edits it.
   */
  private loadedSummaries: Partial<Record<CalculatorName, CalculatorSummary | null>> = {};

  /** The appraisal as it stands: study labels, inputs as typed, and the summaries of the results. */
  get appraisal(): Appraisal {
    const calculators: Partial<Record<CalculatorName, CalculatorEntry>> = {};
    for (const { id: name } of METHODS) {
      const inputs = this.inputs[name];
      const summary = this.summaryOf(name);
      if (inputs || summary) calculators[name] = { inputs: (inputs ?? {}) as Record<string, unknown>, summary };
    }
    return createAppraisal(this.study, calculators);
  }

  /** Replaces the whole workspace with a saved appraisal (file, share link or local storage). */
  load(appraisal: Appraisal): void {
    this.study = appraisal.study;
    const inputs: Partial<Record<WorkspaceView, Record<string, unknown>>> = {};
    const summaries: Partial<Record<CalculatorName, CalculatorSummary | null>> = {};
    for (const [name, entry] of Object.entries(appraisal.calculators) as [CalculatorName, CalculatorEntry | undefined][]) {
      if (!entry) continue;
      inputs[name] = entry.inputs;
      summaries[name] = entry.summary;
    }
    this.inputs = inputs;
    this.loadedSummaries = summaries;
  }

  /** A calculator's current summary: from its element when it has a result, else the one loaded with the file. */
  private summaryOf(name: CalculatorName): CalculatorSummary | null {
    const element = this.renderRoot?.querySelector<CalculatorElement>(`#panel-${name} [data-calculator]`);
    return element?.summary ?? this.loadedSummaries[name] ?? null;
  }

  override render() {
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
          ${this.calculator(v.id)}
        </section>`,
      )}
    `;
  }

  private calculator(view: WorkspaceView): TemplateResult {
    const inputs = this.inputs[view] ?? null;
    const record = (e: CustomEvent<{ inputs?: Record<string, unknown> }>) => this.onCalculatorEvent(view, e);
    const element = VIEWS.find((v) => v.id === view)?.element;
    if (element) {
      const tag = unsafeStatic(element);
      return staticHtml`<${tag} data-calculator .study=${this.study} .inputs=${inputs} @lurk-inputs-change=${record} @lurk-result=${record}></${tag}>`;
    }
    switch (view) {
      case 'statement':
        return html`<lurk-statement .appraisal=${this.view === 'statement' ? this.appraisal : null}></lurk-statement>`;
      case 'bottom-line':
        return html`<lurk-bottom-line .appraisal=${this.view === 'bottom-line' ? this.appraisal : null}></lurk-bottom-line>`;
      case 'batch':
        return html`<lurk-batch
          .text=${this.batchText}
          .alpha=${this.batchAlpha}
          @lurk-batch-change=${(e: CustomEvent<{ text: string; alpha: string }>) => {
            this.batchText = e.detail.text;
            this.batchAlpha = e.detail.alpha;
          }}
        ></lurk-batch>`;
      default:
        return html``;
    }
  }

  private onCalculatorEvent(view: WorkspaceView, event: CustomEvent<{ inputs?: Record<string, unknown> }>): void {
    if (!isCalculator(view)) return;
    const name = view;
    if (event.type === 'lurk-inputs-change' && event.detail.inputs) {
      this.inputs = { ...this.inputs, [view]: event.detail.inputs };
    }
    if (event.type === 'lurk-inputs-change') delete this.loadedSummaries[name];
    this.changed();
  }

  /** Tells the page the appraisal changed (it saves it for the next visit). */
  private changed(): void {
    this.dispatchEvent(new CustomEvent('lurk-appraisal-change', { detail: { appraisal: this.appraisal }, bubbles: true, composed: true }));
  }

  private save(): void {
    const text = JSON.stringify(this.appraisal, null, 2) + '\n';
    const name = (this.study.finding.trim() || 'appraisal').replace(/[^\w-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60).toLowerCase();
    downloadBlob(new Blob([text], { type: 'application/json' }), `lurk-${name || 'appraisal'}.json`);
    this.notice = 'Saved the appraisal as a JSON file (inputs and results; raw data files are not included).';
  }

  private async openFile(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    let json: unknown;
    try {
      json = JSON.parse(await file.text());
    } catch {
      this.notice = `"${file.name}" is not a JSON file; your current work is kept.`;
      return;
    }
    const read = readAppraisal(json);
    if (read.appraisal === null) {
      const p = read.problems[0];
      this.notice = `"${file.name}" cannot be opened: ${p.field} ${p.message}. Your current work is kept.`;
      return;
    }
    this.banner = '';
    this.load(read.appraisal);
    this.notice = `Opened "${file.name}".`;
    this.changed();
  }

  private async share(): Promise<void> {
    const url = `${location.origin}${location.pathname}${encodeShareFragment(this.appraisal)}`;
    history.replaceState(null, '', url);
    try {
      await navigator.clipboard.writeText(url);
      this.notice = 'Share link copied. It carries your inputs, never raw data rows; anyone with it sees the same appraisal.';
    } catch {
      this.notice = 'Share link placed in the address bar (copying is not allowed here). It carries your inputs, never raw data rows.';
    }
  }

  private clear(): void {
    if (!confirm('Start a new, empty appraisal? The current one is not kept unless you saved it.')) return;
    this.banner = '';
    this.load(createAppraisal(emptyStudy, {}));
    this.notice = 'Started a new appraisal.';
    this.changed();
  }

  private onStudy(event: CustomEvent<{ study: StudyLabels }>): void {
    this.study = event.detail.study;
    this.changed();
  }

  private open(view: WorkspaceView): void {
    if (view === this.view) return;
    this.view = view;
    this.dispatchEvent(new CustomEvent('lurk-view-change', { detail: { view }, bubbles: true, composed: true }));
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
    'lurk-view-change': CustomEvent<{ view: WorkspaceView }>;
    'lurk-appraisal-change': CustomEvent<{ appraisal: Appraisal }>;
  }
}

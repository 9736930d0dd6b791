import { LitElement, css, html, nothing, type TemplateResult } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { emptyStudy, type StudyLabels } from '../src/io/studyLabels';
import { baseStyles } from './styles/base';
import './lurk-study';

/** The views of the workspace, in tab order. */
export type WorkspaceView = 'evalue' | 'pairs' | 'regression';

interface ViewInfo {
  readonly id: WorkspaceView;
  readonly tab: string;
  readonly heading: string;
  readonly intro: string;
}

const VIEWS: readonly ViewInfo[] = [
  {
    id: 'evalue',
    tab: 'Reported estimate',
    heading: 'E-value: from a reported estimate or a 2×2 table',
    intro: 'How strongly would a hidden confounder have to be associated with both the exposure and the outcome to explain the finding away?',
  },
  {
    id: 'pairs',
    tab: 'Matched pairs',
    heading: 'Rosenbaum bounds for matched pairs',
    intro: 'How much could hidden bias change the odds of treatment within a matched pair before the finding stops being significant?',
  },
  {
    id: 'regression',
    tab: 'Regression',
    heading: 'Omitted-variable bias in a linear regression',
    intro: 'How much of the residual variance of treatment and outcome would a hidden confounder have to explain to change the conclusion?',
  },
];

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
 * @fires lurk-view-change - {view} when the user opens another tab.
 */
@customElement('lurk-app')
export class LurkApp extends LitElement {
  static override styles = [
    baseStyles,
    css`
      :host {
        max-width: 1180px;
        margin: 0 auto;
        padding: 0 1rem 3rem;
      }
      header.app {
        display: flex;
        flex-wrap: wrap;
        align-items: baseline;
        gap: 0.25rem 1rem;
        padding: 1rem 0 0.5rem;
      }
      header.app h1 {
        margin: 0;
        font-size: 1.6rem;
        letter-spacing: 0.02em;
      }
      header.app p {
        margin: 0;
        color: var(--_muted);
      }
      .privacy {
        font-size: 0.85rem;
        color: var(--_muted);
        margin: 0 0 0.75rem;
      }
      [role='tablist'] {
        display: flex;
        flex-wrap: wrap;
        gap: 0.25rem;
        border-bottom: 2px solid var(--_border);
        margin-top: 0.75rem;
      }
      [role='tab'] {
        background: var(--_surface);
        color: var(--_text);
        border: 1px solid var(--_border);
        border-bottom: none;
        border-radius: var(--_radius) var(--_radius) 0 0;
        padding: 0.5rem 0.9rem;
      }
      [role='tab'][aria-selected='true'] {
        background: var(--_accent);
        color: var(--_accent-text);
        border-color: var(--_accent);
      }
      [role='tabpanel'] {
        padding-top: 0.5rem;
      }
      .demo-banner {
        background: var(--_warning-bg);
        border-radius: var(--_radius);
        padding: 0.5rem 0.75rem;
        margin: 0.5rem 0;
        font-size: 0.9rem;
      }
    `,
  ];

  @property({ attribute: false }) study: StudyLabels = emptyStudy;
  @property({ reflect: true }) view: WorkspaceView = 'evalue';
  /** Inputs of each calculator (raw text as typed), keyed by view. */
  @property({ attribute: false }) inputs: Partial<Record<WorkspaceView, Record<string, unknown>>> = {};
  /** A note shown above the calculators, e.g. that the filled-in study is fictional. */
  @property() banner = '';

  @state() private results: Partial<Record<WorkspaceView, unknown>> = {};

  override render() {
    return html`
      <header class="app">
        <h1>Lurk</h1>
        <p>How strong would a hidden confounder have to be to overturn this finding?</p>
      </header>
      <p class="privacy">Everything is computed in this browser; nothing you type or load is sent anywhere.</p>
      ${this.banner ? html`<div class="demo-banner" role="note">${this.banner}</div>` : nothing}
      <lurk-study .study=${this.study} @lurk-study-change=${this.onStudy}></lurk-study>
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
    const record = (e: CustomEvent<{ inputs?: Record<string, unknown>; result?: unknown }>) => this.onCalculatorEvent(view, e);
    switch (view) {
      case 'evalue':
        return html`<lurk-evalue .study=${this.study} .inputs=${inputs} @lurk-inputs-change=${record} @lurk-result=${record}></lurk-evalue>`;
      case 'pairs':
        return html`<lurk-pairs .study=${this.study} .inputs=${inputs} @lurk-inputs-change=${record} @lurk-result=${record}></lurk-pairs>`;
      case 'regression':
        return html`<lurk-ovb .study=${this.study} .inputs=${inputs} @lurk-inputs-change=${record} @lurk-result=${record}></lurk-ovb>`;
    }
  }

  private onCalculatorEvent(view: WorkspaceView, event: CustomEvent<{ inputs?: Record<string, unknown>; result?: unknown }>): void {
    if (event.type === 'lurk-inputs-change' && event.detail.inputs) {
      this.inputs = { ...this.inputs, [view]: event.detail.inputs };
    }
    if (event.type === 'lurk-result') this.results = { ...this.results, [view]: event.detail.result ?? null };
  }

  private onStudy(event: CustomEvent<{ study: StudyLabels }>): void {
    this.study = event.detail.study;
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
  }
}

import { LitElement, css, html, nothing } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { baseStyles } from './styles/base';
import { emptyStudy, type FindingLabels, type StudyLabels } from '../src/format/studyLabels';

/** A finding as the list shows it. */
export interface FindingItem {
  readonly id: string;
  readonly method: string;
  readonly name: string;
  readonly labels?: FindingLabels;
}

/** The labels a finding may have of its own, with the words the page uses for them. */
const OWN_LABELS: readonly { key: keyof FindingLabels; label: string }[] = [
  { key: 'exposure', label: 'Its exposure or treatment' },
  { key: 'outcome', label: 'Its outcome' },
  { key: 'units', label: "Its outcome's units" },
];

/** A method a new finding may use. */
export interface MethodChoice {
  readonly id: string;
  readonly title: string;
}

/**
 * @summary The findings of the paper being appraised: a list to switch between them, the current one's name to
 * edit, a button to remove it, and a way to add a finding with any method.
 *
 * @property findings - the findings (id, method, name), in order.
 * @property methods - the methods a finding may use (id, title).
 * @property current - the id of the finding shown now, or "".
 * @property study - the study's labels, shown as what a finding's own labels fall back to.
 * @fires lurk-finding-select - {id} when the user opens a finding.
 * @fires lurk-finding-rename - {id, name} when the user edits the current finding's name.
 * @fires lurk-finding-labels - {id, labels} when the user edits the current finding's own exposure, outcome or units.
 * @fires lurk-finding-remove - {id} when the user removes the current finding.
 * @fires lurk-finding-add - {method} when the user adds a finding.
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
@customElement('lurk-findings')
export class LurkFindings extends LitElement {
  static override styles = [
    baseStyles,
    css`
      :host {
        display: block;
        min-width: 0;
      }
      section {
        border: 1px solid var(--_border);
        border-radius: var(--_radius);
        background: var(--_surface);
        padding: 0.4rem 0.6rem 0.2rem;
        margin: 0.5rem 0;
      }
      h2 {
        font-size: 1rem;
        margin: 0 0 0.3rem;
      }
      ul {
        list-style: none;
        margin: 0 0 0.4rem;
        padding: 0;
        display: flex;
        flex-wrap: wrap;
        gap: 0.3rem;
      }
      li {
        min-width: 0;
        max-width: 100%;
      }
      li button {
        background: var(--_bg);
        color: var(--_text);
        border: 1px solid var(--_border);
        padding: 0.25rem 0.6rem;
        min-height: 2.1rem;
        text-align: left;
        max-width: 100%;
      }
      li button[aria-current='true'] {
        border: 2px solid var(--_accent);
        font-weight: 600;
      }
      .method {
        display: block;
        color: var(--_muted);
        font-size: 0.75rem;
        font-weight: normal;
      }
      .row {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem 0.75rem;
        align-items: end;
      }
      .row .field {
        margin-bottom: 0.4rem;
        flex: 0 1 26rem;
        min-width: min(14rem, 100%);
      }
      .row input,
      .row select {
        width: 100%;
        max-width: 100%;
        box-sizing: border-box;
      }
      .row button,
      .row select {
        margin-bottom: 0.4rem;
        font-size: 0.9rem;
      }
    `,
  ];

  @property({ attribute: false }) findings: readonly FindingItem[] = [];
  @property({ attribute: false }) methods: readonly MethodChoice[] = [];
  @property() current = '';
  @property({ attribute: false }) study: StudyLabels = emptyStudy;

  @state() private newMethod = '';

  override render() {
    const current = this.findings.find((f) => f.id === this.current);
    const title = (id: string) => this.methods.find((m) => m.id === id)?.title ?? id;
    return html`
      <section aria-labelledby="findings-heading">
        <h2 id="findings-heading" class="visually-hidden">Findings of this paper (${this.findings.length})</h2>
        ${this.findings.length === 0
          ? html`<p class="hint">No finding yet: add one below, or type into a calculator.</p>`
          : html`<ul aria-label="Findings">
              ${this.findings.map(
                (f) => html`<li>
                  <button type="button" aria-current=${f.id === this.current ? 'true' : 'false'} @click=${() => this.fire('lurk-finding-select', { id: f.id })}>
                    ${f.name.trim() || 'Unnamed finding'}<span class="method">${title(f.method)}</span>
                  </button>
                </li>`,
              )}
            </ul>`}
        ${current
          ? html`<div class="row">
              <div class="field">
                  <label for="finding-name">Name of this finding</label>
                  <input
                    id="finding-name"
                    type="text"
                    .value=${current.name}
                    placeholder="e.g. Mortality, hazard ratio"
                    @input=${(e: Event) => this.fire('lurk-finding-rename', { id: current.id, name: (e.target as HTMLInputElement).value })}
                  />
                </div>
                <button class="secondary" type="button" @click=${() => this.confirmRemove(current)}>Remove this finding</button>
              </div>
              <div class="row">${OWN_LABELS.map(({ key, label }) => this.ownLabel(current, key, label))}</div>`
          : nothing}
          <div class="row">
            <div class="field">
              <label for="finding-method">Method of a new finding</label>
              <select id="finding-method" .value=${this.newMethod || this.methods[0]?.id || ''} @change=${(e: Event) => (this.newMethod = (e.target as HTMLSelectElement).value)}>
                ${this.methods.map((m) => html`<option value=${m.id} ?selected=${(this.newMethod || this.methods[0]?.id) === m.id}>${m.title}</option>`)}
              </select>
            </div>
            <button type="button" @click=${() => this.fire('lurk-finding-add', { method: this.newMethod || this.methods[0]?.id })}>Add a finding</button>
          </div>
      </section>
    `;
  }

  /** One of the finding's own labels; empty means the study's, shown as the placeholder. */
  private ownLabel(finding: FindingItem, key: keyof FindingLabels, label: string) {
    const studyValue = this.study[key].trim();
    return html`<div class="field">
      <label for="finding-${key}">${label}</label>
      <input
        id="finding-${key}"
        type="text"
        .value=${finding.labels?.[key] ?? ''}
        placeholder=${studyValue ? `as the study: ${studyValue}` : 'as the study'}
        @input=${(e: Event) => this.fire('lurk-finding-labels', { id: finding.id, labels: { ...finding.labels, [key]: (e.target as HTMLInputElement).value } })}
      />
    </div>`;
  }

  private confirmRemove(finding: FindingItem): void {
    if (!confirm(`Remove the finding “${finding.name.trim() || 'Unnamed finding'}” and its inputs? This cannot be undone unless you saved the appraisal.`)) return;
    this.fire('lurk-finding-remove', { id: finding.id });
  }

  private fire(name: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(name, { detail, bubbles: true, composed: true }));
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-findings': LurkFindings;
  }
  interface GlobalEventHandlersEventMap {
    'lurk-finding-select': CustomEvent<{ id: string }>;
    'lurk-finding-rename': CustomEvent<{ id: string; name: string }>;
    'lurk-finding-labels': CustomEvent<{ id: string; labels: FindingLabels }>;
    'lurk-finding-remove': CustomEvent<{ id: string }>;
    'lurk-finding-add': CustomEvent<{ method: string }>;
  }
}

import { LitElement, css, html, nothing } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import type { Appraisal } from '../src/workspace/appraisal';
import { buildRobustnessStatement, renderRobustnessStatement, type RobustnessStatement, type StatementFormat } from '../src/workspace/robustnessStatement';
import { downloadBlob } from '../src/plot/figureExport.browser';
import { fileNamePart } from '../src/workspace/findingList';
import { baseStyles } from './styles/base';

const FORMATS: ReadonlyArray<{ id: StatementFormat; label: string; ext: string; type: string }> = [
  { id: 'md', label: 'Markdown', ext: 'md', type: 'text/markdown' },
  { id: 'tex', label: 'LaTeX', ext: 'tex', type: 'application/x-tex' },
  { id: 'html', label: 'HTML', ext: 'html', type: 'text/html' },
];

/**
 * @summary The robustness statement for authors: a paragraph per finding, named after it, with numbers, assumptions and
 * references, shown for reading and as Markdown, LaTeX or HTML to copy or download.
 *
 * @property appraisal - the current appraisal (study labels and calculator summaries).
 * @fires lurk-statement-copy - {format} after the user copied the statement.
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
@customElement('lurk-statement')
export class LurkStatement extends LitElement {
  static override styles = [
    baseStyles,
    css`
      article {
        border: 1px solid var(--_border);
        border-radius: var(--_radius);
        padding: 0.25rem 1rem;
        background: var(--_bg);
        max-width: 52rem;
      }
      textarea {
        font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace;
        font-size: 0.8rem;
        min-height: 12rem;
      }
      .tools {
        display: flex;
        flex-wrap: wrap;
        gap: 0.5rem;
        align-items: center;
        margin: 0.5rem 0;
      }
      ol,
      .assumptions {
        font-size: 0.9rem;
      }
      h4 {
        margin: 1rem 0 0.25rem;
      }
    `,
  ];

  @property({ attribute: false }) appraisal: Appraisal | null = null;

  @state() private format: StatementFormat = 'md';
  @state() private message = '';

  private statement: RobustnessStatement | null = null;

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('appraisal')) this.statement = this.appraisal ? buildRobustnessStatement(this.appraisal) : null;
  }

  override render() {
    const statement = this.statement;
    if (!statement) return nothing;
    const text = renderRobustnessStatement(statement, this.format);
    return html`
      <p class="hint">Ready to paste into the sensitivity-analysis section of a paper. Check every sentence against your study before using it.</p>
      <article aria-label="Robustness statement">
        <h3>${statement.title}</h3>
        ${statement.sections.map((s) => html`<h4>${s.heading}</h4>
            <p>${s.paragraph}</p>`)}
        ${statement.caution ? html`<p>${statement.caution}</p>` : statement.paragraphs.map((p) => html`<p>${p}</p>`)}
        ${statement.assumptions.length
          ? html`<h4>Assumptions and conventions</h4>
              <ul class="assumptions">
                ${statement.assumptions.map((a) => html`<li>${a}</li>`)}
              </ul>`
          : nothing}
        ${statement.references.length
          ? html`<h4>References</h4>
              <ol>
                ${statement.references.map((r) => html`<li>${r}</li>`)}
              </ol>`
          : nothing}
      </article>
      <fieldset>
        <legend>Format to copy</legend>
        ${FORMATS.map(
          (f) => html`<label class="choice"
            ><input type="radio" name="statement-format" .checked=${this.format === f.id} @change=${() => (this.format = f.id)} />${f.label}</label
          >`,
        )}
      </fieldset>
      <div class="field">
        <label for="statement-text">Statement as ${FORMATS.find((f) => f.id === this.format)?.label}</label>
        <textarea id="statement-text" readonly .value=${text}></textarea>
      </div>
      <div class="tools">
        <button type="button" @click=${() => this.copy(text)}>Copy</button>
        <button class="secondary" type="button" @click=${() => this.download(text)}>Download</button>
        <span role="status" class="hint">${this.message}</span>
      </div>
    `;
  }

  private async copy(text: string): Promise<void> {
    try {
      await navigator.clipboard.writeText(text);
      this.message = 'Copied.';
      this.dispatchEvent(new CustomEvent('lurk-statement-copy', { detail: { format: this.format }, bubbles: true, composed: true }));
    } catch {
      const area = this.renderRoot.querySelector<HTMLTextAreaElement>('#statement-text');
      area?.select();
      this.message = 'Copying is not allowed here: the text is selected, press Ctrl+C (⌘C) to copy it.';
    }
  }

  private download(text: string): void {
    const f = FORMATS.find((x) => x.id === this.format)!;
    const study = this.appraisal?.study.finding.trim() ?? '';
    const name = `lurk-robustness-statement${study ? `-${fileNamePart(study, 'appraisal')}` : ''}.${f.ext}`;
    downloadBlob(new Blob([text], { type: f.type }), name);
    this.message = `Saved ${name}`;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-statement': LurkStatement;
  }
  interface GlobalEventHandlersEventMap {
    'lurk-statement-copy': CustomEvent<{ format: StatementFormat }>;
  }
}

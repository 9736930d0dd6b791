import { LitElement, css, html, nothing } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import type { Appraisal } from '../src/workspace/appraisal';
import { buildBottomLine, type BottomLine } from '../src/workspace/bottomLine';
import { baseStyles } from './styles/base';

/**
 * @summary The bottom line for decision-makers, finding by finding: in plain words, how strong a hidden confounder would have to be,
 * compared with measured factors, what would and would not change the conclusion, and the caution.
 *
 * @property appraisal - the current appraisal (study labels and calculator summaries).
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
@customElement('lurk-bottom-line')
export class LurkBottomLine extends LitElement {
  static override styles = [
    baseStyles,
    css`
      section {
        max-width: 52rem;
      }
      .finding {
        font-size: 1.1rem;
        font-weight: 600;
      }
      li {
        margin-bottom: 0.4rem;
      }
      .finding-line {
        border-top: 1px solid var(--_border);
        padding-top: 0.25rem;
      }
      h3 {
        margin: 0.75rem 0 0.25rem;
      }
      h4 {
        margin: 0.5rem 0 0.25rem;
        font-size: 0.95rem;
      }
      .caution {
        font-size: 1rem;
      }
    `,
  ];

  @property({ attribute: false }) appraisal: Appraisal | null = null;

  private line: BottomLine | null = null;

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('appraisal')) this.line = this.appraisal ? buildBottomLine(this.appraisal) : null;
  }

  override render() {
    const line = this.line;
    if (!line) return nothing;
    const finding = this.appraisal?.study.finding.trim();
    return html`
      <section aria-label="Bottom line">
        ${finding ? html`<p class="finding">${finding}</p>` : nothing}
        ${line.empty
          ? html`<p>No finding has a result yet. Fill in at least one calculator.</p>`
          : line.findings.map(
              (f) => html`<article class="finding-line" aria-label=${f.heading}>
                <h3>${f.heading}</h3>
                <h4>How strong would a hidden confounder have to be?</h4>
                <ul>
                  ${f.howStrong.map((s) => html`<li>${s}</li>`)}
                </ul>
                ${this.list('Compared with the measured factors', f.comparedWithMeasured)} ${this.list('What would change the conclusion', f.wouldChange)}
                ${this.list('What would not change it', f.wouldNotChange)}
              </article>`,
            )}
        <p class="caution" role="note">${line.caution}</p>
      </section>
    `;
  }

  private list(title: string, items: readonly string[]) {
    if (items.length === 0) return nothing;
    return html`<h4>${title}</h4>
      <ul>
        ${items.map((s) => html`<li>${s}</li>`)}
      </ul>`;
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-bottom-line': LurkBottomLine;
  }
}

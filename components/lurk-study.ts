import { LitElement, css, html } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import { emptyStudy, type StudyLabels } from '../src/format/studyLabels';
import { baseStyles } from './styles/base';

const FIELDS: ReadonlyArray<{ key: keyof StudyLabels; label: string; hint: string }> = [
  { key: 'finding', label: 'Finding', hint: 'A short name, e.g. “Cycling to work and hypertension”' },
  { key: 'exposure', label: 'Exposure or treatment', hint: 'Used in every calculator’s text and plots' },
  { key: 'outcome', label: 'Outcome', hint: 'What was measured or counted' },
  { key: 'units', label: 'Outcome units', hint: 'For a continuous outcome, e.g. mmHg' },
  { key: 'source', label: 'Source', hint: 'Citation or note on where the finding comes from' },
];

/**
 * @summary The study header: names of the finding, exposure, outcome, units and source, shared by all calculators.
 *
 * @property study - the labels (StudyLabels).
 * @fires lurk-study-change - {study} when the user edits a label.
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
@customElement('lurk-study')
export class LurkStudy extends LitElement {
  static override styles = [
    baseStyles,
    css`
      .grid {
        grid-template-columns: repeat(auto-fit, minmax(13rem, 1fr));
      }
      /* A grid cell may shrink below its input's natural width, so no input spills past the panel. */
      .grid > * {
        min-width: 0;
      }
    `,
  ];

  @property({ attribute: false }) study: StudyLabels = emptyStudy;

  override render() {
    return html`
      <fieldset>
        <legend>The finding being appraised</legend>
        <div class="grid">
          ${FIELDS.map(
            (f) => html`
              <div class="field">
                <label for="study-${f.key}">${f.label}</label>
                <input
                  id="study-${f.key}"
                  type="text"
                  .value=${this.study[f.key]}
                  aria-describedby="study-${f.key}-hint"
                  @input=${(e: Event) => this.edit(f.key, (e.target as HTMLInputElement).value)}
                />
                <div class="hint" id="study-${f.key}-hint">${f.hint}</div>
              </div>
            `,
          )}
        </div>
      </fieldset>
    `;
  }

  private edit(key: keyof StudyLabels, value: string): void {
    this.study = Object.freeze({ ...this.study, [key]: value });
    this.dispatchEvent(new CustomEvent('lurk-study-change', { detail: { study: this.study }, bubbles: true, composed: true }));
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-study': LurkStudy;
  }
  interface GlobalEventHandlersEventMap {
    'lurk-study-change': CustomEvent<{ study: StudyLabels }>;
  }
}

import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../src/core/inputProblem';

export interface TextFieldOptions {
  /** The input's id; the hint and the error take `${id}-hint` and `${id}-error`. */
  readonly id: string;
  readonly label: string;
  /** The text as the user typed it (never a parsed number, so nothing typed is lost). */
  readonly value: string;
  /** The problem to show under the field, if any: it marks the input invalid. */
  readonly problem?: InputProblem;
  readonly hint?: string;
  /** The on-screen keyboard to offer. */
  readonly inputMode?: 'decimal' | 'numeric' | 'text';
  /** Called with the new text on every edit. */
  readonly onInput: (text: string) => void;
}

/** A labelled text input with its hint and its error, tied together by aria-describedby (calculator forms). */
export function textField(o: TextFieldOptions): TemplateResult {
  return html`<div class="field">
    <label for=${o.id}>${o.label}</label>
    <input
      id=${o.id}
      type="text"
      inputmode=${o.inputMode ?? 'decimal'}
      autocomplete="off"
      .value=${o.value}
      aria-invalid=${o.problem ? 'true' : 'false'}
      aria-describedby="${o.id}-error${o.hint ? ` ${o.id}-hint` : ''}"
      @input=${(e: Event) => o.onInput((e.target as HTMLInputElement).value)}
    />
    ${o.hint ? html`<div class="hint" id="${o.id}-hint">${o.hint}</div>` : nothing}
    <div class="field-error" id="${o.id}-error">${o.problem ? o.problem.message : ''}</div>
  </div>`;
}

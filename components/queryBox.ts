import { css, html, type TemplateResult } from 'lit';
import type { InputProblem } from '../src/core/inputProblem';

/**
 * The query to run in the user's own database, with a button that copies it; or, while it cannot be written
 * yet, a hint saying what it still needs.
 */
export function queryBox(sql: string, missing: InputProblem | undefined, id = 'sql'): TemplateResult {
  if (!sql) {
    return html`<p class="hint">${missing?.message ? `The query appears here once the ${missing.field === 'summaryTable' ? 'table name' : 'columns'} are given: ${missing.message.replace(/\.$/, '')}.` : ''}</p>`;
  }
  const copy = async (event: Event) => {
    const button = event.currentTarget as HTMLButtonElement;
    try {
      await navigator.clipboard.writeText(sql);
      button.textContent = 'Copied';
    } catch {
      button.textContent = 'Select the query and copy it';
    }
  };
  return html`<div class="query">
    <div class="query-head">
      <label for=${id}>The query to run in your database</label>
      <button type="button" class="copy" aria-live="polite" @click=${copy}>Copy the query</button>
    </div>
    <pre class="sql" id=${id} tabindex="0">${sql}</pre>
  </div>`;
}

/** A labelled text box for the pasted result, with its hint and its error. */
export function resultBox(value: string, problem: InputProblem | undefined, edit: (text: string) => void, hint: string, label = 'Its result row'): TemplateResult {
  return html`<div class="field">
    <label for="summaryResult">${label}</label>
    <textarea
      id="summaryResult"
      spellcheck="false"
      aria-describedby="summaryResult-hint summaryResult-error"
      aria-invalid=${problem ? 'true' : 'false'}
      .value=${value}
      @input=${(e: Event) => edit((e.target as HTMLTextAreaElement).value)}
    ></textarea>
    <div class="hint" id="summaryResult-hint">${hint}</div>
    <div class="field-error" id="summaryResult-error">${problem ? problem.message : ''}</div>
  </div>`;
}

/** Styles of the query box (shared by the calculators that print a query). */
export const queryBoxStyles = css`
  .query-head {
    display: flex;
    justify-content: space-between;
    align-items: baseline;
    gap: 0.5rem;
  }
  pre.sql {
    border: 1px solid currentColor;
    border-radius: 4px;
    padding: 0.5rem;
    overflow-x: auto;
    font-size: 0.8rem;
    max-height: 16rem;
    white-space: pre;
  }
  textarea#summaryResult {
    min-height: 5rem;
    font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace;
    font-size: 0.85rem;
  }
`;

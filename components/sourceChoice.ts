import { html, type TemplateResult } from 'lit';

/**
 * The "where do the data come from" radio group that opens each calculator's form (a reported estimate, a file,
 * pasted numbers …). `choose` is called with the picked source on the user's change.
 */
export function sourceChoice<T extends string>(
  legend: string,
  sources: ReadonlyArray<{ readonly id: T; readonly label: string }>,
  current: T,
  choose: (id: T) => void,
): TemplateResult {
  return html`<fieldset>
    <legend>${legend}</legend>
    <div class="sources">
      ${sources.map(
        (s) => html`<label class="choice"
          ><input type="radio" name="source" value=${s.id} .checked=${current === s.id} @change=${() => choose(s.id)} />${s.label}</label
        >`,
      )}
    </div>
  </fieldset>`;
}

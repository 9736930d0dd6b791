import { html, nothing, type TemplateResult } from 'lit';

/** The conventions a result followed (the core's words), folded under a summary line; nothing when none. */
export function conventionsBlock(conventions: readonly { readonly id: string; readonly text: string }[]): TemplateResult | typeof nothing {
  if (conventions.length === 0) return nothing;
  return html`<details class="conventions">
    <summary>Conventions this analysis follows</summary>
    <ul>
      ${conventions.map((c) => html`<li data-convention=${c.id}>${c.text}</li>`)}
    </ul>
  </details>`;
}

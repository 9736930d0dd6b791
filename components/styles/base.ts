import { css } from 'lit';

/**
 * Shared look of every Lurk element. Theme through these CSS custom properties on any ancestor:
 * --lurk-font, --lurk-text, --lurk-muted, --lurk-bg, --lurk-surface, --lurk-border, --lurk-accent,
 * --lurk-accent-text, --lurk-error, --lurk-warning-bg, --lurk-focus, --lurk-radius.
 */
export const baseStyles = css`
  :host {
    --_font: var(--lurk-font, system-ui, -apple-system, 'Segoe UI', Roboto, Arial, sans-serif);
    --_text: var(--lurk-text, #1f2328);
    --_muted: var(--lurk-muted, #57606a);
    --_bg: var(--lurk-bg, #ffffff);
    --_surface: var(--lurk-surface, #f6f8fa);
    --_border: var(--lurk-border, #c9d1d9);
    --_accent: var(--lurk-accent, #0b5cad);
    --_accent-text: var(--lurk-accent-text, #ffffff);
    --_error: var(--lurk-error, #b3261e);
    --_warning-bg: var(--lurk-warning-bg, #fff4d6);
    --_focus: var(--lurk-focus, #0b5cad);
    --_radius: var(--lurk-radius, 6px);
    display: block;
    font-family: var(--_font);
    color: var(--_text);
    line-height: 1.45;
    box-sizing: border-box;
  }
  :host([hidden]) {
    display: none;
  }
  *,
  *::before,
  *::after {
    box-sizing: inherit;
  }
  h2,
  h3,
  h4 {
    line-height: 1.25;
    margin: 1rem 0 0.5rem;
  }
  label {
    display: block;
    font-weight: 600;
    font-size: 0.9rem;
    margin-bottom: 0.2rem;
  }
  input,
  select,
  textarea,
  button {
    font: inherit;
    color: inherit;
  }
  input[type='text'],
  input[type='number'],
  input:not([type]),
  select,
  textarea {
    width: 100%;
    padding: 0.4rem 0.5rem;
    border: 1px solid var(--_border);
    border-radius: var(--_radius);
    background: var(--_bg);
    min-height: 2.25rem;
  }
  input[aria-invalid='true'],
  select[aria-invalid='true'],
  textarea[aria-invalid='true'] {
    border-color: var(--_error);
    box-shadow: 0 0 0 1px var(--_error);
  }
  button {
    cursor: pointer;
    padding: 0.45rem 0.9rem;
    border-radius: var(--_radius);
    border: 1px solid var(--_accent);
    background: var(--_accent);
    color: var(--_accent-text);
    min-height: 2.25rem;
  }
  button.secondary {
    background: var(--_bg);
    color: var(--_accent);
  }
  button:disabled {
    opacity: 0.55;
    cursor: not-allowed;
  }
  :focus-visible {
    outline: 3px solid var(--_focus);
    outline-offset: 2px;
  }
  .field {
    margin-bottom: 0.75rem;
    min-width: 0;
  }
  .field-error {
    color: var(--_error);
    font-size: 0.85rem;
    margin-top: 0.2rem;
  }
  .hint {
    color: var(--_muted);
    font-size: 0.85rem;
  }
  .grid {
    display: grid;
    gap: 0 1rem;
    grid-template-columns: repeat(auto-fit, minmax(9.5rem, 1fr));
  }
  .warning {
    background: var(--_warning-bg);
    border-left: 4px solid #b08400;
    padding: 0.5rem 0.75rem;
    border-radius: var(--_radius);
    margin: 0.5rem 0;
  }
  .caution {
    border-left: 4px solid var(--_muted);
    padding: 0.5rem 0.75rem;
    background: var(--_surface);
    border-radius: var(--_radius);
    font-size: 0.9rem;
    margin: 0.75rem 0;
  }
  .headline {
    font-size: 1.05rem;
  }
  .number {
    font-variant-numeric: tabular-nums;
    font-weight: 700;
  }
  table {
    border-collapse: collapse;
    width: 100%;
    font-variant-numeric: tabular-nums;
    font-size: 0.9rem;
  }
  th,
  td {
    text-align: right;
    padding: 0.3rem 0.5rem;
    border-bottom: 1px solid var(--_border);
  }
  th:first-child,
  td:first-child {
    text-align: left;
  }
  /* A wide table scrolls inside its own box; its first (key) column stays in view while it does. */
  .table-scroll {
    overflow-x: auto;
    max-width: 100%;
    overscroll-behavior-x: contain;
  }
  /* Tables break lines between words only (the page may allow breaks anywhere for long labels elsewhere), and a
     number never breaks across lines ("1.2" over "0"): a wide table scrolls in its own box instead. */
  table {
    overflow-wrap: normal;
  }
  .table-scroll td:not(.unavailable) {
    white-space: nowrap;
    font-variant-numeric: tabular-nums;
  }
  .table-scroll th:first-child,
  .table-scroll td:first-child {
    position: sticky;
    left: 0;
    z-index: 1;
    background: var(--_bg);
    box-shadow: 1px 0 0 var(--_border);
  }
  fieldset {
    border: 1px solid var(--_border);
    border-radius: var(--_radius);
    padding: 0.5rem 0.75rem 0.25rem;
    margin: 0 0 0.75rem;
    min-width: 0;
  }
  legend {
    font-weight: 600;
    padding: 0 0.25rem;
  }
  .choice {
    display: inline-flex;
    align-items: center;
    gap: 0.35rem;
    font-weight: normal;
    margin-right: 1rem;
  }
  .visually-hidden {
    position: absolute;
    width: 1px;
    height: 1px;
    padding: 0;
    margin: -1px;
    overflow: hidden;
    clip: rect(0, 0, 0, 0);
    white-space: nowrap;
    border: 0;
  }
`;
